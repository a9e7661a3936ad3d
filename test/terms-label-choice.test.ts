// With labels and suggest.useLabels, half the sample decides whether rule 2's grammar words stay
// (engine/terms/label-choice.ts), and the verdict counts only the other half
// (judge-suggestions.ts). The mechanics on generated text-like rows (test/support, common practice,
// no source); what the choice does on real corpora, against scikit-learn, is
// label-choice.slow.test.ts.
import { strict as assert } from 'node:assert';
import type { Decision } from '../extension/src/engine/terms/choose-suggestions';
import type { CorpusPrecision } from '../extension/src/engine/terms/corpus-precision';
import { judgeSuggestions } from '../extension/src/engine/terms/judge-suggestions';
import { chooseWithLabels, decisionsAfterChoice, type LabelChoice } from '../extension/src/engine/terms/label-choice';
import type { TermSignal } from '../extension/src/engine/terms/term-signals';
import { DistanceLab } from '../extension/src/engine/what-if/distance-lab';
import { twoLabs } from './support/two-labs';

/** A decision of rule 2 (a grammar word below half) or rule 1, with a placeholder signal. */
function decision(reason: 'grammar' | 'everywhere'): Decision {
  return { suggested: true, reason, signal: {} as TermSignal, cls: reason === 'grammar' ? 'preposition' : null };
}

describe('the labels decide about the grammar words on half the sample', () => {
  const { lab, baseline, X } = twoLabs(5);
  const m = lab.sampleRows.rows;
  const accepted = [1, 2, 4, 6];
  const decisions = new Map<number, Decision>([[1, decision('everywhere')], [2, decision('grammar')], [4, decision('grammar')], [6, decision('everywhere')]]);
  const suggestedMask = DistanceLab.union(new Uint8Array(X.cols), accepted);
  const suggested = lab.measure(suggestedMask, baseline.neighbors);
  const input = { lab, baseMask: new Uint8Array(X.cols), accepted, decisions, suggestedMask, suggested, baseline };

  it('half of the sampled documents decide, the same half for the same seed, and the group is the rule-2 words', () => {
    const a = chooseWithLabels(input)!;
    const b = chooseWithLabels(input)!;
    assert.deepEqual(a.group, [2, 4]);
    assert.equal(a.deciding.reduce((s, x) => s + x, 0), m >> 1);
    assert.deepEqual(a.deciding, b.deciding);
    assert.ok(a.decidedBy <= m >> 1 && a.decidedBy > 0, `decided by ${a.decidedBy}`);
    // Kept exactly when the interval is above zero; the list and the decisions follow.
    assert.equal(a.kept, a.low > 0);
    assert.deepEqual(a.accepted, a.kept ? [1, 6] : accepted);
    const after = decisionsAfterChoice(decisions, a);
    assert.equal(after.get(2)!.reason, a.kept ? 'labels' : 'grammar');
    assert.equal(after.get(1)!.reason, 'everywhere');
  });

  it('with the corpus searched, the choice reads its precisions (the verdict\'s neighbours), on the deciding half only', () => {
    // Made-up per-document precisions from the corpus: keeping the words gains 0.3 on every document.
    const asked: Array<[Uint8Array, Uint8Array]> = [];
    const corpus = (before: Uint8Array, after: Uint8Array): CorpusPrecision => {
      asked.push([before, after]);
      return { before: new Float64Array(m).fill(0.5), after: new Float64Array(m).fill(0.8), among: 6000, documents: 6000, queries: m };
    };
    const c = chooseWithLabels({ ...input, corpus })!;
    assert.equal(asked.length, 1);
    assert.deepEqual([...asked[0]![0]].flatMap((x, i) => (x === 1 ? [i] : [])), accepted, 'before: the rule\'s list');
    assert.deepEqual([...asked[0]![1]].flatMap((x, i) => (x === 1 ? [i] : [])), [1, 6], 'after: the list without the grammar words');
    assert.equal(c.kept, true);
    assert.ok(Math.abs(c.change - 0.3) < 1e-12);
    assert.equal(c.decidedBy, m >> 1);
    assert.deepEqual(c.accepted, [1, 6]);
  });

  it('nothing to decide without labels or without a rule-2 word', () => {
    const unlabelled = new DistanceLab(X, Uint32Array.from({ length: 120 }, (_, i) => i * 5), 5, 5, null);
    const base = unlabelled.measure(new Uint8Array(X.cols), null);
    assert.equal(chooseWithLabels({ ...input, lab: unlabelled, baseline: base, suggested: unlabelled.measure(DistanceLab.union(new Uint8Array(X.cols), accepted), base.neighbors) }), null);
    assert.equal(chooseWithLabels({ ...input, decisions: new Map([...decisions].map(([c]) => [c, decision('everywhere')])) }), null);
  });

  it('the verdict counts only the documents that did not decide, and says so', () => {
    // Made-up per-document precisions: the deciding half gains 0.7, the other half nothing.
    const deciding = new Uint8Array(m);
    for (let q = 0; q < m; q += 2) deciding[q] = 1;
    const before = new Float64Array(m).fill(0.5);
    const after = Float64Array.from(before, (v, q) => (deciding[q] === 1 ? 0.9 : v + (q % 4 === 1 ? 0.1 : -0.1)));
    const corpus: CorpusPrecision = { before, after, among: 6000, documents: 6000, queries: m };
    const choice: LabelChoice = { words: 2, kept: false, change: -0.01, low: -0.03, high: 0.01, decidedBy: m / 2, group: [2, 4], deciding, accepted, mask: new Uint8Array(X.cols), measured: suggested };
    const judge = (labelChoice: LabelChoice | null) =>
      judgeSuggestions({ lab, suggestions: ['t1', 't2', 't4', 't6'], baseline, suggested, opinion: { share: 0, opinionText: false }, agreedStopped: 0, light: {}, corpus, documents: 6000, labelChoice });
    const without = judge(null);
    assert.equal(without.outcome, 'helps', 'all documents counted: the deciding half\'s gain shows');
    const v = judge(choice);
    assert.ok(Math.abs(v.estimate!.change) < 1e-9, `held-out change ${v.estimate!.change}`);
    assert.equal(v.outcome, 'no clear change');
    assert.match(v.headline, new RegExp(`over ${m / 2} sampled documents`));
    assert.match(v.headline, /The labels were asked whether the 2 grammar words below half the documents should stay: on \d+ sampled documents keeping them changed label precision@5 by −0\.0\d+ \(95% interval −0\.0\d+ to \+0\.0\d+\), no clear gain, so they are suggested\. The figure above counts only the other sampled documents, which had no part in that choice\./);
    assert.deepEqual(v.labelChoice, { words: 2, kept: false, change: -0.01, low: -0.03, high: 0.01, decidedBy: m / 2 });
    assert.equal(without.labelChoice, undefined);
  });

  it('when the labels keep every suggestion, nothing is suggested and the headline says why', () => {
    const deciding = new Uint8Array(m);
    const choice: LabelChoice = { words: 3, kept: true, change: 0.02, low: 0.01, high: 0.03, decidedBy: 60, group: [2, 4, 5], deciding, accepted: [], mask: new Uint8Array(X.cols), measured: baseline };
    const v = judgeSuggestions({ lab, suggestions: [], baseline, suggested: baseline, opinion: { share: 0, opinionText: false }, agreedStopped: 0, light: {}, labelChoice: choice });
    assert.equal(v.outcome, 'nothing suggested');
    assert.match(v.headline, /^No stop list suggested\. The labels kept the 3 grammar words below half the documents that the rule would suggest: on 60 sampled documents keeping them changed label precision@5 by \+0\.0\d+/);
  });
});

