/**
 * In-place radix-2 complex fast Fourier transform (Cooley & Tukey 1965) of a fixed power-of-two
 * length, with its bit-reversal table and twiddle factors computed once. forward computes
 * X_k = Σ_j x_j e^(−2πi jk/n); inverse computes x_j = (1/n) Σ_k X_k e^(+2πi jk/n).
 */

/** Transforms of one length; re and im are overwritten. */
export type Fft = {
  n: number;
  forward(re: Float64Array, im: Float64Array): void;
  inverse(re: Float64Array, im: Float64Array): void;
};

/** An FFT of length n (a power of two ≥ 2). */
export function makeFft(n: number): Fft {
  if (!Number.isInteger(n) || n < 2 || (n & (n - 1)) !== 0)
    throw new RangeError(`FFT length n = ${n} must be a power of two ≥ 2`);
  const bits = Math.log2(n);
  const reversed = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    let r = 0;
    for (let b = 0; b < bits; b++) r |= ((i >> b) & 1) << (bits - 1 - b);
    reversed[i] = r;
  }
  const cos = new Float64Array(n / 2);
  const sin = new Float64Array(n / 2);
  for (let k = 0; k < n / 2; k++) {
    cos[k] = Math.cos((2 * Math.PI * k) / n);
    sin[k] = Math.sin((2 * Math.PI * k) / n);
  }

  const transform = (re: Float64Array, im: Float64Array, sign: number): void => {
    if (re.length !== n || im.length !== n)
      throw new RangeError(`FFT input lengths ${re.length}, ${im.length} must equal ${n}`);
    for (let i = 0; i < n; i++) {
      const j = reversed[i];
      if (j > i) {
        let t = re[i];
        re[i] = re[j];
        re[j] = t;
        t = im[i];
        im[i] = im[j];
        im[j] = t;
      }
    }
    for (let size = 2; size <= n; size <<= 1) {
      const half = size >> 1;
      const step = n / size;
      for (let start = 0; start < n; start += size) {
        for (let k = 0; k < half; k++) {
          const wr = cos[k * step];
          const wi = sign * sin[k * step];
          const a = start + k;
          const b = a + half;
          const xr = re[b] * wr - im[b] * wi;
          const xi = re[b] * wi + im[b] * wr;
          re[b] = re[a] - xr;
          im[b] = im[a] - xi;
          re[a] += xr;
          im[a] += xi;
        }
      }
    }
  };

  return {
    n,
    forward: (re, im) => transform(re, im, -1),
    inverse: (re, im) => {
      transform(re, im, 1);
      for (let i = 0; i < n; i++) {
        re[i] /= n;
        im[i] /= n;
      }
    },
  };
}
