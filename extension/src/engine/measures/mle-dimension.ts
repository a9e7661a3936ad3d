/**
 * Maximum-likelihood intrinsic dimension (Levina & Bickel 2005, "Maximum likelihood estimation
 * of intrinsic dimension", NIPS; docs/methods.md §6) with the correction of MacKay & Ghahramani (2005):
 * the local estimate at x is m_k(x) = [ (1/(k−1)) Σ_{j<k} ln(T_k(x)/T_j(x)) ]⁻¹, and the global
 * estimate averages the *inverses* 1/m_k(x) before inverting, because averaging m_k itself is
 * dominated by the points whose neighbours happen to be nearly equidistant.
 *
 * Points with T_1 = 0 (exact duplicates) or fewer than k neighbours are left out. `nnDist` is m×k
 * neighbour distances, ascending. null with no usable point or a zero average inverse.
 */
export function mleDimension(nnDist: Float64Array, m: number, k: number): number | null {
  if (k < 2) return null;
  let n = 0;
  let sumInverse = 0;
  for (let i = 0; i < m; i++) {
    const base = i * k;
    const t1 = nnDist[base];
    const tk = nnDist[base + k - 1];
    if (!(t1 > 0) || Number.isNaN(tk)) continue;
    let s = 0;
    // Neighbours within the k-NN tie tolerance may come out a rounding error out of order.
    for (let j = 0; j < k - 1; j++) s += Math.log(Math.max(1, tk / nnDist[base + j]));
    n++;
    sumInverse += s / (k - 1);
  }
  if (n === 0 || !(sumInverse > 0)) return null;
  return n / sumInverse;
}
