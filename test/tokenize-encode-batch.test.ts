import { strict as assert } from 'node:assert';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { createTermCoder, createTokenizer, type TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';
import { batchEncoding, packedCounts, type EncodedBatch } from '../extension/src/engine/tokenize/encode-batch';
import { freshWinkInstance } from '../extension/src/engine/tokenize/wink-instance';
import { ALL_KINDS, readAllFortunes } from './support/tokenize-oracle';

// batchEncoding runs a whole batch through the coder at once: the chunk-cached coder keeps the
// chunks wink must see waiting across documents and runs them together, splicing their terms back
// into the right documents. The oracle is each document through wink whole, on a second fresh
// wink instance fed the same documents in the same order (wink's output depends on what it has
// seen; see test/support/tokenize-oracle.ts). Source of the texts: Debian package "fortunes".

/** Each document's term counts from a run of batches, using the batches' own term lists. */
function decode(batches: EncodedBatch[]): { counts: Map<string, number>; tokens: number }[] {
  const terms: string[] = [];
  const docs: { counts: Map<string, number>; tokens: number }[] = [];
  for (const b of batches) {
    assert.equal(b.firstNewId, terms.length, 'a batch names its new terms right after the ones sent before');
    terms.push(...b.newTerms);
    let k = 0;
    for (let d = 0; d < b.rowEnds.length; d++) {
      const counts = new Map<string, number>();
      for (; k < b.rowEnds[d]!; k++) {
        assert.ok(b.cols[k]! < terms.length, 'every id was named by this batch or an earlier one');
        counts.set(terms[b.cols[k]!]!, b.counts[k]!);
      }
      docs.push({ counts, tokens: b.tokens[d]! });
    }
  }
  return docs;
}

function countsOf(terms: readonly string[]): Map<string, number> {
  const m = new Map<string, number>();
  for (const t of terms) m.set(t, (m.get(t) ?? 0) + 1);
  return m;
}

describe('tokenize/encode-batch', function () {
  this.timeout(300_000);

  for (const settings of [
    { ...DEFAULT_SETTINGS.tokens, kinds: [...DEFAULT_SETTINGS.tokens.kinds], ngrams: 1 },
    { lowercase: false, stem: false, minLength: 1, kinds: [...ALL_KINDS], ngrams: 1 },
  ] as TokenSettings[]) {
    it(`batchEncoding of 2,000 fortunes in batches of 100 counts what whole-document wink gives each (lowercase ${settings.lowercase}, ${settings.kinds.length} kinds)`, () => {
      const docs = readAllFortunes().slice(0, 2000);
      const encode = batchEncoding(createTermCoder(settings, { nlp: freshWinkInstance('tokens') }));
      const batches: EncodedBatch[] = [];
      for (let i = 0; i < docs.length; i += 100) batches.push(encode(docs.slice(i, i + 100)));
      const got = decode(batches);
      const plain = createTokenizer(settings, { nlp: freshWinkInstance('tokens'), chunkCache: false });
      docs.forEach((text, d) => {
        const want = plain(text);
        assert.equal(got[d]!.tokens, want.length, `document ${d}: ${JSON.stringify(text.slice(0, 200))}`);
        assert.deepEqual(got[d]!.counts, countsOf(want), `document ${d}: ${JSON.stringify(text.slice(0, 200))}`);
      });
    });
  }
});

describe('packedCounts', () => {
  it('packedCounts keeps the first m counts 16-bit up to 65,535 and 32-bit above, the same numbers', () => {
    const counted = Uint32Array.from([1, 3, 65_535, 2, 7, 9]);
    const small = packedCounts(counted, 4, 65_535);
    assert.ok(small instanceof Uint16Array);
    assert.deepEqual(Array.from(small), [1, 3, 65_535, 2]);
    const large = Uint32Array.from([1, 65_536, 70_000, 4]);
    const wide = packedCounts(large, 3, 70_000);
    assert.ok(wide instanceof Uint32Array);
    assert.deepEqual(Array.from(wide), [1, 65_536, 70_000]);
    assert.equal(packedCounts(counted, 0, 0).length, 0);
  });

  it('batchEncoding sends 16-bit counts for ordinary documents and 32-bit ones for a count above 65,535', () => {
    const encode = batchEncoding(createTermCoder({ ...DEFAULT_SETTINGS.tokens, tokenizer: 'pattern' }));
    const ordinary = encode(['the cat and the hat', 'a cat']);
    assert.ok(ordinary.counts instanceof Uint16Array);
    const huge = encode(['zz '.repeat(65_536), 'the cat']);
    assert.ok(huge.counts instanceof Uint32Array);
    assert.equal(huge.counts[0], 65_536);
  });
});