describe('a labelled verdict that is not "helps" points to --use-labels when grammar words are suggested', () => {
  const { lab, baseline, opening } = twoLabs(3);
  const suggested = lab.measure(opening, baseline.neighbors);
  const m = lab.sampleRows.rows;
  // Made-up per-document precisions that fall with the list: 0.6 before, 0.4 after.
  const corpus: CorpusPrecision = { before: new Float64Array(m).fill(0.6), after: new Float64Array(m).fill(0.4), among: 6000, documents: 6000, queries: m };
  const judge = (suggestions: string[], grammarWords: number) =>
    judgeSuggestions({ lab, suggestions, baseline, suggested, opinion: { share: 0, opinionText: false }, agreedStopped: 0, light: {}, corpus, documents: 6000, grammarWords });

  it('names how many of the terms are grammar words, with the flag and the setting', () => {
    const v = judge(['t0', 't3'], 1);
    assert.equal(v.outcome, 'hurts');
    assert.match(v.headline, /1 of them is a grammar word below half the documents, which can carry kinds of document rather than blur topics: --use-labels \("suggest\.useLabels": true\) lets half the sample decide whether it stays\./);
    assert.match(judge(['t0'], 1).headline, / It is a grammar word below half/);
  });

  it('says nothing when no suggested term is a grammar word below half', () => {
    assert.doesNotMatch(judge(['t0', 't3'], 0).headline, /--use-labels/);
  });
});
