import { describe, expect, it } from 'vitest';
import { angularSeparationDeg, positionAngleDeg } from '@/lib/astro/coordinates';
import { deprojectToDisc, tangentPlaneOffsets, type DiscGeometry } from '@/lib/external/deproject';
import { makeRng } from '@/lib/stats/rng';

const DEG = Math.PI / 180;
type Vec = [number, number, number];
type Mat = [Vec, Vec, Vec];

const mul = (m: Mat, v: Vec): Vec =>
  m.map((row) => row[0] * v[0] + row[1] * v[1] + row[2] * v[2]) as Vec;
const rotX = (a: number): Mat => [
  [1, 0, 0],
  [0, Math.cos(a), -Math.sin(a)],
  [0, Math.sin(a), Math.cos(a)],
];
const rotZ = (a: number): Mat => [
  [Math.cos(a), -Math.sin(a), 0],
  [Math.sin(a), Math.cos(a), 0],
  [0, 0, 1],
];

/**
 * Independent forward model: a disc point (R, φ) tilted by the inclination about the major axis
 * and turned by the position angle with rotation matrices, in the (east, north, line-of-sight)
 * frame at the centre, then placed at the galaxy's distance and read off the sky sphere.
 * `perspective` keeps the point's depth along the line of sight; without it the point is
 * projected onto the sky plane through the centre, which the deprojection formula assumes.
 */
function onSky(g: DiscGeometry, RKpc: number, phiRad: number, perspective: boolean) {
  const s = g.rotation === 'clockwise' ? 1 : -1;
  const disc: Vec = [RKpc * Math.cos(phiRad), s * RKpc * Math.sin(phiRad), 0];
  const v = mul(
    rotZ(Math.PI / 2 - g.positionAngleDeg * DEG),
    mul(rotX(g.inclinationDeg * DEG), disc),
  );
  const a0 = g.centerRaDeg * DEG;
  const d0 = g.centerDecDeg * DEG;
  const east: Vec = [-Math.sin(a0), Math.cos(a0), 0];
  const north: Vec = [-Math.sin(d0) * Math.cos(a0), -Math.sin(d0) * Math.sin(a0), Math.cos(d0)];
  const los: Vec = [Math.cos(d0) * Math.cos(a0), Math.cos(d0) * Math.sin(a0), Math.sin(d0)];
  const D = g.distanceMpc * 1000;
  const depth = perspective ? v[2] : 0;
  const p = [0, 1, 2].map((k) => (D + depth) * los[k] + v[0] * east[k] + v[1] * north[k]);
  const ra = Math.atan2(p[1], p[0]) / DEG;
  return { raDeg: ra < 0 ? ra + 360 : ra, decDeg: Math.atan2(p[2], Math.hypot(p[0], p[1])) / DEG };
}

function randomCase(seed: number) {
  const rng = makeRng(seed);
  const geometry: DiscGeometry = {
    centerRaDeg: rng.next() * 360,
    centerDecDeg: -85 + rng.next() * 170,
    distanceMpc: 3 + rng.next() * 30,
    inclinationDeg: rng.next() * 80,
    positionAngleDeg: rng.next() * 360,
    rotation: rng.next() < 0.5 ? 'clockwise' : 'counterclockwise',
  };
  const n = 200;
  const RKpc = Float64Array.from({ length: n }, () => 0.2 + rng.next() * 15);
  const phiRad = Float64Array.from({ length: n }, () => (rng.next() * 2 - 1) * Math.PI);
  return { geometry, RKpc, phiRad };
}

function skyOf(g: DiscGeometry, RKpc: Float64Array, phiRad: Float64Array, perspective: boolean) {
  const raDeg = new Float64Array(RKpc.length);
  const decDeg = new Float64Array(RKpc.length);
  RKpc.forEach((R, i) => {
    const p = onSky(g, R, phiRad[i], perspective);
    raDeg[i] = p.raDeg;
    decDeg[i] = p.decDeg;
  });
  return { raDeg, decDeg };
}

const angleDiff = (a: number, b: number) => Math.atan2(Math.sin(a - b), Math.cos(a - b));

