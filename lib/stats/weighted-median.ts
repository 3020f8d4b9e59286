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
  let total = 0;
  for (let i = 0; i < n; i++) total += weights[i];
  let half = total / 2;
  let lo = 0;
  let hi = n - 1;
  for (;;) {
    if (lo === hi) return values[lo];
    const pivot = values[(lo + hi) >> 1];
    // Three-way partition of [lo, hi] around the pivot: < pivot, = pivot, > pivot.
    let lt = lo;
    let gt = hi;
    let i = lo;
    while (i <= gt) {
      const v = values[i];
      if (v < pivot) swap(values, weights, lt++, i++);
      else if (v > pivot) swap(values, weights, i, gt--);
      else i++;
    }
    let below = 0;
    for (let k = lo; k < lt; k++) below += weights[k];
    let equal = 0;
    for (let k = lt; k <= gt; k++) equal += weights[k];
    if (below >= half && lt > lo) hi = lt - 1;
    else if (below + equal >= half) return pivot;
    else {
      half -= below + equal;
      lo = gt + 1;
    }
  }
}

function swap(v: Float64Array, w: Float64Array, a: number, b: number): void {
  const tv = v[a];
  v[a] = v[b];
  v[b] = tv;
  const tw = w[a];
  w[a] = w[b];
  w[b] = tw;
}
