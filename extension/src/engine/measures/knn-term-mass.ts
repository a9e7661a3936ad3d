import type { Csr } from '../matrix/csr';
import { NO_NEIGHBOR } from './knn';

/**
 * Per term, the similarity it contributes inside k-NN pairs: Σ over pairs {q, nb} of x_qt·x_nbt.
 * Set against the all-pairs mass P(t) (docs/methods.md §3) this gives the neighbour lift: a term whose
 * share of neighbour similarity is no larger than its share of all-pairs similarity does not
 * help pick neighbours.
 *
 * Each unordered pair counts once, even when q and nb are in each other's lists, so the
 * mass is comparable with P(t), which also counts each unordered pair once.
 * `neighbors` holds sample positions (m×k); `sample` maps them to rows of X.
 */
export function knnTermMass(X: Csr, sample: Uint32Array, neighbors: Uint32Array, k: number): Float64Array {
  const m = sample.length;
  const mass = new Float64Array(X.cols);
  const { indptr, indices, data } = X;
  for (let q = 0; q < m; q++) {
    for (let r = 0; r < k; r++) {
      const nb = neighbors[q * k + r];
      if (nb === NO_NEIGHBOR) continue;
      // A mutual pair is counted from its lower position only.
      if (nb < q && listContains(neighbors, nb, k, q)) continue;
      // Merge the two rows: column ids ascend within a row.
      let p = indptr[sample[q]];
      const pEnd = indptr[sample[q] + 1];
      let s = indptr[sample[nb]];
      const sEnd = indptr[sample[nb] + 1];
      while (p < pEnd && s < sEnd) {
        const tp = indices[p];
        const ts = indices[s];
        if (tp === ts) {
          mass[tp] += data[p] * data[s];
          p++;
          s++;
        } else if (tp < ts) p++;
        else s++;
      }
    }
  }
  return mass;
}

function listContains(neighbors: Uint32Array, row: number, k: number, value: number): boolean {
  for (let r = 0; r < k; r++) if (neighbors[row * k + r] === value) return true;
  return false;
}
