/**
 * Order statistics by selection instead of sorting: the k-th smallest value in O(n) expected time (quickselect,
 * Hoare, CACM 1961). The arrays are reordered in place; callers pass scratch copies.
 */

/**
 * k-th smallest value (0-based) of `values`; partially orders the array in place (every value left of k is ≤ the
 * result, every value right of it ≥). Expects finite values and 0 ≤ k < values.length; never throws.
 */
export function selectInPlace(values: Float64Array, k: number): number {
  let lo = 0;
  let hi = values.length - 1;
  while (lo < hi) {
    const pivot = values[(lo + hi) >> 1]!;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i]! < pivot) i++;
      while (values[j]! > pivot) j--;
      if (i <= j) {
        const t = values[i]!;
        values[i] = values[j]!;
        values[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return values[k]!;
}

/** Median (mean of the two middle values for an even count); reorders the array in place. NaN when empty. */
export function medianInPlace(values: Float64Array): number {
  const n = values.length;
  if (n === 0) return NaN;
  const mid = n >> 1;
  const upper = selectInPlace(values, mid);
  if (n % 2 === 1) return upper;
  // After selection every value left of `mid` is ≤ values[mid]: the lower middle is their maximum.
  let lower = -Infinity;
  for (let i = 0; i < mid; i++) if (values[i]! > lower) lower = values[i]!;
  return 0.5 * (lower + upper);
}

/**
 * Upper median: the value at index ⌊n/2⌋ of the sorted values (the middle value for odd n, the larger of the two
 * middle values for even n); reorders the array in place. NaN when empty.
 */
export function upperMedianInPlace(values: Float64Array): number {
  return values.length === 0 ? NaN : selectInPlace(values, values.length >> 1);
}
