import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { transpose } from '../extension/src/engine/matrix/transpose';

function fromDense(dense: number[][], cols: number): Csr {
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
  return { rows: dense.length, cols, indptr: Uint32Array.from(indptr), indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}

function toDense(m: Csr): number[][] {
  const out = Array.from({ length: m.rows }, () => new Array<number>(m.cols).fill(0));
  for (let r = 0; r < m.rows; r++) for (let k = m.indptr[r]!; k < m.indptr[r + 1]!; k++) out[r]![m.indices[k]!] = m.data[k]!;
  return out;
}

describe('matrix/transpose', () => {
  it('transpose of a 2×3 matrix is its 3×2 transpose', () => {
    // Definition of the transpose (common practice, no source): (Aᵀ)ij = Aji.
    const t = transpose(fromDense([[1, 0, 2], [0, 3, 4]], 3));
    assert.deepEqual(toDense(t), [[1, 0], [0, 3], [2, 4]]);
    assert.deepEqual([...t.indptr], [0, 1, 2, 4]);
  });

  it('property: transpose matches the dense transpose, rows ascend, and transposing twice is the identity', () => {
    let cases = 0;
    const arb = fc
      .record({ rows: fc.integer({ min: 0, max: 10 }), cols: fc.integer({ min: 0, max: 10 }) })
      .chain(({ rows, cols }) =>
        fc.record({
          dense: fc.array(fc.array(fc.oneof(fc.constant(0), fc.integer({ min: 1, max: 9 })), { minLength: cols, maxLength: cols }), { minLength: rows, maxLength: rows }),
          cols: fc.constant(cols),
        }),
      );
    fc.assert(
      fc.property(arb, ({ dense, cols }) => {
        cases++;
        const m = fromDense(dense, cols);
        const t = transpose(m);
        const expected = Array.from({ length: cols }, (_, j) => dense.map((row) => row[j]!));
        assert.deepEqual(toDense(t), expected);
        for (let r = 0; r < t.rows; r++) for (let k = t.indptr[r]! + 1; k < t.indptr[r + 1]!; k++) assert.ok(t.indices[k - 1]! < t.indices[k]!);
        const back = transpose(t);
        assert.deepEqual(back.indptr, m.indptr);
        assert.deepEqual(back.indices, m.indices);
        assert.deepEqual(back.data, m.data);
      }),
      { numRuns: 200, seed: 7 },
    );
    console.log(`      transpose property cases generated: ${cases}`);
  });
});
