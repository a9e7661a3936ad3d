// The suggestion rule (docs/methods.md §9) on hand-made count matrices whose signals are known
// by construction. Sources: max_df = 0.5 as scikit-learn documents it (TfidfVectorizer);
// burstiness from Church & Gale (1995), "Poisson mixtures".
import { strict as assert } from 'node:assert';
import { chooseSuggestions, contentBurstiness, FORMULA_MIN_DOCS, FORMULA_OPENS, GROUP_SHARE, plannedShareAsks, type Decision } from '../extension/src/engine/terms/choose-suggestions';
import { termSignal } from '../extension/src/engine/terms/term-signals';
import type { PriorClass } from '../extension/src/engine/terms/prior-columns';
import { termCountStats } from '../extension/src/engine/terms/term-count-stats';
import { csrOf } from './support/csr-of';

// 40 documents of 100 tokens. Columns:
// 0 'everywhere'  5 in every document                        (content word, df 1.0)
// 1 'grammar'     2 in each of the first 20                  (prior: preposition, df 0.5, even)
// 2 'topical'    40 in each of documents 0..1, 0 elsewhere   (prior: pronoun, df 0.05, bursty)
// 3 'negation'    1 in each of the first 10                  (prior: negation, df 0.25)
// 4 'content'     3 in each of the first 10                  (no prior, df 0.25)
// 5 'markup'      1 in each of the first 4                   (prior: markup, df 0.1)
// 6 'degree'      1 in each of the first 30                  (prior: degree word, df 0.75)
// 7 filler to make every document 100 tokens long
function corpus(): ReturnType<typeof termCountStats> {
  const dense: number[][] = [];
  for (let d = 0; d < 40; d++) {
    const row = [5, d < 20 ? 2 : 0, d < 2 ? 40 : 0, d < 10 ? 1 : 0, d < 10 ? 3 : 0, d < 4 ? 1 : 0, d < 30 ? 1 : 0, 0];
    row[7] = 100 - row.reduce((a, b) => a + b, 0);
    dense.push(row);
  }
  return termCountStats(csrOf(dense));
}
const PRIOR = new Map<number, PriorClass>([[1, 'preposition'], [2, 'pronoun'], [3, 'negation'], [5, 'markup'], [6, 'degree']]);
// Shares of the all-pair similarity given to the rule (in the engine they come from the exact
// sums with the other rules' terms removed): the grammar words (columns 1 and 3) carry 0.09 each,
// together 0.18 — above GROUP_SHARE, so rule 2 applies; the words outside the prior above half
// (column 0 and the filler 7) carry 0.2, so rule 1 does. `calls` records what the rule asked.
function shares(values: Record<number, number> = { 0: 0.2, 1: 0.09, 3: 0.09 }, calls: Array<{ group: number[]; removed: number[] }> = []) {
  return (asks: ReadonlyArray<{ group: readonly number[]; removed: Uint8Array }>): number[] =>
    asks.map(({ group, removed }) => {
      calls.push({ group: [...group].sort((a, b) => a - b), removed: [...removed.keys()].filter((c) => removed[c] === 1) });
      return group.reduce((sum, c) => sum + (values[c] ?? 0), 0);
    });
}

function decide(opinion: boolean, protect: number[] = [], usePrior = true): Map<number, Decision> {
  const stats = corpus();
  return chooseSuggestions({ stats, prior: PRIOR, stopped: new Uint8Array(8), protect: new Set(protect), opinion, usePrior, jointShares: shares() });
}
const brief = (d: Decision | undefined): string => (d === undefined ? '—' : `${d.suggested ? 'suggest' : 'keep'}:${d.reason}`);

