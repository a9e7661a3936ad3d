// A suggested term is written to a stop list in a spelling that both this tool and the user's
// pipeline match (engine/terms/stop-list-spelling.ts): with stemming on, the word, not its stem. Outside reference: scikit-learn's analyzer
// (Debian python3-sklearn), which compares `stop_words` with its own tokens as written.
import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { startReview } from '../extension/src/engine/review/start-review';
import { createTokenizer } from '../extension/src/engine/tokenize/create-tokenizer';
import { MARKUP_NAMES } from '../extension/src/engine/terms/markup-names';
import { wordClasses } from '../extension/src/engine/terms/function-words';
import { stopListLine, stopListSpellings, suggestionLines } from '../extension/src/engine/terms/stop-list-spelling';
import { sklearnTokens } from './support/sklearn-analyzer';

describe('stop list spelling of suggested terms', function () {
  this.timeout(120_000);
  const tokenize = createTokenizer(DEFAULT_SETTINGS.tokens);
  const prior = [...wordClasses().keys(), ...MARKUP_NAMES];

  it('stopListSpellings: with stemming on, the term "becaus" is written "because"; unstemmed terms as they are', () => {
    const stemmed = createTokenizer({ ...DEFAULT_SETTINGS.tokens, stem: true });
    assert.deepEqual(stemmed('because'), ['becaus'], 'Porter stem (wink-nlp stemmer)');
    assert.deepEqual(stopListSpellings(['becaus', 'the', 'zebra'], stemmed), { becaus: 'because' });
    assert.deepEqual(stopListSpellings(['the'], stemmed), {}, 'only suggested terms are listed');
    assert.deepEqual(stopListSpellings(['through', 'because'], tokenize), {}, 'unstemmed, every prior word is its own term');
  });

  it('every plain spelling goes back to its term through the tokenizer (a stop list line stops the suggested term)', () => {
    const stemmed = createTokenizer({ ...DEFAULT_SETTINGS.tokens, stem: true });
    for (const t of [tokenize, stemmed]) {
      const terms = [...new Set(prior.flatMap((w) => t(w)))];
      const spellings = stopListSpellings(terms, t);
      for (const [term, line] of Object.entries(spellings)) assert.deepEqual(t(line), [term], line);
    }
  });

  it('scikit-learn: each prior word of two or more letters it keeps whole is matched by the line written for it', () => {
    // The default token pattern keeps runs of 2+ word characters; a word it keeps whole must be
    // written exactly so, or `stop_words` never removes it (scikit-learn 1.2, build_analyzer).
    const words = prior.filter((w) => /^[a-z0-9]{2,}$/.test(w));
    const theirs = sklearnTokens(words, { lowercase: true, ngram_range: [1, 1] });
    const terms = words.map((w) => tokenize(w));
    const spellings = stopListSpellings(terms.filter((t) => t.length === 1).map((t) => t[0]!), tokenize);
    const missed: string[] = [];
    words.forEach((w, i) => {
      const ours = terms[i]!;
      if (ours.length !== 1) return; // wink splits it ("cannot"); no single line stands for it
      if (theirs[i]!.length === 1 && stopListLine({ suggestionSpellings: spellings }, ours[0]!) !== theirs[i]![0]) missed.push(`${w} → ${ours[0]}`);
    });
    assert.deepEqual(missed, []);
  });

  it('pattern tokenizer: the prior\'s contraction parts are written as scikit-learn tokens them ("ll" of "we\'ll", not "\'ll")', () => {
    const pattern = createTokenizer({ ...DEFAULT_SETTINGS.tokens, tokenizer: 'pattern' });
    const theirs = sklearnTokens(["we'll", "we've", "we're"], { lowercase: true, ngram_range: [1, 1] });
    assert.deepEqual(theirs, [['we', 'll'], ['we', 've'], ['we', 're']]);
    const spellings = stopListSpellings(['ll', 've', 're'], pattern);
    for (const term of ['ll', 've', 're']) {
      assert.equal(stopListLine({ suggestionSpellings: spellings }, term), term);
      assert.deepEqual(pattern(term), [term], 'the line stops the term in the review too');
    }
  });

  it('startReview, stemming on: a corpus where "because" is in every document suggests "becaus", written "because"; that line stops it', async () => {
    const docs = Array.from({ length: 40 }, (_, i) => `rested because the ${['gate', 'field', 'wood', 'town'][i % 4]} number ${i}`);
    const text = docs.map((t) => JSON.stringify({ text: t })).join('\n') + '\n';
    const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-spelling-'));
    const configPath = path.join(dir, 'loudword.json');
    writeFileSync(configPath, JSON.stringify({ tokens: { stem: true } }));
    const review = (stopListText?: string) => startReview({
      file: path.join(dir, 'walks.jsonl'),
      text,
      configPath,
      ...(stopListText !== undefined ? { stopListText } : {}),
      overrides: { format: 'jsonl', text: 'text', label: null, stopList: stopListText !== undefined ? 'stoplist.txt' : null, sample: { documents: 40, k: 3 } },
    });
    const first = (await review()).report;
    assert.ok(first.suggestions.includes('becaus'), first.suggestions.join(' '));
    const lines = suggestionLines(first);
    assert.ok(lines.includes('because') && !lines.includes('becaus'), lines.join(' '));
    const second = (await review(lines.join('\n') + '\n')).report;
    assert.ok(!second.suggestions.includes('becaus'));
    assert.equal(second.terms.find((t) => t.term === 'becaus')?.status, 'stopped');
    assert.deepEqual(second.stopList.unused, []);
    rmSync(dir, { recursive: true, force: true });
  });
});
