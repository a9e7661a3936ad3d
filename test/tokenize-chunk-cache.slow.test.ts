import { strict as assert } from 'node:assert';
import { TICKETS, VARIANTS, benchCorpus, describeVariant, makeOracle, readAllFortunes, readCsvColumn } from './support/tokenize-oracle';

// Slow suite (npm run test:slow): the chunk-cached tokenizer against whole-document wink for all
// 24 option variants over every corpus we have. The quick file tokenize-chunk-cache.test.ts runs
// two corners of the variants on the same corpora. The checks share one oracle (file order).

const { assertSameOverCorpus } = makeOracle();

describe('tokenize (sweep): chunk-cached unigrams equal whole-document wink, all 24 variants', function () {
  this.timeout(1_200_000);

  describe('Debian fortunes (every saying; source: Debian package "fortunes")', () => {
    let docs: string[] = [];
    before(() => {
      docs = readAllFortunes();
    });
    for (const v of VARIANTS) {
      it(describeVariant(v), () => {
        const { winkShare } = assertSameOverCorpus(v, docs);
        // The cache must actually spare wink most of the text once warm, or this path is pointless.
        assert.ok(winkShare < 0.5, `fast path still sent ${(winkShare * 100).toFixed(0)}% of the text to wink`);
      });
    }
  });

  describe('demo corpus samples/support-tickets.csv, message column (our invented corpus: a regression check only)', () => {
    const docs = readCsvColumn(TICKETS, 'message');
    for (const v of VARIANTS) it(describeVariant(v), () => assertSameOverCorpus(v, docs));
  });

  // The first 3,000 of the 10k documents: each variant costs ~2 s per 1,000 documents on the
  // plain path, and the vocabulary is already past the point where the cache is warm.
  describe('generated bench corpus, first 3,000 of 10k documents, seed 1 (test/bench/generate-corpus.mjs, made here when missing; a regression check)', () => {
    let docs: string[] = [];
    before(function () {
      this.timeout(120_000);
      const all = readCsvColumn(benchCorpus('10k', 1), 'text');
      assert.equal(all.length, 10_000);
      docs = all.slice(0, 3_000);
    });
    for (const v of VARIANTS) it(describeVariant(v), () => assertSameOverCorpus(v, docs));
  });
});