describe('chooseSuggestions', () => {
  it('contentBurstiness: the median burstiness of the non-prior terms in ≥ 1% of documents (by hand)', () => {
    // Non-prior columns 0, 4, 7. Column 0: 5 in every 100-token document, b = −1/5.
    // Column 4: 3 in each of 10 of 40 documents: μ = 0.75, Σ(c−μ)² = 10·2.25² + 30·0.75² = 67.5,
    // Σμ = 30, Σμ² = 22.5 → b = 37.5/22.5 = 5/3. Column 7 (filler) lies between: the median is it.
    const stats = corpus();
    const b0 = termSignal(stats, 0).burstiness;
    const b4 = termSignal(stats, 4).burstiness;
    const b7 = termSignal(stats, 7).burstiness;
    assert.ok(Math.abs(b0 - -0.2) < 1e-12 && Math.abs(b4 - 5 / 3) < 1e-12, `${b0} ${b4}`);
    assert.equal(contentBurstiness(stats, PRIOR), [b0, b4, b7].sort((a, b) => a - b)[1]);
  });

  it('chooseSuggestions: topic-labelled text — df > 0.5 always, grammar words unless burstier than the typical content word', () => {
    const d = decide(false);
    assert.equal(brief(d.get(0)), 'suggest:everywhere');
    assert.equal(brief(d.get(1)), 'suggest:grammar'); // df exactly 0.5 is not "more than half"
    assert.equal(brief(d.get(2)), 'keep:bursty');
    assert.equal(brief(d.get(3)), 'suggest:grammar'); // b = −1 (by hand: (7.5 − 10)/2.5)
    assert.equal(brief(d.get(4)), '—');
    // Markup residue below half the documents is kept on topic text (it may mark a kind of document).
    assert.equal(brief(d.get(5)), 'keep:format');
    assert.equal(brief(d.get(6)), 'suggest:everywhere');
    assert.equal(brief(d.get(7)), 'suggest:everywhere');
  });

  it('contentBurstiness: in a small corpus the median skips words seen in fewer than 3 documents', () => {
    // 10 documents of 20 tokens. Column 0 (content): 4 in each of documents 0..4 (df 5, bursty);
    // columns 1..8: one-off words, 1 in a single document each (df 1 — at 1% of 10 documents
    // they would all count, and their estimates are negative); column 9 fills each document.
    const dense: number[][] = [];
    for (let d = 0; d < 10; d++) {
      const row = new Array<number>(10).fill(0);
      row[0] = d < 5 ? 4 : 0;
      if (d < 8) row[d + 1] = 1;
      row[9] = 20 - row.reduce((a, b) => a + b, 0);
      dense.push(row);
    }
    const stats = termCountStats(csrOf(dense));
    const none = new Map<number, PriorClass>();
    for (let c = 1; c <= 8; c++) assert.ok(termSignal(stats, c).burstiness < 0, `one-off column ${c}`);
    const b0 = termSignal(stats, 0).burstiness;
    const b9 = termSignal(stats, 9).burstiness;
    // Only columns 0 and 9 are in ≥ 3 documents: the median is their mean.
    assert.ok(Math.abs(contentBurstiness(stats, none) - (b0 + b9) / 2) < 1e-12);
    assert.ok(contentBurstiness(stats, none) > 0);
  });

  it('chooseSuggestions: opinion text — meaning words kept even above half, grammar words only above half, markup still suggested', () => {
    const d = decide(true);
    assert.equal(brief(d.get(0)), 'suggest:everywhere');
    assert.equal(brief(d.get(1)), 'keep:opinion');
    assert.equal(brief(d.get(3)), 'keep:opinion');
    assert.equal(brief(d.get(5)), 'suggest:markup');
    assert.equal(brief(d.get(6)), 'keep:opinion');
  });

  it('chooseSuggestions: opinion text — a markup name in under 1% of the documents is the word itself, not residue', () => {
    // 200 documents of 10 tokens; column 0 'br' in documents 0..39 (20%), column 1 'net' in
    // document 0 only (0.5%), column 2 fills.
    const dense: number[][] = [];
    for (let d = 0; d < 200; d++) dense.push([d < 40 ? 1 : 0, d === 0 ? 1 : 0, 0]);
    for (const row of dense) row[2] = 10 - row[0]! - row[1]!;
    const stats = termCountStats(csrOf(dense));
    const prior = new Map<number, PriorClass>([[0, 'markup'], [1, 'markup']]);
    const d = chooseSuggestions({ stats, prior, stopped: new Uint8Array(3), protect: new Set(), opinion: true, usePrior: true, jointShares: shares({}) });
    assert.equal(brief(d.get(0)), 'suggest:markup');
    assert.equal(brief(d.get(1)), '—');
  });

  it('chooseSuggestions: suggest.protect wins over every rule; without the prior only df > 0.5 counts', () => {
    assert.equal(brief(decide(false, [0]).get(0)), 'keep:protected');
    const d = decide(false, [], false);
    assert.equal(brief(d.get(1)), '—');
    assert.equal(brief(d.get(5)), '—');
    assert.equal(brief(d.get(0)), 'suggest:everywhere');
  });

  it('chooseSuggestions: already-stopped columns get no decision, and stopping one term changes no other decision', () => {
    const stats = corpus();
    const free = chooseSuggestions({ stats, prior: PRIOR, stopped: new Uint8Array(8), protect: new Set(), opinion: false, usePrior: true, jointShares: shares() });
    const stopped = new Uint8Array(8);
    stopped[1] = 1;
    const after = chooseSuggestions({ stats, prior: PRIOR, stopped, protect: new Set(), opinion: false, usePrior: true, jointShares: shares() });
    assert.equal(after.has(1), false);
    // Column 3 alone carries 0.09, under GROUP_SHARE: it stays suggested because the joint share
    // counts the stopped column 1 too (so applying the suggestions cannot turn rule 2 off).
    assert.equal(brief(after.get(3)), 'suggest:grammar');
    for (const [c, d] of after) assert.equal(brief(d), brief(free.get(c)), `column ${c}`);
  });

  it('chooseSuggestions: grammar words that together carry under GROUP_SHARE of the similarity are kept as light', () => {
    const stats = corpus();
    const run = (jointShare: ReturnType<typeof shares>): Map<number, Decision> =>
      chooseSuggestions({ stats, prior: PRIOR, stopped: new Uint8Array(8), protect: new Set(), opinion: false, usePrior: true, jointShares: jointShare });
    assert.equal(GROUP_SHARE, 0.15);
    const calls: Array<{ group: number[]; removed: number[] }> = [];
    const light = run(shares({ 1: 0.02, 3: 0.02, 0: 0.9 }, calls));
    // Each group's share is asked once, on the corpus without every other suggestion: the grammar
    // words without the words above half (columns 0, 6 and the filler 7), the words above half
    // outside the prior (0, 7) without the grammar words and the prior's word above half (1, 3, 6).
    assert.deepEqual(calls, [{ group: [1, 3], removed: [0, 6, 7] }, { group: [0, 7], removed: [1, 3, 6] }]);
    assert.equal(brief(light.get(1)), 'keep:light');
    assert.equal(brief(light.get(3)), 'keep:light');
    const d = light.get(1)!;
    assert.ok(d.reason === 'light' && d.group === 'grammar' && Math.abs(d.groupShare - 0.04) < 1e-12);
    // Rule 1 and the burstiness gate are untouched: 'everywhere' above half, the bursty pronoun kept.
    assert.equal(brief(light.get(0)), 'suggest:everywhere');
    assert.equal(brief(light.get(2)), 'keep:bursty');
    // At the bound exactly, rule 2 applies (≥).
    const heavy = run(shares({ 1: 0.075, 3: 0.075 }));
    assert.equal(brief(heavy.get(1)), 'suggest:grammar');
    assert.equal(brief(heavy.get(3)), 'suggest:grammar');
  });

  it('chooseSuggestions: words outside the prior above half that together carry under GROUP_SHARE are kept as light', () => {
    const stats = corpus();
    const run = (jointShare: ReturnType<typeof shares>, usePrior = true): Map<number, Decision> =>
      chooseSuggestions({ stats, prior: PRIOR, stopped: new Uint8Array(8), protect: new Set(), opinion: false, usePrior, jointShares: jointShare });
    // Columns 0 and 7 together 0.10: both kept, with the group and its share in the decision.
    const light = run(shares({ 0: 0.05, 7: 0.05, 1: 0.09, 3: 0.09 }));
    for (const c of [0, 7]) {
      const d = light.get(c)!;
      assert.ok(d.reason === 'light' && d.group === 'common' && Math.abs(d.groupShare - 0.1) < 1e-12, `column ${c}: ${brief(d)}`);
    }
    // The prior's word above half (the degree word, column 6) is not in the group: still suggested,
    // and the grammar words, measured on their own, still are too.
    assert.equal(brief(light.get(6)), 'suggest:everywhere');
    assert.equal(brief(light.get(1)), 'suggest:grammar');
    // On opinion text the group is weighed the same way.
    const opinion = chooseSuggestions({ stats, prior: PRIOR, stopped: new Uint8Array(8), protect: new Set(), opinion: true, usePrior: true, jointShares: shares({ 0: 0.05 }) });
    assert.equal(brief(opinion.get(0)), 'keep:light');
    // With the prior off the rule is max_df's plain cut: nothing is weighed, nothing asked.
    const calls: Array<{ group: number[]; removed: number[] }> = [];
    const plain = run(shares({}, calls), false);
    assert.equal(brief(plain.get(0)), 'suggest:everywhere');
    assert.deepEqual(calls, []);
  });

  it('chooseSuggestions: a grammar word that opens most of the documents it occurs in heads the formula and is kept', () => {
    // 40 definitions of 10 tokens: column 0 ('someone', prior pronoun) opens documents 0..11 and
    // occurs once more, inside document 12: 12 of its 13 occurrences open a document (92%).
    // Column 1 ('of', prior preposition) is in documents 0..19 once each, opening none of them.
    // Column 2 fills. Both are spread evenly, so without the opening share both are suggested.
    const dense: number[][] = [];
    for (let d = 0; d < 40; d++) dense.push([d < 13 ? 1 : 0, d < 20 ? 1 : 0, 0]);
    for (const row of dense) row[2] = 10 - row[0]! - row[1]!;
    const firstTerms = Int32Array.from(dense, (_, d) => (d < 12 ? 0 : 2));
    const prior = new Map<number, PriorClass>([[0, 'pronoun'], [1, 'preposition']]);
    const choose = (opens: Int32Array) =>
      chooseSuggestions({ stats: termCountStats(csrOf(dense), opens), prior, stopped: new Uint8Array(3), protect: new Set(), opinion: false, usePrior: true, jointShares: shares({ 0: 0.2, 1: 0.2 }) });
    const d = choose(firstTerms);
    assert.equal(brief(d.get(0)), 'keep:formula');
    assert.ok(Math.abs((d.get(0) as { opensShare: number }).opensShare - 12 / 13) < 1e-12);
    assert.equal(brief(d.get(1)), 'suggest:grammar');
    // The same corpus with no document opening with it: an ordinary grammar word, suggested.
    assert.equal(brief(choose(new Int32Array(40).fill(2)).get(0)), 'suggest:grammar');
    // Below the bounds: opening under FORMULA_OPENS of its occurrences, or fewer than FORMULA_MIN_DOCS documents.
    const fewer = Math.floor(FORMULA_OPENS * 13) - 1; // 5 of 13
    assert.equal(brief(choose(Int32Array.from(dense, (_, d) => (d < fewer ? 0 : 2))).get(0)), 'suggest:grammar');
    const tiny: number[][] = dense.map((row, d) => [d < FORMULA_MIN_DOCS - 1 ? 1 : 0, row[1]!, 10 - (d < FORMULA_MIN_DOCS - 1 ? 1 : 0) - row[1]!]);
    const tinyStats = termCountStats(csrOf(tiny), Int32Array.from(tiny, (_, d) => (d < FORMULA_MIN_DOCS - 1 ? 0 : 2)));
    const t = chooseSuggestions({ stats: tinyStats, prior, stopped: new Uint8Array(3), protect: new Set(), opinion: false, usePrior: true, jointShares: shares({ 0: 0.2, 1: 0.2 }) });
    assert.notEqual(brief(t.get(0)), 'keep:formula', 'a word in fewer documents than FORMULA_MIN_DOCS');
  });

  it('plannedShareAsks: the very asks chooseSuggestions then makes, in its order (a review begins them early)', () => {
    const stats = corpus();
    for (const opinion of [false, true]) {
      for (const usePrior of [true, false]) {
        for (const protect of [[], [0], [1, 3]]) {
          const input = { stats, prior: PRIOR, stopped: new Uint8Array(8), protect: new Set(protect), opinion, usePrior };
          const asked: Array<{ group: number[]; removed: number[] }> = [];
          chooseSuggestions({ ...input, jointShares: (asks) => asks.map((a) => (asked.push({ group: [...a.group], removed: [...a.removed] }), 0.5)) });
          const planned = plannedShareAsks(input).map((a) => ({ group: [...a.group], removed: [...a.removed] }));
          assert.deepEqual(planned, asked, `opinion ${opinion}, prior ${usePrior}, protect ${protect}`);
          if (usePrior && !opinion && protect.length === 0) assert.equal(planned.length, 2, 'both groups are asked on topic text');
        }
      }
    }
  });
});