describe('deprojection into the disc', () => {
  it('inverts rotation matrices applied to 3-D disc vectors (sky-plane projection) to 1e-9', () => {
    for (let seed = 1; seed <= 40; seed++) {
      const { geometry, RKpc, phiRad } = randomCase(seed);
      const { raDeg, decDeg } = skyOf(geometry, RKpc, phiRad, false);
      const disc = deprojectToDisc(raDeg, decDeg, geometry);
      for (let i = 0; i < RKpc.length; i++) {
        // exact geometry
        expect(Math.abs(disc.RKpc[i] / RKpc[i] - 1)).toBeLessThan(1e-9);
        expect(Math.abs(angleDiff(disc.phiRad[i], phiRad[i]))).toBeLessThan(1e-9);
      }
    }
  });

  it('with the depth of the disc kept, agrees to the order (R/D) tan i the formula neglects', () => {
    for (let seed = 41; seed <= 60; seed++) {
      const { geometry, RKpc, phiRad } = randomCase(seed);
      const { raDeg, decDeg } = skyOf(geometry, RKpc, phiRad, true);
      const disc = deprojectToDisc(raDeg, decDeg, geometry);
      const scale = (15 / (geometry.distanceMpc * 1000)) * Math.tan(geometry.inclinationDeg * DEG);
      for (let i = 0; i < RKpc.length; i++) {
        // exact geometry: the perspective term is first order in (R/D) tan i
        expect(Math.abs(disc.RKpc[i] / RKpc[i] - 1)).toBeLessThan(2 * scale + 1e-12);
        expect(Math.abs(angleDiff(disc.phiRad[i], phiRad[i]))).toBeLessThan(2 * scale + 1e-12);
      }
    }
  });

  it('is not a flat RA/Dec difference: a gnomonic offset at high declination', () => {
    // exact geometry: a point 1° due east along the great circle through the centre at Dec 80°
    const centerDecDeg = 80;
    const east = onSky(
      {
        centerRaDeg: 10,
        centerDecDeg,
        distanceMpc: 1,
        inclinationDeg: 0,
        positionAngleDeg: 90,
        rotation: 'clockwise',
      },
      1000 * Math.tan(1 * DEG),
      0,
      false,
    );
    expect(angularSeparationDeg(10, centerDecDeg, east.raDeg, east.decDeg)).toBeCloseTo(1, 12);
    const { xiRad, etaRad } = tangentPlaneOffsets(
      Float64Array.of(east.raDeg),
      Float64Array.of(east.decDeg),
      10,
      centerDecDeg,
    );
    expect(xiRad[0]).toBeCloseTo(Math.tan(1 * DEG), 14); // exact geometry: ξ = tan θ on the east axis
    expect(etaRad[0]).toBeCloseTo(0, 14);
    // a flat difference ΔRA·cos δ0 would be off by far more than the check above allows
    expect(Math.abs((east.raDeg - 10) * Math.cos(centerDecDeg * DEG) - 1)).toBeGreaterThan(1e-3);
  });

  it('a point 1′ out on the major axis of a face-on disc at 10 Mpc lies at 2.909 kpc', () => {
    const g: DiscGeometry = {
      centerRaDeg: 150,
      centerDecDeg: 20,
      distanceMpc: 10,
      inclinationDeg: 0,
      positionAngleDeg: 0,
      rotation: 'counterclockwise',
    };
    const { RKpc, phiRad } = deprojectToDisc(Float64Array.of(150), Float64Array.of(20 + 1 / 60), g);
    expect(RKpc[0]).toBeCloseTo(10_000 * Math.tan(DEG / 60), 9); // exact geometry: 2.9089 kpc
    expect(RKpc[0]).toBeCloseTo(2.909, 3); // exact geometry
    expect(phiRad[0]).toBeCloseTo(0, 12); // on the receding major axis
  });

  it('φ grows in the stated sense on the sky (north up, east left: counterclockwise = PA rising)', () => {
    for (const rotation of ['counterclockwise', 'clockwise'] as const) {
      const g: DiscGeometry = {
        centerRaDeg: 40,
        centerDecDeg: -30,
        distanceMpc: 8,
        inclinationDeg: 50,
        positionAngleDeg: 120,
        rotation,
      };
      const a = onSky(g, 5, 0.3, false);
      const b = onSky(g, 5, 0.35, false);
      // lib/astro/coordinates position angles, east of north (independent of the deprojection)
      const turn =
        positionAngleDeg(40, -30, b.raDeg, b.decDeg) - positionAngleDeg(40, -30, a.raDeg, a.decDeg);
      expect(Math.sign(turn)).toBe(rotation === 'counterclockwise' ? 1 : -1); // common practice
      const disc = deprojectToDisc(
        Float64Array.of(a.raDeg, b.raDeg),
        Float64Array.of(a.decDeg, b.decDeg),
        g,
      );
      expect(disc.phiRad[1]).toBeGreaterThan(disc.phiRad[0]);
    }
  });

  it('refuses a source 90° or more from the centre, naming it', () => {
    expect(() =>
      tangentPlaneOffsets(Float64Array.of(10, 130), Float64Array.of(0, 0), 10, 0),
    ).toThrow(/source 2/);
  });
});
