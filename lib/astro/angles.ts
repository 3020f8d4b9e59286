/** Angle wrapping shared by the astronomy and ordering modules (degrees). */

/** An angle wrapped to (−180°, 180°]. */
export function wrap180Deg(deg: number): number {
  const w = ((((deg + 180) % 360) + 360) % 360) - 180;
  return w === -180 ? 180 : w;
}

/** An angle wrapped to [0°, 360°). */
export function wrap360Deg(deg: number): number {
  const w = deg % 360;
  const r = w < 0 ? w + 360 : w;
  return r >= 360 ? 0 : r;
}
