// A corpus whose text is not English: rule 2's grammar words are English, so the verdict must say
// that it had nothing to judge there, instead of "grammar words kept as light". Corpora: Debian
// packages `fortunes-de` and `fortunes-es` (German and Spanish fortunes, open data from the
// registry) against `fortunes` (English). The bound (NOT_ENGLISH_SHARE) was set from the
// development corpora's shares (docs/methods.md §9, "Text that is not English"), not on these.
import { strict as assert } from 'node:assert';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { startReview } from '../extension/src/engine/review/start-review';
import { LANGUAGE_MIN_TOKENS, NOT_ENGLISH_SHARE, languageSentence } from '../extension/src/engine/terms/judge-suggestions';
import type { Report } from '../extension/src/protocol';
import { readForeignFortunes, readFortunes, type Fortune } from './corpora/fortunes';
import { scratchFolder } from './support/scratch-folder';

describe('a corpus that is not English', function () {
  this.timeout(120_000);
  const dir = scratchFolder('loudword-language-');

  async function review(name: string, fortunes: Fortune[]): Promise<Report> {
    const file = path.join(dir(), `${name}.jsonl`);
    writeFileSync(file, fortunes.map((f) => JSON.stringify(f)).join('\n') + '\n');
    return (await startReview({ file, configPath: null, overrides: { text: 'text', label: null, stopList: null } })).report;
  }

  for (const [language, widest] of [['de', 'die'], ['es', 'de']] as const) {
    it(`fortunes-${language}: few English grammar words, and the verdict says so, naming the corpus's widest terms ("${widest}")`, async () => {
      const r = await review(language, readForeignFortunes(language));
      const share = r.vocabulary.englishGrammarShare!;
      assert.ok(share < NOT_ENGLISH_SHARE, `share ${share}`);
      assert.match(r.verdict!.headline, /The grammar words rule 2 knows are English, and they are only \d+\.\d% of this corpus's words/);
      assert.match(r.verdict!.headline, new RegExp(`most widespread terms are "${widest}" \\(in \\d+%\\)`));
      // The sentence about light English grammar words would mislead here.
      assert.doesNotMatch(r.verdict!.headline, /Grammar words in fewer than half/);
      console.log(`      fortunes-${language}: English grammar words ${(share * 100).toFixed(1)}% of the words; ${r.suggestions.length} suggested`);
    });
  }

  it('fortunes (English): the share is far above the bound and the verdict says nothing of language', async () => {
    const r = await review('en', readFortunes());
    assert.ok(r.vocabulary.englishGrammarShare! > 2 * NOT_ENGLISH_SHARE, `share ${r.vocabulary.englishGrammarShare}`);
    assert.doesNotMatch(r.verdict!.headline, /rule 2 knows are English/);
  });

  it('a corpus of a few hundred words says nothing of language, whatever its share', async () => {
    const few = Array.from({ length: 40 }, (_, i) => ({ text: `hello world number ${i} kind regards`, category: 'x' }));
    const r = await review('few', few);
    assert.ok(r.vocabulary.englishGrammarShare! < NOT_ENGLISH_SHARE && r.vocabulary.tokens < LANGUAGE_MIN_TOKENS);
    assert.doesNotMatch(r.verdict!.headline, /rule 2 knows are English/);
  });

  it('languageSentence names the share, the bound and each widest term with its share of documents', () => {
    const s = languageSentence({ share: 0.031, widest: [{ term: 'le', share: 0.4 }, { term: 'de', share: 0.35 }] });
    assert.match(s, /only 3\.1% of this corpus's words \(10% or more in English text\)/);
    assert.match(s, /"le" \(in 40%\), "de" \(in 35%\)/);
  });
});
