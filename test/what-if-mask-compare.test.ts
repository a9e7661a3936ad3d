// sameMask and changedColumns compare column masks four columns at a time where the bytes are equal
// (what-if/incremental-term-sums.ts): they must answer what the byte-by-byte definition answers
// (a column is stopped where its byte is not 0, so 1 and 2 stop the same column), on every
// length, alignment and mix of byte values, `a` longer than `b` included.
import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { changedColumns, sameMask } from '../extension/src/engine/what-if/incremental-term-sums';

/** The definition, byte by byte over b's length. */
function changedByByte(a: Uint8Array, b: Uint8Array): number[] {
  const changed: number[] = [];
  for (let t = 0; t < b.length; t++) if ((a[t] !== 0) !== (b[t] !== 0)) changed.push(t);
  return changed;
}

describe('what-if/mask comparison', () => {
  it('sameMask and changedColumns answer as byte by byte, on every length and alignment, with bytes that differ but stop the same column', () => {
    const random = mulberry32(71);
    const values = [0, 1, 2, 255];
    let sameButDifferentBytes = 0;
    let unaligned = 0;
    for (const n of [0, 1, 3, 4, 5, 7, 8, 13, 64, 1001]) {
      for (let draw = 0; draw < 40; draw++) {
        const extra = Math.floor(random() * 3);
        const shiftA = Math.floor(random() * 4);
        const shiftB = Math.floor(random() * 4);
        const a = new Uint8Array(n + extra + shiftA).subarray(shiftA);
        const b = new Uint8Array(n + shiftB).subarray(shiftB);
        if ((a.byteOffset | b.byteOffset) & 3) unaligned++;
        const density = random();
        for (let t = 0; t < a.length; t++) a[t] = random() < density ? values[Math.floor(random() * 4)]! : 0;
        // Mostly the same stopped columns, in other bytes (1 for 2, 255 for 1), and a few changed.
        for (let t = 0; t < n; t++) b[t] = a[t] === 0 ? 0 : values[1 + Math.floor(random() * 3)]!;
        const flips = draw % 3 === 0 ? 0 : 1 + Math.floor(random() * 3);
        for (let f = 0; f < flips && n > 0; f++) {
          const t = Math.floor(random() * n);
          b[t] = b[t] === 0 ? values[1 + Math.floor(random() * 3)]! : 0;
        }
        const want = changedByByte(a, b);
        if (want.length === 0 && a.subarray(0, n).some((x, t) => x !== b[t])) sameButDifferentBytes++;
        assert.deepStrictEqual(changedColumns(a, b), want, `n ${n}, draw ${draw}`);
        assert.equal(sameMask(a, b), want.length === 0, `n ${n}, draw ${draw}`);
      }
    }
    assert.ok(sameButDifferentBytes > 20, 'too few masks that stop the same columns with other bytes');
    assert.ok(unaligned > 100, 'too few unaligned masks');
  });

  it('a shorter first mask reads its missing columns as stopped, as byte by byte', () => {
    const a = Uint8Array.from([1, 0, 1, 0, 1]);
    const b = Uint8Array.from([1, 0, 1, 0, 1, 1, 1, 1, 0]);
    assert.deepStrictEqual(changedColumns(a, b), changedByByte(a, b));
    assert.equal(sameMask(a, b), false);
    assert.equal(sameMask(a, b.subarray(0, 8)), changedByByte(a, b.subarray(0, 8)).length === 0);
  });
});
