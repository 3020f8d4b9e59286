/**
 * Descriptive statistics on plain or typed arrays: mean, median and quantiles (the linear
 * interpolation rule, Hyndman & Fan 1996 type 7, the default of R and NumPy).
 */

type Values = ArrayLike<number>;

function nonEmpty(values: Values, what: string): void {
  if (values.length === 0) throw new RangeError(`${what} of an empty sample is undefined`);
}

/** Arithmetic mean. Throws RangeError for an empty sample. */
export function mean(values: Values): number {
  nonEmpty(values, 'mean');
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i];
  return sum / values.length;
}

/** Sample standard deviation (n − 1 denominator). Throws RangeError for fewer than two values. */
export function standardDeviation(values: Values): number {
  if (values.length < 2) throw new RangeError('standard deviation needs at least two values');
  const m = mean(values);
  let ss = 0;
  for (let i = 0; i < values.length; i++) ss += (values[i] - m) ** 2;
  return Math.sqrt(ss / (values.length - 1));
}

/** Quantile p ∈ [0, 1] of values already sorted ascending (type 7). */
export function quantileSorted(sorted: Values, p: number): number {
  nonEmpty(sorted, 'quantile');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile level ${p} must lie in [0, 1]`);
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/** Quantile p ∈ [0, 1] of values in any order (type 7); the input is not modified. */
export function quantile(values: Values, p: number): number {
  return quantileSorted(Float64Array.from(values).sort(), p);
}

/** Median (type-7 quantile 0.5). */
export function median(values: Values): number {
  return quantile(values, 0.5);
}

/**
 * Type-7 quantile p ∈ [0, 1] of NaN-free values in O(n) by quickselect (Hoare 1961), reordering
 * `values` in place (it stays a permutation of the input). For repeated quantiles of large
 * samples where a full sort would dominate.
 */
export function quantileSelectInPlace(values: Float64Array, p: number): number {
  const n = values.length;
  nonEmpty(values, 'quantile');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile level ${p} must lie in [0, 1]`);
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  selectInPlace(values, lo);
  const v = values[lo];
  if (h === lo) return v;
  let next = Infinity;
  for (let i = lo + 1; i < n; i++) if (values[i] < next) next = values[i];
  return v + (h - lo) * (next - v);
}

/** Moves the k-th smallest value to index k, smaller ones before it and larger ones after it. */
function selectInPlace(a: Float64Array, k: number): void {
  let left = 0;
  let right = a.length - 1;
  while (right > left) {
    const mid = (left + right) >> 1;
    if (a[mid] < a[left]) swap(a, mid, left);
    if (a[right] < a[left]) swap(a, right, left);
    if (a[right] < a[mid]) swap(a, right, mid);
    const pivot = a[mid];
    let i = left;
    let j = right;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return;
  }
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}
