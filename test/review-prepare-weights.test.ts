// unusedEntries (review/prepare-weights.ts) against its plain definition: the stop-list entries
// whose term is not among the terms met, as written, in the list's order (common practice, no source);
// weighingAhead against pruneTerms and weigh (the rows are weighed as written only when pruning
// keeps every column, and then with weigh's idf).
import { strict as assert } from 'node:assert';
import { unusedEntries, weighingAhead } from '../extension/src/engine/review/prepare-weights';
import { pruneTerms } from '../extension/src/engine/matrix/prune-terms';
import { weigh } from '../extension/src/engine/matrix/weigh';
import type { CountMatrix } from '../extension/src/engine/matrix/csr';
import type { RowCountSums } from '../extension/src/engine/tokenize/row-count-sums';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';

const plain = (entries: Array<{ term: string; written: string }>, seen: string[]): string[] => {
  const set = new Set(seen);
  return entries.filter((e) => !set.has(e.term)).map((e) => e.written);
};

describe('unusedEntries', () => {
  it('an empty list has no unused entries; a list with nothing seen is all unused, repeats kept', () => {
    assert.deepEqual(unusedEntries([], ['a', 'b']), []);
    const entries = [{ term: 'the', written: 'The' }, { term: 'of', written: 'of' }, { term: 'the', written: 'the' }];
    assert.deepEqual(unusedEntries(entries, []), ['The', 'of', 'the']);
    assert.deepEqual(unusedEntries(entries, ['of', 'x']), ['The', 'the']);
    assert.deepEqual(unusedEntries(entries, ['the', 'of']), []);
  });

  it('equals the set-based definition on drawn lists and vocabularies', () => {
    const random = mulberry32(7);
    const word = (): string => String.fromCharCode(97 + Math.floor(random() * 6), 97 + Math.floor(random() * 6));
    for (let round = 0; round < 200; round++) {
      const seen = Array.from({ length: Math.floor(random() * 30) }, word);
      const entries = Array.from({ length: Math.floor(random() * 10) }, () => {
        const term = word();
        return { term, written: random() < 0.5 ? term.toUpperCase() : term };
      });
      assert.deepEqual(unusedEntries(entries, seen), plain(entries, seen), `round ${round}`);
    }
  });
});

describe('weighingAhead', () => {
  // Three documents over four terms; df = 1, 2, 3, 1.
  const counts: CountMatrix = {
    rows: 3,
    cols: 4,
    indptr: new Uint32Array([0, 2, 5, 7]),
    indices: new Uint32Array([1, 2, 0, 1, 2, 2, 3]),
    data: new Float64Array([2, 1, 1, 3, 1, 4, 1]),
    terms: ['a', 'b', 'c', 'd'],
    tokensPerDoc: new Uint32Array([3, 5, 5]),
    firstTerms: new Int32Array([1, 0, 2]),
  };
  const df = new Float64Array([1, 2, 3, 1]);
  const sums = { df } as unknown as RowCountSums;
  const weighting = { tf: 'sublinear' as const, idf: 'smooth' as const, norm: 'l1' as const };

  it('weighs ahead exactly when pruneTerms keeps every column, with weigh\'s idf and l2 rows', () => {
    for (const prune of [
      { minDf: 1, maxDf: 1 },
      { minDf: 0.2, maxDf: 3 },
      { minDf: 2, maxDf: 1 },
      { minDf: 1, maxDf: 0.9 },
      { minDf: 1, maxDf: 2 },
    ]) {
      const ahead = weighingAhead({ prune, weighting }, sums, counts.rows);
      const keepsAll = pruneTerms(counts, { ...prune, stopTerms: new Set() }).counts === counts;
      assert.equal(ahead !== null, keepsAll, JSON.stringify(prune));
      if (ahead === null) continue;
      assert.equal(ahead.tf, 'sublinear');
      assert.equal(ahead.norm, 'l2');
      assert.deepEqual(Array.from(ahead.idf), Array.from(weigh(counts, { ...weighting, norm: 'l2' }).idf));
    }
  });

  it('declines bounds pruneTerms refuses, and an empty vocabulary, so that prepareWeights says why', () => {
    assert.equal(weighingAhead({ prune: { minDf: 1, maxDf: 2.5 }, weighting }, sums, counts.rows), null);
    assert.equal(weighingAhead({ prune: { minDf: 3, maxDf: 2 }, weighting }, sums, counts.rows), null);
    assert.equal(weighingAhead({ prune: { minDf: 1, maxDf: 1 }, weighting }, { df: new Float64Array(0) } as unknown as RowCountSums, 3), null);
  });
});
