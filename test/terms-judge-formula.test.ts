// The verdict's caution for text written to a formula (engine/terms/judge-suggestions.ts): shown
// without labels when at least FORMULA_CAUTION_SHARE of the documents open with a kept formula
// head, never with labels (the verdict then measures precision itself). The heads and counts are
// made up here; test/verdict-formula.slow.test.ts checks the sentence on real dictionary
// definitions and on fortunes. The rows are generated text-like rows (test/support, common
// practice, no source).
import { strict as assert } from 'node:assert';
import type { Decision } from '../extension/src/engine/terms/choose-suggestions';
import { FORMULA_CAUTION_SHARE, formulaHeads, formulaSentence, judgeSuggestions } from '../extension/src/engine/terms/judge-suggestions';
import { DistanceLab } from '../extension/src/engine/what-if/distance-lab';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { textLikeRows } from './support/text-like-rows';
import { twoLabs } from './support/two-labs';

describe('the verdict\'s caution for text written to a formula', () => {
  it('is empty below the share and names the heads at or above it', () => {
    const heads = ['someone', 'any', 'an'];
    assert.equal(formulaSentence({ heads, documentsOpened: 49 }, 1000), '', '4.9% is below 5%');
    assert.equal(FORMULA_CAUTION_SHARE, 0.05);
    const s = formulaSentence({ heads, documentsOpened: 50 }, 1000);
    assert.match(s, /^These texts follow a formula: 5% of the documents open with one of 3 grammar words \("someone", "any", "an"\), which mostly open the documents they occur in and were kept\./);
    assert.match(s, /measure with --label before applying the list, and with --use-labels let the labels decide whether those words stay\.$/);
    assert.equal(formulaSentence({ heads: [], documentsOpened: 0 }, 1000), '');
    assert.equal(formulaSentence(null, 1000), '');
  });

  it('agrees in number and shortens a long list of heads', () => {
    assert.match(formulaSentence({ heads: ['having'], documentsOpened: 120 }, 1000), /open with the grammar word "having", which mostly opens the documents it occurs in and was kept\./);
    assert.match(formulaSentence({ heads: ['one', 'having', 'same', 'too', 'beyond'], documentsOpened: 300 }, 1000), /one of 5 grammar words \("one", "having", "same", "too", …\)/);
  });

  it('keeps the heads not on the stop list, most documents opened first, and adds their openings', () => {
    const signal = {} as never;
    const decisions = new Map<number, Decision>([
      [0, { suggested: false, reason: 'formula', signal, cls: null, opensShare: 0.6 }],
      [1, { suggested: true, reason: 'grammar', signal, cls: null }],
      [2, { suggested: false, reason: 'formula', signal, cls: null, opensShare: 0.9 }],
      [3, { suggested: false, reason: 'formula', signal, cls: null, opensShare: 0.7 }],
    ]);
    const opens = Float64Array.of(10, 500, 40, 99);
    const stopped = Uint8Array.of(0, 0, 0, 1);
    assert.deepEqual(formulaHeads(decisions, stopped, opens, ['a', 'b', 'c', 'd']), { heads: ['c', 'a'], documentsOpened: 50 });
  });

  it('is in the headline without labels and not with them', () => {
    const formula = { heads: ['someone'], documentsOpened: 100 };
    const opinion = { share: 0, opinionText: false };
    // Without labels: a lab over the same kind of rows with no label column.
    const random = mulberry32(5);
    const X = textLikeRows(600, 50, random);
    const sample = Uint32Array.from({ length: 120 }, (_, i) => i * 5);
    const unlabelled = new DistanceLab(X, sample, 5, 5, null);
    const base = unlabelled.measure(new Uint8Array(X.cols), null);
    const mask = new Uint8Array(X.cols);
    mask[0] = 1;
    mask[3] = 1;
    const after = unlabelled.measure(mask, base.neighbors);
    const plain = judgeSuggestions({ lab: unlabelled, suggestions: ['t0', 't3'], baseline: base, suggested: after, opinion, agreedStopped: 0, light: {}, documents: 600 });
    const cautioned = judgeSuggestions({ lab: unlabelled, suggestions: ['t0', 't3'], baseline: base, suggested: after, opinion, agreedStopped: 0, light: {}, documents: 600, formula });
    assert.doesNotMatch(plain.headline, /follow a formula/);
    assert.equal(cautioned.headline, `${plain.headline} ${formulaSentence(formula, 600)}`);
    assert.equal(cautioned.outcome, plain.outcome, 'the caution does not change the judgement');

    const { lab, baseline, opening } = twoLabs(3);
    const suggested = lab.measure(opening, baseline.neighbors);
    const labelled = judgeSuggestions({ lab, suggestions: ['t0', 't3'], baseline, suggested, opinion, agreedStopped: 0, light: {}, documents: 600, formula });
    assert.match(labelled.headline, /label precision@5/);
    assert.doesNotMatch(labelled.headline, /follow a formula/);
  });
});
