import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { rowHasWeight, rowsWithWeight } from '../extension/src/engine/matrix/rows-with-weight';

describe('matrix/rows-with-weight', () => {
  it('rowsWithWeight counts rows with a non-zero value, not rows with stored entries', () => {
    // Hand-built: row 0 has a weight, row 1 only an explicit zero (what a mask or idf = 0 leaves),
    // row 2 nothing stored, row 3 a zero and a weight.
    const X: Csr = {
      rows: 4,
      cols: 3,
      indptr: Uint32Array.from([0, 1, 2, 2, 4]),
      indices: Uint32Array.from([0, 1, 0, 2]),
      data: Float64Array.from([0.5, 0, 0, 1]),
    };
    assert.deepEqual([0, 1, 2, 3].map((r) => rowHasWeight(X, r)), [true, false, false, true]);
    assert.equal(rowsWithWeight(X), 2);
  });
});
