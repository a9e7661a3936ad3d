// The term table's "why" names the rule that decided and what kind of word the term is, and
// nothing else: a number is never called a function word (issue 9). Source: the rule's own
// definitions (docs/methods.md §9); no outside figure.
import { strict as assert } from 'node:assert';
import type { TermRow } from '../extension/src/protocol';
import type { Decision } from '../extension/src/engine/terms/choose-suggestions';
import { explainTerm } from '../extension/src/engine/terms/explain-term';

const row = (term: string, status: TermRow['status']): TermRow => ({ term, df: 60, idf: 1.5, pullShare: 0.02, neighborLift: 0.4, spread: 0.9, loudness: 0.01, status, why: '' });
const signal = { docFraction: 0.6, burstiness: 0.12, burstinessSe: 0.03 };

describe('explainTerm', () => {
  it('explainTerm: a number in most documents is suggested for being everywhere, never as a function word', () => {
    const d: Decision = { suggested: true, reason: 'everywhere', signal, cls: null };
    const why = explainTerm(row('2002', 'suggested'), 100, d);
    assert.match(why, /in 60% of documents: more than half/);
    assert.doesNotMatch(why, /function word|pronoun|determiner|grammar/);
  });

  it('explainTerm: a number word of the prior is called a number word, an adverb of frequency one, not a function word', () => {
    const n: Decision = { suggested: true, reason: 'grammar', signal: { ...signal, docFraction: 0.2 }, cls: 'number' };
    const why = explainTerm(row('four', 'suggested'), 100, n);
    assert.match(why, /^number word in 60% of documents, spread evenly/);
    assert.doesNotMatch(why, /function word|pronoun|determiner/);
    const f: Decision = { ...n, cls: 'frequency' };
    assert.match(explainTerm(row('usually', 'suggested'), 100, f), /^adverb of frequency in 60% of documents/);
  });

  it('explainTerm: a grammar word names its class and its burstiness; a bursty one says it clusters', () => {
    const g: Decision = { suggested: true, reason: 'grammar', signal: { ...signal, docFraction: 0.3 }, cls: 'pronoun' };
    assert.match(explainTerm(row('they', 'suggested'), 100, g), /^pronoun in 60% of documents, spread evenly \(burstiness 0\.12 ± 0\.03/);
    const b: Decision = { suggested: false, reason: 'bursty', signal: { ...signal, burstiness: 6 }, cls: 'pronoun' };
    assert.match(explainTerm(row('she', 'kept'), 100, b), /^kept: pronoun .* clusters in some documents/);
    // Spread more evenly than chance: written with a real minus, as the measures table writes it.
    const even: Decision = { ...g, signal: { ...signal, burstiness: -0.25 } };
    assert.match(explainTerm(row('they', 'suggested'), 100, even), /\(burstiness \u22120\.25 ± 0\.03/);
  });

  it('explainTerm: markup residue and opinion text say so', () => {
    const m: Decision = { suggested: true, reason: 'markup', signal, cls: 'markup' };
    assert.match(explainTerm(row('br', 'suggested'), 100, m), /markup residue \(an HTML tag or entity name\)/);
    const o: Decision = { suggested: false, reason: 'opinion', signal, cls: 'negation' };
    assert.match(explainTerm(row('not', 'kept'), 100, o), /negation .*reads as opinion text/);
  });

  it('explainTerm: a light word gives its group, the joint share and the bound', () => {
    const l: Decision = { suggested: false, reason: 'light', group: 'grammar', signal: { ...signal, docFraction: 0.3 }, cls: 'pronoun', groupShare: 0.084 };
    assert.match(explainTerm(row('you', 'kept'), 100, l), /^kept: pronoun in 60% of documents, spread evenly, but the grammar words below half the documents together carry only 8\.4% of the all-pair similarity left once the other suggestions are removed \(under 15%\)/);
    const c: Decision = { suggested: false, reason: 'light', group: 'common', signal: { ...signal, docFraction: 0.61 }, cls: null, groupShare: 0.123 };
    assert.match(explainTerm(row('kernel', 'kept'), 100, c), /^kept: in 60% of documents: more than half, but the words above half that are not grammar words together carry only 12% of the all-pair similarity left/);
  });

  it('explainTerm: a stopped term tells whether the rule agrees with the list', () => {
    const d: Decision = { suggested: true, reason: 'everywhere', signal, cls: 'determiner' };
    assert.match(explainTerm(row('the', 'stopped'), 100, d), /^on the stop list; the suggestion rule agrees/);
    const k: Decision = { suggested: false, reason: 'bursty', signal, cls: 'pronoun' };
    assert.match(explainTerm(row('she', 'stopped'), 100, k), /^on the stop list, though the suggestion rule would keep it/);
  });
});
