// The suggestion method's promise, held on the development set (test/corpora/README.md): made
// WITHOUT labels, the list must score, by scikit-learn's leave-one-out cosine precision@10,
// at least max(English list, max_df = 0.5) − 0.002 and at least no list − 0.005 on each corpus.
// Reference: scikit-learn (Debian python3-sklearn) TfidfVectorizer and NearestNeighbors, via
// test/quality/precision_at_k.py; the corpora come from Debian and npm packages.
// Left out: package-descriptions and package-synopses (they need apt's English translations, which
// a CI machine's apt may not fetch), and the three open failures docs/methods.md §9 reports: kernel-docs (−0.004 against
// the English list), wordnet-glosses (−0.013 against no list) and webster-parts-of-speech (−0.027
// against no list: definitions grouped by part of speech, whose grammar words are the signal).
// This test guards what holds; the quality table (`npm run quality`) shows all.
import { strict as assert } from 'node:assert';
import { DEV_CORPORA } from './corpora/dev-corpora';
import { bounds, qualityRow } from './quality/quality-row';
import { scratchFolder } from './support/scratch-folder';

const LEFT_OUT = new Set(['package-descriptions', 'package-synopses', 'kernel-docs', 'wordnet-glosses', 'webster-parts-of-speech']);

describe('suggestions without labels against the generic lists (development set)', function () {
  this.timeout(900_000);
  const dir = scratchFolder('loudword-quality-');

  for (const corpus of DEV_CORPORA.filter((c) => !LEFT_OUT.has(c.name))) {
    it(`${corpus.name} (${corpus.role}): ours ≥ max(English, max_df) − 0.002 and ≥ no list − 0.005`, async () => {
      // Not a skip: every corpus here comes from packages CI installs or downloads.
      assert.ok(corpus.available(), `${corpus.name} is not available: ${corpus.missing}`);
      const row = await qualityRow(corpus, dir(), null);
      const b = bounds(row);
      const figures = `none ${row.none.toFixed(4)}, English ${row.english.toFixed(4)}, max_df ${row.maxDf.toFixed(4)}, ours ${row.ours.toFixed(4)} (${row.suggested} terms)`;
      console.log(`      ${corpus.name}: ${figures}`);
      assert.ok(b.passBest, `${corpus.name}: ours − max(E, M) = ${b.vsBest.toFixed(4)}; ${figures}`);
      assert.ok(b.passNone, `${corpus.name}: ours − none = ${b.vsNone.toFixed(4)}; ${figures}`);
    });
  }
});
