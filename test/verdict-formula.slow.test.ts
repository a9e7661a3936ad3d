// The verdict's caution for text written to a formula (engine/terms/judge-suggestions.ts,
// formulaSentence), on real corpora reviewed without labels (test/corpora/README.md): dictionary
// definitions open with their formula's grammar words ("Someone who …", "Any of …") and get it;
// quotations and jokes, whose grammar words rarely open a document, do not. The corpora come from
// Debian packages (wordnet-base, dict-gcide, fortunes); that definitions are written to a formula
// whose head names the kind of thing defined is a fact of the trade (common practice, no source).
import { strict as assert } from 'node:assert';
import { corporaNamed } from './corpora/dev-corpora';
import { reviewWithoutLabels } from './quality/quality-row';
import { scratchFolder } from './support/scratch-folder';

describe('the verdict says when the texts follow a formula (real corpora, no labels)', function () {
  this.timeout(300_000);
  const dir = scratchFolder('loudword-formula-');

  const expect: Record<string, RegExp | null> = {
    'wordnet-glosses': /These texts follow a formula: \d+% of the documents open with one of \d+ grammar words \([^)]*"someone"/,
    'webster-definitions': /These texts follow a formula: \d+% of the documents open with one of \d+ grammar words \([^)]*"any"/,
    fortunes: null,
  };
  for (const corpus of corporaNamed(Object.keys(expect))) {
    const pattern = expect[corpus.name]!;
    it(`${corpus.name}: ${pattern === null ? 'no formula caution' : 'the formula caution, with its heads'}`, async () => {
      assert.ok(corpus.available(), `${corpus.name} is not available: ${corpus.missing}`);
      const { report } = await reviewWithoutLabels(corpus, dir(), null);
      const headline = report.verdict?.headline ?? '';
      if (pattern === null) assert.doesNotMatch(headline, /follow a formula/);
      else assert.match(headline, pattern);
    });
  }
});
