/**
 * Two-sample Kolmogorov–Smirnov test (Smirnov 1939).
 *
 * D = sup |F_a(x) − F_b(x)| over the pooled values, with tied values stepped together. The p-value
 * uses the asymptotic Kolmogorov distribution Q_KS(λ) = 2 Σ_{j≥1} (−1)^{j−1} exp(−2 j² λ²) at
 * λ = (√n_e + 0.12 + 0.11/√n_e) D, n_e = n m / (n + m) — the small-sample correction of
 * Stephens (1970) as given in Numerical Recipes (Press et al. 2007, §14.3.3). Because D is
 * discrete, for samples of a few tens this comes out up to ~20 % (relative) below the exact
 * permutation p-value; use a permutation test where that matters. Conservative with many ties.
 */

/** Kolmogorov survival function Q_KS(λ) = P(K > λ) (Kolmogorov 1933). */
export function kolmogorovSurvival(lambda: number): number {
  if (!(lambda > 0)) return 1;
  if (lambda < 0.2) {
    // Q = 1 − (√(2π)/λ) Σ exp(−(2j−1)² π² / (8 λ²)); the alternating series converges slowly here.
    const x = Math.exp((-Math.PI * Math.PI) / (8 * lambda * lambda));
    return 1 - (Math.sqrt(2 * Math.PI) / lambda) * (x + x ** 9 + x ** 25);
  }
  let sum = 0;
  for (let j = 1; j <= 100; j++) {
    const term = Math.exp(-2 * j * j * lambda * lambda);
    sum += j % 2 === 1 ? term : -term;
    if (term < 1e-17) break;
  }
  return Math.min(1, Math.max(0, 2 * sum));
}

/** D statistic and asymptotic p-value (see the module comment). */
export type KsResult = { d: number; pValue: number; effectiveN: number };

/** Two-sample KS test of "a and b come from the same continuous distribution". NaNs are rejected. */
export function ksTwoSample(a: Float64Array | number[], b: Float64Array | number[]): KsResult {
  const n = a.length;
  const m = b.length;
  if (n === 0 || m === 0) throw new RangeError('KS test needs two non-empty samples');
  const sa = Float64Array.from(a).sort();
  const sb = Float64Array.from(b).sort();
  if (Number.isNaN(sa[n - 1]) || Number.isNaN(sb[m - 1]))
    throw new RangeError('KS test samples contain NaN');
  let i = 0;
  let j = 0;
  let d = 0;
  while (i < n && j < m) {
    const x = Math.min(sa[i], sb[j]);
    while (i < n && sa[i] === x) i++;
    while (j < m && sb[j] === x) j++;
    d = Math.max(d, Math.abs(i / n - j / m));
  }
  const ne = (n * m) / (n + m);
  const sq = Math.sqrt(ne);
  return { d, pValue: kolmogorovSurvival((sq + 0.12 + 0.11 / sq) * d), effectiveN: ne };
}
