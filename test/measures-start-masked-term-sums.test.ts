// startMaskedTermSums and startMaskedTermSumsInSeries must answer exactly what maskedTermSums
// answers (itself tied to TfidfVectorizer through termSums: test/measures-masked-term-sums.test.ts
// and test/weighting-sklearn.test.ts), whether the passes run on a thread (the matrix on
// SharedArrayBuffers) or in this one.
import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { maskedTermSums, type MaskedTermSums } from '../extension/src/engine/measures/masked-term-sums';
import { startMaskedTermSums, startMaskedTermSumsInSeries } from '../extension/src/engine/measures/start-masked-term-sums';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';

/** Unit rows of random weights (some rows empty), on shared or ordinary buffers. */
function randomRows(rows: number, cols: number, seed: number, shared: boolean): Csr {
  const random = mulberry32(seed);
  const indptr = new Uint32Array(rows + 1);
  const indices: number[] = [];
  const data: number[] = [];
  for (let r = 0; r < rows; r++) {
    const start = indices.length;
    let norm2 = 0;
    for (let c = 0; c < cols; c++) {
      if (random() < 0.08) {
        const w = random();
        indices.push(c);
        data.push(w);
        norm2 += w * w;
      }
    }
    for (let p = start; p < data.length; p++) data[p] = data[p]! / Math.sqrt(norm2);
    indptr[r + 1] = indices.length;
  }
  const put = <T extends Uint32Array | Float64Array>(make: (b: ArrayBufferLike) => T, bytes: number, values: number[]): T => {
    const a = make(shared ? new SharedArrayBuffer(bytes * values.length) : new ArrayBuffer(bytes * values.length));
    a.set(values);
    return a;
  };
  return { rows, cols, indptr, indices: put((b) => new Uint32Array(b), 4, indices), data: put((b) => new Float64Array(b), 8, data) };
}

function assertSameBits(got: MaskedTermSums, expected: MaskedTermSums): void {
  assert.equal(got.rowsWithWeight, expected.rowsWithWeight);
  for (const key of ['s1', 's2', 'df', 'sxlogx'] as const) assert.deepEqual(Array.from(got.sums[key]), Array.from(expected.sums[key]), key);
}

describe('startMaskedTermSums', function () {
  this.timeout(60_000);
  const cols = 300;
  const removed = new Uint8Array(cols);
  for (let c = 0; c < cols; c += 7) removed[c] = 1;

  // The second pass goes to the thread the first left waiting (engine/threads/lasting-thread.ts).
  it('on its own thread (shared matrix) gives maskedTermSums to the bit, with and without the spread', () => {
    const X = randomRows(3000, cols, 11, true);
    for (const withSpread of [true, false]) {
      const pending = startMaskedTermSums(X, removed, withSpread);
      assertSameBits(pending.take(), maskedTermSums(X, removed, withSpread));
      assert.ok(pending.fromThread, 'the answer came from this thread, not the other');
    }
  });

  it('reads the mask as it was when started, not as the caller changes it afterwards', () => {
    const X = randomRows(500, cols, 12, true);
    const mask = removed.slice();
    const pending = startMaskedTermSums(X, mask, true);
    const expected = maskedTermSums(X, mask, true);
    mask.fill(1);
    assertSameBits(pending.take(), expected);
  });

  it('computes in this thread when the matrix is not shared or there is no thread script, with the same answer', () => {
    const plain = randomRows(800, cols, 13, false);
    const inPlain = startMaskedTermSums(plain, removed, true);
    assertSameBits(inPlain.take(), maskedTermSums(plain, removed, true));
    assert.equal(inPlain.fromThread, false);
    const shared = randomRows(800, cols, 14, true);
    const noScript = startMaskedTermSums(shared, removed, true, null);
    assertSameBits(noScript.take(), maskedTermSums(shared, removed, true));
    assert.equal(noScript.fromThread, false);
  });

  it('in series on one thread: each pass maskedTermSums to the bit, read in any order, masks as they were when started', () => {
    const X = randomRows(2000, cols, 15, true);
    const other = new Uint8Array(cols);
    for (let c = 0; c < cols; c += 3) other[c] = 1;
    const none = new Uint8Array(cols);
    const asks = [
      { removed: removed.slice(), withSpread: false },
      { removed: other.slice(), withSpread: true },
      { removed: none, withSpread: false },
    ];
    const expected = asks.map((a) => maskedTermSums(X, a.removed, a.withSpread));
    const pending = startMaskedTermSumsInSeries(X, asks);
    none.fill(1);
    for (const i of [2, 0, 1]) {
      assertSameBits(pending[i]!.take(), expected[i]!);
      assert.ok(pending[i]!.fromThread, `pass ${i} came from the thread`);
    }
    const plain = randomRows(300, cols, 16, false);
    const here = startMaskedTermSumsInSeries(plain, asks.slice(0, 2));
    here.forEach((p, i) => {
      assertSameBits(p.take(), maskedTermSums(plain, asks[i]!.removed, asks[i]!.withSpread));
      assert.equal(p.fromThread, false);
    });
    assert.deepEqual(startMaskedTermSumsInSeries(X, []), []);
  });
});
