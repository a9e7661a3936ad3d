// unusedEntries (review/prepare-weights.ts) against its plain definition: the stop-list entries
// whose term is not among the terms met, as written, in the list's order (common practice, no source).
import { strict as assert } from 'node:assert';
import { unusedEntries } from '../extension/src/engine/review/prepare-weights';
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
