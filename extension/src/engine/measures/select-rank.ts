/**
 * Hoare's quickselect (Hoare 1961, "Algorithm 65: find", CACM 4(7)) on a[lo..hi]: returns the
 * value of rank `rank` and leaves smaller-or-equal values to its left. The middle element as
 * pivot keeps it deterministic; sorted input, common here, is its best case.
 */
export function selectRank(a: Float64Array, lo: number, hi: number, rank: number): number {
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
    if (rank <= j) hi = j;
    else if (rank >= i) lo = i;
    else return a[rank];
  }
  return a[rank];
}
