/**
 * Median of part of an array by quickselect (Hoare), using a scratch buffer so the input is
 * left alone. O(n) expected; the detector takes one per frame over ~80 bins.
 *
 * Example: `medianOf([3, 1, 2], 0, 3, scratch)` → 2
 */
export function medianOf(values: ArrayLike<number>, from: number, to: number, scratch: Float64Array): number {
  const n = to - from;
  if (n <= 0) return NaN;
  for (let i = 0; i < n; i++) scratch[i] = values[from + i];
  const mid = n >>> 1;
  const upper = select(scratch, n, mid);
  if (n % 2 === 1) return upper;
  // Even count: the lower middle is the largest value left of mid after the partition.
  let lower = -Infinity;
  for (let i = 0; i < mid; i++) if (scratch[i] > lower) lower = scratch[i];
  return (lower + upper) / 2;
}

/** k-th smallest of a[0..n); partitions a so a[0..k) <= a[k]. */
function select(a: Float64Array, n: number, k: number): number {
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const pivot = a[(lo + hi) >>> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k];
}
