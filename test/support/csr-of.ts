import type { Csr } from '../../extension/src/engine/matrix/csr';

/** Dense rows (documents) → CSR. */
export function csrOf(dense: number[][]): Csr {
  const indptr = [0];
  const indices: number[] = [];
  const data: number[] = [];
  for (const row of dense) {
    row.forEach((v, j) => {
      if (v !== 0) {
        indices.push(j);
        data.push(v);
      }
    });
    indptr.push(indices.length);
  }
  return { rows: dense.length, cols: dense[0]!.length, indptr: Uint32Array.from(indptr), indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}
