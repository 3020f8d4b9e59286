/**
 * Weighted median by quickselect (Hoare 1961) in O(n) on average: the smallest value v such that
 * the weights of the values ≤ v reach half of the total weight (the lower weighted median). With
 * equal weights and an odd count it is the ordinary median. Used where a bootstrap needs one
 * weighted median per resample and a sort per resample would dominate.
 */

/**
 * Lower weighted median of values[0 … n−1] with positive weights; reorders both arrays in place
 * (they stay paired). Returns NaN for n = 0.
 */
export function weightedMedianInPlace(
  values: Float64Array,
  weights: Float64Array,
  n: number,
): number {
  if (n === 0) return NaN;
  let rangeWeight = 0;
  for (let i = 0; i < n; i++) rangeWeight += weights[i];
  let half = rangeWeight / 2;
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const a = values[lo];
    const b = values[(lo + hi) >> 1];
    const c = values[hi];
    // Median of three as the pivot keeps sorted and reversed inputs linear.
    const pivot = a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
    // Three-way partition of [lo, hi] (< pivot, = pivot, > pivot), summing weights on the way.
    let lt = lo;
    let gt = hi;
    let i = lo;
    let below = 0;
    let above = 0;
    while (i <= gt) {
      const v = values[i];
      if (v < pivot) {
        below += weights[i];
        swap(values, weights, lt++, i++);
      } else if (v > pivot) {
        above += weights[i];
        swap(values, weights, i, gt--);
      } else i++;
    }
    const equal = rangeWeight - below - above;
    if (below >= half && lt > lo) {
      hi = lt - 1;
      rangeWeight = below;
    } else if (below + equal >= half) return pivot;
    else {
      half -= below + equal;
      lo = gt + 1;
      rangeWeight = above;
    }
  }
  return values[lo];
}

function swap(v: Float64Array, w: Float64Array, a: number, b: number): void {
  const tv = v[a];
  v[a] = v[b];
  v[b] = tv;
  const tw = w[a];
  w[a] = w[b];
  w[b] = tw;
}
