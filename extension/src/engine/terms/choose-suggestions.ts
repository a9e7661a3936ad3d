import { isMeaningClass } from './function-words';
import type { PriorClass } from './prior-columns';
import { termSignal, type TermSignal } from './term-signals';
import type { TermCountStats } from './term-count-stats';

/** Why a term is suggested, or why a term the rules looked at is kept. */
export type Decision =
  | { suggested: true; reason: 'everywhere' | 'grammar' | 'markup'; signal: TermSignal; cls: PriorClass | null }
  | { suggested: false; reason: 'bursty' | 'opinion' | 'protected' | 'format'; signal: TermSignal; cls: PriorClass | null }
  | { suggested: false; reason: 'formula'; signal: TermSignal; cls: PriorClass | null; opensShare: number }
  | { suggested: false; reason: 'light'; group: SuggestionGroup; signal: TermSignal; cls: PriorClass | null; groupShare: number }
  /** Kept by the labels (label-choice.ts, suggest.useLabels): `change` in label precision on `decidedBy` sampled documents. */
  | { suggested: false; reason: 'labels'; signal: TermSignal; cls: PriorClass | null; change: number; decidedBy: number };

/**
 * The two groups suggested only when they are loud together (GROUP_SHARE): 'grammar', the prior's
 * closed-class words below half the documents that rule 2 picks, and 'common', the words outside
 * the prior in more than half the documents that rule 1 picks.
 */
export type SuggestionGroup = 'grammar' | 'common';

/**
 * Above this document fraction a term is suggested (rule 1): the max_df = 0.5 practice (Luhn 1958;
 * scikit-learn's max_df), which held on every corpus measured (docs/methods.md §8). Not tuned.
 * Those outside the prior form the 'common' group, suggested only when loud (GROUP_SHARE).
 */
export const EVERYWHERE = 0.5;
/**
 * A prior word is kept when its burstiness is clearly above that of this corpus's typical content
 * word (b − Z·se > the median burstiness of the terms outside the prior that are in at least
 * CONTENT_DF of the documents): the corpus shows it clusters like its topic words do. Relative,
 * because how bursty words are depends on how mixed the corpus is (docs/methods.md §9).
 * Z = 2 is the usual two standard errors; CONTENT_DF keeps one-off words out of the median, and
 * CONTENT_MIN_DOCS does so in a small corpus, where 1% is a single document: a word seen in one
 * or two documents has no measurable burstiness (its estimate is about −2μ/Σμ², below zero), and
 * a median over mostly such words falls below the Poisson value 0, so that every grammar word
 * looked "bursty" (docs/methods.md §9). FALLBACK_LIMIT is used when no content term qualifies.
 */
export const BURST_Z = 2;
export const CONTENT_DF = 0.01;
export const CONTENT_MIN_DOCS = 3;
export const FALLBACK_LIMIT = 1;
/**
 * Each group (SuggestionGroup) is suggested only when its words together carry at least this
 * share of the all-pair similarity of the corpus the other rules leave (everything they suggest
 * removed, no stop list of the project's). Measured there rather than on the raw corpus because
 * the prior's words in more than half the documents ("the", "and", "of") carry most of the raw
 * similarity and are stopped anyway: what matters is how much of what remains the group would
 * decide. Below it a group distorts little, and what it can carry is worth keeping: light grammar
 * words in long documents (manuals) can mark the kind of document, and a few light words above
 * half can be the collection's own subject ("kernel", "driver"). Chosen for the grammar group
 * between the TUNE corpora it separates — man pages 8.4% (rule 2 cost 0.0046 precision@10 there)
 * and SpamAssassin 29% (rule 2 gained 0.0024) — as the round value near their geometric mean
 * 15.5%, and used unchanged for the common group (docs/methods.md §9).
 */
export const GROUP_SHARE = 0.15;
/**
 * A prior word is kept as the head of the corpus's formula when at least this share of its
 * occurrences are a document's first token, in at least FORMULA_MIN_DOCS documents: "Someone who
 * …", "Any of …", "One who …", "Having …". In text written to a formula its head names the kind
 * of thing the document is, which may be what the user's groups are (a definition of a person,
 * of an act; an adjective's definition), and it is a few words, so keeping it costs little where
 * the groups are topics instead. Half (most of its occurrences) and 5 documents were fixed before
 * the rule was run, and it was adopted on the TUNE corpora (docs/methods.md §9): elsewhere a
 * grammar word occurs mostly inside the text, and in long documents always.
 */
export const FORMULA_OPENS = 0.5;
export const FORMULA_MIN_DOCS = 5;

