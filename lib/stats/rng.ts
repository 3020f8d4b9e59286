/**
 * Seeded pseudo-random numbers: xoshiro128** (Blackman & Vigna 2018) seeded through splitmix32,
 * so that every resampling and Monte Carlo result is reproducible from its seed.
 */

/** A seeded generator. */
export type Rng = {
  /** Uniform in [0, 1) with 32 random bits. */
  next(): number;
  /** Standard normal deviate (Box–Muller transform, Box & Muller 1958). */
  normal(): number;
  /** Uniform integer in [0, n) for 1 ≤ n ≤ 2^32 (multiply-shift; bias below 2^-32 · n). */
  int(n: number): number;
  /** Raw 32-bit unsigned output. */
  uint32(): number;
};

function splitmix32(state: number): [number, number] {
  const s = (state + 0x9e3779b9) | 0;
  let z = s;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return [s, (z ^ (z >>> 16)) >>> 0];
}

function seedWord(seed: number): number {
  if (!Number.isFinite(seed)) throw new RangeError(`seed ${seed} must be a finite number`);
  const whole = Math.floor(seed);
  return (whole ^ Math.floor(whole / 4294967296)) >>> 0;
}

/**
 * A child seed for item `index` of a run seeded with `seed`, so that per-item streams are
 * independent of how many items a batch holds (splitmix32 of the pair).
 */
export function deriveSeed(seed: number, index: number): number {
  const [, a] = splitmix32(seedWord(seed) ^ Math.imul(index + 1, 0x9e3779b9));
  const [, b] = splitmix32(a ^ index);
  return b;
}

/** A reproducible generator for an integer seed (any finite number; its integer part is used). */
export function makeRng(seed: number): Rng {
  let st = seedWord(seed);
  let s0: number, s1: number, s2: number, s3: number;
  [st, s0] = splitmix32(st);
  [st, s1] = splitmix32(st);
  [st, s2] = splitmix32(st);
  [, s3] = splitmix32(st);
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
  let spare = 0;
  let hasSpare = false;

  const uint32 = (): number => {
    const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9);
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return result >>> 0;
  };
  const next = (): number => uint32() / 4294967296;
  return {
    uint32,
    next,
    int: (n: number) => Math.floor(next() * n),
    normal: () => {
      if (hasSpare) {
        hasSpare = false;
        return spare;
      }
      const u = 1 - next();
      const v = next();
      const r = Math.sqrt(-2 * Math.log(u));
      spare = r * Math.sin(2 * Math.PI * v);
      hasSpare = true;
      return r * Math.cos(2 * Math.PI * v);
    },
  };
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
