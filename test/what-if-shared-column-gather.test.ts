// SharedColumnGather: a click's gather of the exact sums shared by two threads must leave what one
// thread gathering every block leaves, bit for bit, whoever gathered which block. The one-thread
// sums are themselves held to a full pass (maskedTermSums) in test/what-if-incremental.test.ts,
// and that to scikit-learn's TfidfVectorizer in test/measures-masked-term-sums.test.ts
// (docs/methods.md §1, §3); here each click is also checked against a full pass to 1e-12. The
// helper is a second view of the same shared memory driven from the owner's interrupt (called
// before each block the owner claims), so which blocks it takes is fixed, not left to the
// timing of two threads (test/what-if-parallel.test.ts runs it on a real thread).
import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { maskedTermSums } from '../extension/src/engine/measures/masked-term-sums';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { IncrementalTermSums } from '../extension/src/engine/what-if/incremental-term-sums';
import { GatherFailed, SharedColumnGather } from '../extension/src/engine/what-if/shared-column-gather';
import { textLikeRows } from './support/text-like-rows';

/** Text-like rows with column 0 in every row but a few (a function word: its clicks gather). */
function rowsWithFunctionWord(seed: number): Csr {
  const random = mulberry32(seed);
  const X = textLikeRows(500, 80, random);
  const indptr = new Uint32Array(X.rows + 1);
  const indices: number[] = [];
  const data: number[] = [];
  for (let r = 0; r < X.rows; r++) {
    const start = X.indptr[r]!;
    const end = X.indptr[r + 1]!;
    const entries: Array<[number, number]> = [];
    for (let p = start; p < end; p++) entries.push([X.indices[p]!, X.data[p]!]);
    if (r % 9 !== 4 && entries[0]?.[0] !== 0) entries.unshift([0, 0.3 + random()]);
    const norm = Math.hypot(...entries.map((e) => e[1]));
    for (const [t, w] of entries) {
      indices.push(t);
      data.push(w / norm);
    }
    indptr[r + 1] = indices.length;
  }
  return { rows: X.rows, cols: X.cols, indptr, indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}

/** The sums as plain arrays, to compare bit for bit. */
function copyOf(sums: ReturnType<IncrementalTermSums['at']>) {
  return { s1: sums.sums.s1.slice(), s2: sums.sums.s2.slice(), df: sums.sums.df.slice(), rowsWithWeight: sums.rowsWithWeight };
}

describe('what-if/shared-column-gather', () => {
  it('a helper that takes every block left after the owner has gathered c of them leaves the one-thread sums, bit for bit, each within 1e-12 of a full pass', () => {
    for (const seed of [21, 22]) {
      const X = rowsWithFunctionWord(seed);
      // Gathering whatever the ratio, so that every click here goes through the shared gather.
      const alone = new IncrementalTermSums(X, Infinity);
      const shared = new IncrementalTermSums(X, Infinity);
      const mask = new Uint8Array(X.cols);
      mask[3] = 1;
      alone.at(mask, false);
      shared.at(mask, false);
      const buffers = shared.gatherBuffers();
      assert.ok(buffers !== null, 'the column copy holds the weights at this size');
      const helper = SharedColumnGather.from(buffers);
      const blocks = helper.blocks;
      assert.ok(blocks > 8, `only ${blocks} blocks`);
      let ticket = 0;
      let gathered = 0;
      // Clicks on the function word (stopped, restored, stopped) and on other common columns, never back at the full pass's mask (a checkpoint, restored without a gather), the helper
      // coming after c of the owner's blocks: none, one, some, all but one, all.
      const clicks = [0, 1, 0, 2, 0, 5, 0, 1];
      const after = [0, 1, 7, blocks - 1, blocks, 3, 0, 2];
      for (let i = 0; i < clicks.length; i++) {
        const t = clicks[i]!;
        mask[t] = mask[t] === 0 ? 1 : 0;
        const want = copyOf(alone.at(mask));
        ticket++;
        let claims = 0;
        let helped = -1;
        // The interrupt is called between blocks of rows too, before the gather opens; once it
        // is open, before each of the owner's claims: the helper comes at the c-th of those.
        const helpAfter = () => {
          if (helped >= 0 || helper.opened !== ticket) return;
          if (claims++ === after[i]!) helped = helper.help(ticket, 0);
        };
        const got = copyOf(shared.at(mask, true, helpAfter, ticket));
        assert.equal(shared.lastStep.gathered, true, `click ${i} did not gather`);
        assert.deepStrictEqual(got, want, `seed ${seed}, click ${i} (term ${t}), the helper after ${after[i]} blocks`);
        assert.equal(helped, Math.max(0, blocks - after[i]!), `click ${i}: the helper gathered every block left`);
        gathered += helped;
        // A helper late for its gather claims nothing, for this ticket or an earlier one.
        assert.equal(helper.help(ticket, 0), 0);
        assert.equal(helper.help(ticket - 1, 0), 0);
        // Against a full pass at the same mask (docs/methods.md §3), to 1e-12 relative.
        const full = maskedTermSums(X, mask, false);
        for (let u = 0; u < X.cols; u++) {
          for (const key of ['s1', 's2'] as const) {
            const a = got[key][u]!;
            const b = full.sums[key][u]!;
            assert.ok(Math.abs(a - b) <= 1e-12 * Math.max(1, Math.abs(b)), `seed ${seed}, click ${i}: ${key}[${u}] ${a} vs ${b}`);
          }
        }
      }
      assert.ok(gathered > blocks, `the helper gathered only ${gathered} blocks in all`);
      assert.equal(helper.helped, gathered, 'the shared count of blocks the helper gathered');
    }
  });

  it("a helper's block that fails in a gather adding to the sums as it goes: the owner throws rather than gather twice, and the state is made afresh by a full pass, every later click as from that pass", () => {
    const X = rowsWithFunctionWord(24);
    const failing = (buffers: ReturnType<IncrementalTermSums['gatherBuffers']>) => {
      const helper = SharedColumnGather.from(buffers!);
      // The helper's blocks throw once claimed (as a bug in them would), after adding nothing.
      (helper as unknown as { block: () => void }).block = () => {
        throw new Error('a failing block');
      };
      return helper;
    };
    // The gather alone, into sums in its memory.
    const mask = new Uint8Array(X.cols);
    mask[3] = 1;
    const other = new IncrementalTermSums(X, Infinity);
    other.at(mask, false);
    const owner = SharedColumnGather.create(X.rows, X.cols, other.gatherBuffers()!.nnz);
    const source = SharedColumnGather.from(other.gatherBuffers()!);
    owner.start.set(source.start);
    owner.rowIds.set(source.rowIds);
    owner.values.set(source.values);
    owner.divide();
    owner.rowChange.fill(0.5);
    const place = owner.claimSums()!;
    const helper = failing(owner.buffers);
    let helped = -1;
    assert.throws(
      () => owner.gather(0, mask, place.s1, place.s2, 1, () => void (helped < 0 && owner.opened === 1 ? (helped = helper.help(1, 0)) : 0)),
      (e: unknown) => e instanceof GatherFailed,
    );
    assert.equal(helped, 0, 'the helper gathered no block');
    // Through the state: the click's sums are a full pass's at its mask (a plain state that made
    // that pass agrees to the bit), and the clicks after it answer as from that pass.
    const sums = new IncrementalTermSums(X, Infinity);
    sums.at(mask, false);
    const stateHelper = failing(sums.gatherBuffers());
    let tried = false;
    mask[0] = 1;
    const got = copyOf(sums.at(mask, true, () => void (!tried && stateHelper.opened === 7 ? ((tried = true), stateHelper.help(7, 0)) : 0), 7));
    assert.ok(tried, 'the helper came');
    assert.equal(sums.lastStep.kind, 'full');
    const plain = new IncrementalTermSums(X, Infinity);
    assert.deepStrictEqual(got, copyOf(plain.at(mask, false)));
    mask[1] = 1;
    assert.deepStrictEqual(copyOf(sums.at(mask)), copyOf(plain.at(mask)));
    assert.equal(sums.lastStep.gathered, true);
  });

  it('a helper waiting for a gather that is passed over (the click did not gather) stops at once, and claims nothing of it', () => {
    const X = rowsWithFunctionWord(23);
    const sums = new IncrementalTermSums(X, Infinity);
    sums.at(new Uint8Array(X.cols), false);
    const owner = SharedColumnGather.from(sums.gatherBuffers()!);
    const helper = SharedColumnGather.from(owner.buffers);
    owner.pass(7);
    const started = Date.now();
    assert.equal(helper.help(7, 5000), 0);
    assert.ok(Date.now() - started < 1000, 'the helper waited for a gather passed over');
    // An earlier ticket is over too; a later one not yet opened waits only its limit.
    assert.equal(helper.help(6, 5000), 0);
    assert.equal(helper.help(8, 20), 0);
  });
});