/** Median burstiness of the terms outside the prior in at least CONTENT_DF of the documents and CONTENT_MIN_DOCS documents. */
export function contentBurstiness(stats: TermCountStats, prior: ReadonlyMap<number, PriorClass>): number {
  const values: number[] = [];
  const minDocs = Math.max(CONTENT_MIN_DOCS, CONTENT_DF * stats.documents);
  for (let c = 0; c < stats.df.length; c++) {
    if (stats.documents === 0 || stats.df[c]! < minDocs || prior.has(c)) continue;
    const b = termSignal(stats, c).burstiness;
    if (Number.isFinite(b)) values.push(b);
  }
  if (values.length === 0) return FALLBACK_LIMIT;
  values.sort((a, b) => a - b);
  const h = values.length >> 1;
  return values.length % 2 === 1 ? values[h]! : (values[h - 1]! + values[h]!) / 2;
}

/** One joint share the rule needs: `group`'s, with `removed` stopped. */
export interface ShareAsk {
  group: readonly number[];
  removed: Uint8Array;
}

export interface ChoiceInput {
  stats: TermCountStats;
  /** Prior columns with their class (closed-class words, markup names). */
  prior: ReadonlyMap<number, PriorClass>;
  /** Columns the project already stops: never suggested again. */
  stopped: Uint8Array;
  /** Columns of `suggest.protect`: never suggested. */
  protect: ReadonlySet<number>;
  /** The corpus reads as opinion text (opinion-check.ts). */
  opinion: boolean;
  /** With the function-word prior off, only the document-fraction rule is used. */
  usePrior: boolean;
  /**
   * For each ask, the joint share of its `group` in the all-pair similarity of the whole corpus
   * once its `removed` columns are stopped (exact; docs/methods.md §3). The asks are independent
   * passes over the whole corpus, asked together so that they can run side by side.
   */
  jointShares: (asks: readonly ShareAsk[]) => number[];
}

/**
 * The suggestion rule (docs/methods.md §9). Every input is an exact per-term sum over the whole
 * corpus, computed without the stop list, so the result does not depend on the sample or its
 * seed, and stopping one term by hand changes no other term's decision.
 * - Any term in more than half the documents is suggested (but on opinion text, not a negation,
 *   degree or contrast word); those outside the prior only when together they carry at least
 *   GROUP_SHARE of the all-pair similarity once the other rules' terms are removed (else they
 *   are 'light': kept).
 * - A closed-class word of the prior is suggested unless the corpus shows it is burstier than its
 *   typical content word (it then carries a topic here), and only when the words so chosen carry
 *   together at least GROUP_SHARE in the same way.
 * - A prior word that opens a document in at least FORMULA_OPENS of its occurrences (in at least
 *   FORMULA_MIN_DOCS documents) heads the corpus's formula and is kept, whatever the rules above
 *   would say: it names the kind of document.
 * - Markup residue (tag and entity names, pieces of web addresses) in at least CONTENT_DF of the
 *   documents is suggested on opinion text only. On topic text it is kept unless in more than
 *   half the documents: there the markup marks a kind of document (HTML mail against plain mail),
 *   which can be the very thing that separates the topics, and where no markup is left the names
 *   are ordinary words ("net", "span").
 * - On opinion text, the meaning-bearing prior words are kept and only markup residue, the
 *   grammar words in more than half the documents, and nothing else is suggested.
 * Returns a decision for every column the rules looked at; the rest are plain kept terms.
 */
export function chooseSuggestions(input: ChoiceInput): Map<number, Decision> {
  const { stopped } = input;
  const all = firstDecisions(input);
  // With the prior off the rule is max_df's plain cut: no group is weighed.
  const shares = input.usePrior ? groupShares(input, all) : null;
  const out = new Map<number, Decision>();
  for (const [c, d] of all) {
    if (stopped[c] === 1) continue;
    const group = groupOf(d);
    const light = shares !== null && group !== null && shares[group] < GROUP_SHARE;
    out.set(c, light ? { suggested: false, reason: 'light', group, signal: d.signal, cls: d.cls, groupShare: shares[group] } : d);
  }
  return out;
}

/**
 * The joint shares chooseSuggestions(input) will ask for, in its order: each is a pass over the
 * whole corpus that depends on none of the distance measures, so a review can begin them early
 * (on other threads) and answer chooseSuggestions' jointShares from them.
 */
export function plannedShareAsks(input: Omit<ChoiceInput, 'jointShares'>): ShareAsk[] {
  return input.usePrior ? shareAsks(input, firstDecisions(input)).asks : [];
}

/** Every column's decision before the joint-share condition (decide), as if nothing were stopped. */
function firstDecisions(input: Omit<ChoiceInput, 'jointShares'>): Map<number, Decision> {
  const { stats } = input;
  const all = new Map<number, Decision>();
  const limit = contentBurstiness(stats, input.prior);
  // Every column is judged as if nothing were stopped, so that the groups' joint shares, and
  // with them every decision, are the same whatever the project's list holds.
  for (let c = 0; c < stats.df.length; c++) {
    const d = decide(input, c, limit);
    if (d !== null) all.set(c, d);
  }
  return all;
}

/** The group a suggestion belongs to, when it is suggested only as part of a loud group. */
function groupOf(d: Decision): SuggestionGroup | null {
  if (d.reason === 'grammar') return 'grammar';
  if (d.reason === 'everywhere' && d.cls === null) return 'common';
  return null;
}

/**
 * Each group's joint share, measured on the corpus without every other suggestion (the other
 * group's included): both groups are judged on the same first decisions, so neither verdict
 * depends on the order they are looked at in. A group with no member gets 0 and is never asked.
 */
function groupShares(input: ChoiceInput, all: ReadonlyMap<number, Decision>): Record<SuggestionGroup, number> {
  const { asked, asks } = shareAsks(input, all);
  const answers = input.jointShares(asks);
  const out: Record<SuggestionGroup, number> = { grammar: 0, common: 0 };
  asked.forEach((g, i) => (out[g] = answers[i]!));
  return out;
}

/** The groups with a member, and for each the ask: its members, with every other suggestion removed. */
function shareAsks(input: Omit<ChoiceInput, 'jointShares'>, all: ReadonlyMap<number, Decision>): { asked: SuggestionGroup[]; asks: ShareAsk[] } {
  const groups: SuggestionGroup[] = ['grammar', 'common'];
  const members: Record<SuggestionGroup, number[]> = { grammar: [], common: [] };
  for (const [c, d] of all) {
    const g = groupOf(d);
    if (g !== null) members[g].push(c);
  }
  const asked = groups.filter((g) => members[g].length > 0);
  const asks = asked.map((g) => {
    const removed = new Uint8Array(input.stats.df.length);
    for (const [c, d] of all) if (d.suggested && groupOf(d) !== g) removed[c] = 1;
    return { group: members[g], removed };
  });
  return { asked, asks };
}

/** One column's decision before the joint-share condition; null where no rule looks at it. */
function decide(input: Omit<ChoiceInput, 'jointShares'>, c: number, limit: number): Decision | null {
  const { stats, prior, protect, opinion, usePrior } = input;
  if (stats.df[c]! === 0) return null;
  const cls = prior.get(c) ?? null;
  const inPrior = usePrior && cls !== null;
  // termSignal's docFraction, without its other signals for the many columns no rule looks at.
  const everywhere = (stats.documents > 0 ? stats.df[c]! / stats.documents : 0) > EVERYWHERE;
  if (!everywhere && !inPrior) return null;
  const signal = termSignal(stats, c);
  if (protect.has(c)) return { suggested: false, reason: 'protected', signal, cls };
  if (inPrior && cls !== 'markup') {
    const opensShare = stats.cf[c]! > 0 ? stats.opens[c]! / stats.cf[c]! : 0;
    if (opensShare >= FORMULA_OPENS && stats.df[c]! >= FORMULA_MIN_DOCS) return { suggested: false, reason: 'formula', signal, cls, opensShare };
  }
  const meaning = cls !== null && cls !== 'markup' && cls !== 'phrase' && isMeaningClass(cls);
  if (opinion) {
    // Markup residue needs to be common to be residue: a tag name in a handful of documents is
    // more likely the word itself ("the net", "a span of years") and moves almost no distance.
    if (cls === 'markup' && inPrior && signal.docFraction < CONTENT_DF) return null;
    if (cls === 'markup' && inPrior) return { suggested: true, reason: 'markup', signal, cls };
    if (meaning) return { suggested: false, reason: 'opinion', signal, cls };
    if (everywhere) return { suggested: true, reason: 'everywhere', signal, cls };
    return { suggested: false, reason: 'opinion', signal, cls };
  }
  if (everywhere) return { suggested: true, reason: 'everywhere', signal, cls };
  if (cls === 'markup') return { suggested: false, reason: 'format', signal, cls };
  const bursty = signal.burstiness - BURST_Z * signal.burstinessSe > limit;
  return bursty ? { suggested: false, reason: 'bursty', signal, cls } : { suggested: true, reason: 'grammar', signal, cls };
}
