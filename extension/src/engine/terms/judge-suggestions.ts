import { formatCount, formatSignedChange as signed, withMinus } from '../../number-format';
import type { Measures, Verdict } from '../../protocol';
import { estimateDigits } from '../../verdict-wording';
import type { DistanceLab, DistanceResult } from '../what-if/distance-lab';
import { pairedBootstrap } from './paired-bootstrap';
import { perQueryQuality } from './per-query-quality';
import type { Decision, SuggestionGroup } from './choose-suggestions';
import type { CorpusPrecision } from './corpus-precision';
import { onlyWhere, type LabelChoice } from './label-choice';

/** Bootstrap draws behind the verdict's interval. */
export const VERDICT_DRAWS = 400;

export interface JudgeInput {
  lab: DistanceLab;
  suggestions: readonly string[];
  /** The current setting and the suggested one, as DistanceLab.measure gave them. */
  baseline: DistanceResult;
  suggested: DistanceResult;
  opinion: { share: number; opinionText: boolean };
  /** Stopped terms the rule would suggest too: after `apply`, the reason nothing is new. */
  agreedStopped: number;
  /** The groups the rule kept as light, each with its joint share of the similarity. */
  light: LightGroups;
  /** With labels, each sampled document's precision with neighbours from the corpus (corpus-precision.ts); null: from the sample. */
  corpus?: CorpusPrecision | null;
  /** Documents in the corpus (more than the sample: the headline says where the neighbours were sought). */
  documents?: number;
  /** The prior's words the rule kept as the heads of the corpus's formula, and how many documents they open. */
  formula?: FormulaHeads | null;
  /** With labels and suggest.useLabels: the labels' choice about the grammar words (label-choice.ts); the verdict then counts only the documents that did not decide. */
  labelChoice?: LabelChoice | null;
  /** The setting suggest.useLabels: with labels, the choice above; without, the headline says the labels decided nothing. */
  useLabels?: boolean;
  /** Suggested grammar words below half the documents (rule 2, label-choice.ts grammarGroup): what suggest.useLabels would ask the labels about. */
  grammarWords?: number;
  /** When the text does not read as English (NOT_ENGLISH_SHARE): the English grammar words' share of its tokens, and its most widespread terms. */
  notEnglish?: NotEnglish | null;
}

/** What the verdict says about a corpus whose text is not English to the rule (languageSentence). */
export interface NotEnglish {
  share: number;
  widest: Array<{ term: string; share: number }>;
}

/**
 * Below this share of its word tokens being English grammar words, a corpus does not read as
 * English, and the verdict says that rule 2 had nothing to judge. It decides only whether a
 * sentence is shown, not what is suggested. A round value set from the sixteen English
 * development corpora (all at 17% or more: one-line package synopses 17.3%, SpamAssassin 28.9%,
 * the rest 34–60%), before the German and Spanish fortunes checked it (3.0% and 2.7%; a dpkg log
 * 6.6%); docs/methods.md §9, "Text that is not English".
 */
export const NOT_ENGLISH_SHARE = 0.1;

/**
 * Below this many word tokens the share says little about a language ("hello world" has no
 * grammar word): a round value, common practice, no source; the smallest development corpus
 * (70 newswire stories) has ~12,000.
 */
export const LANGUAGE_MIN_TOKENS = 1000;

/** Whether the verdict says the text is not English (languageSentence). */
export function readsAsNotEnglish(englishGrammarShare: number, wordTokens: number): boolean {
  return wordTokens >= LANGUAGE_MIN_TOKENS && englishGrammarShare < NOT_ENGLISH_SHARE;
}

/**
 * Why rule 2 had nothing to say: its grammar words are English, and this text has few of them. The
 * corpus's own grammar words, if it has any, are likely among its most widespread terms, so they
 * are named for the user to judge.
 */
export function languageSentence(notEnglish: NotEnglish): string {
  const widest = notEnglish.widest.map((w) => `"${w.term}" (in ${pct(w.share)})`).join(', ');
  return `The grammar words rule 2 knows are English, and they are only ${pct1(notEnglish.share)} of this corpus's words (${pct(NOT_ENGLISH_SHARE)} or more in English text): it is probably in another language, or not prose, and its own grammar words were not judged. Its most widespread terms are ${widest}: if they are grammar words that blur your topics, add them to the stop list by hand, and check with --label.`;
}

/** The formula heads kept (choose-suggestions.ts, FORMULA_OPENS), most documents opened first. */
export interface FormulaHeads {
  heads: string[];
  /** Documents whose first token is one of the heads (exact: CountMatrix.firstTerms). */
  documentsOpened: number;
}

/** The kept formula heads (not on the stop list) by the rule's decisions, most documents opened first. */
export function formulaHeads(decisions: ReadonlyMap<number, Decision>, stopped: Uint8Array, opens: Float64Array, terms: readonly string[]): FormulaHeads {
  const cols: number[] = [];
  for (const [c, d] of decisions) if (d.reason === 'formula' && stopped[c] === 0) cols.push(c);
  cols.sort((a, b) => opens[b]! - opens[a]! || a - b);
  let documentsOpened = 0;
  for (const c of cols) documentsOpened += opens[c]!;
  return { heads: cols.map((c) => terms[c]!), documentsOpened };
}

/**
 * Without labels the verdict warns that the texts follow a formula when at least this share of
 * the documents open with a kept formula head. A round value, chosen on no corpus's precision: it
 * decides only whether a sentence is shown. On the development corpora (docs/methods.md §9) the
 * share is 11% on WordNet's glosses and on Webster's definitions grouped by part of speech, 7% on
 * Webster's subject-labelled definitions, at most 0.5% on the others.
 */
export const FORMULA_CAUTION_SHARE = 0.05;

/** Per group kept as light (choose-suggestions.ts, GROUP_SHARE): its joint share. */
export type LightGroups = Partial<Record<SuggestionGroup, number>>;

// A real minus, as in the measures table (number-format.ts).
const f2 = (x: number): string => withMinus(x.toFixed(2));
const f3 = (x: number): string => withMinus(x.toFixed(3));
const pct = (x: number): string => `${Math.round(x * 100)}%`;
const pct1 = (x: number): string => `${(x * 100).toFixed(1)}%`;

/** Why the light groups were not suggested, one sentence each; '' when none was light. */
function lightSentences(light: LightGroups): string {
  const out: string[] = [];
  if (light.common !== undefined) {
    out.push(`Words in more than half the documents that are not grammar words were kept: together they carry only ${pct1(light.common)} of the all-pair similarity left once the other suggestions are removed, too little to distort distances, and they can be the collection's own subject (docs/methods.md §9).`);
  }
  if (light.grammar !== undefined) {
    out.push(`Grammar words in fewer than half the documents were kept: together they carry only ${pct1(light.grammar)} of the all-pair similarity left once the other suggestions are removed, too little to distort distances, and in long documents they can mark the kind of document (docs/methods.md §9).`);
  }
  return out.join(' ');
}

/**
 * The caution for text written to a formula, '' when too few documents open with a kept head.
 * In such text the formula's grammar words may name the kind of document ("someone who …", "the
 * act of …"), and whether the user's groups are kinds or topics is what no measure without labels
 * can see (docs/methods.md §9, "Why the glosses cannot be told from Webster without labels").
 */
export function formulaSentence(formula: FormulaHeads | null | undefined, documents: number): string {
  if (formula == null || formula.heads.length === 0 || documents <= 0) return '';
  const share = formula.documentsOpened / documents;
  if (share < FORMULA_CAUTION_SHARE) return '';
  const n = formula.heads.length;
  const quoted = formula.heads.slice(0, 4).map((h) => `"${h}"`);
  const heads = n === 1
    ? `the grammar word ${quoted[0]}, which mostly opens the documents it occurs in and was kept`
    : `one of ${formatCount(n)} grammar words (${quoted.join(', ')}${n > quoted.length ? ', …' : ''}), which mostly open the documents they occur in and were kept`;
  return `These texts follow a formula: ${pct(share)} of the documents open with ${heads}. If your groups are kinds of document (a person against an act) rather than topics, the formula's other grammar words may carry them, which standout cannot see: measure with --label before applying the list, and with --use-labels let the labels decide whether those words stay.`;
}

/**
 * The one judgement a review leads with (Report.verdict): what the suggested list does to
 * neighbour quality on the sample, with a 95% paired-bootstrap interval over the sampled queries.
 * With labels the quantity is label precision@k; the suggestions never use the labels
 * (choose-suggestions.ts), so every sampled document is held out and the figure is honest.
 * Without labels it is neighbour standout, a proxy (docs/methods.md §8 shows it can rise while
 * precision falls), and the headline says so.
 */
export function judgeSuggestions(input: JudgeInput): Verdict {
  const verdict = judgeList(input);
  if (input.useLabels === true && input.lab.sampleLabels === null) {
    verdict.headline += ' "suggest.useLabels" is on, but there is no label field (--label, or "label" in loudword.json), so the labels decided nothing.';
  }
  return verdict;
}

/**
 * Why the labels cannot judge the list, or null when they can: when every sampled document's
 * precision is 0 with and without the list (no document has a neighbour with its label: a label
 * field that is an identifier, one value per document, is the usual cause), or 1 with and without
 * it (one label for all). No list can move such a figure, and "no clear change, a larger sample
 * would tell" would be wrong; the verdict is then judged as without labels, and says why. So it
 * is when no sampled document has a label at all (a label column left empty): no figure exists.
 */
export function blindLabels(before: Float64Array, after: Float64Array, labels: Int32Array | null): string | null {
  if (labels !== null && !labels.some((id) => id >= 0)) {
    return 'The labels cannot judge the list: no sampled document has a label (every value of the label field is empty, missing or a list). So the verdict is by neighbour standout, as without labels; pass a field that holds classes (a topic, a rating) to measure precision.';
  }
  let value: number | null = null;
  for (const values of [before, after]) {
    for (const v of values) {
      if (Number.isNaN(v)) continue;
      if (v !== 0 && v !== 1) return null;
      if (value !== null && v !== value) return null;
      value = v;
    }
  }
  if (value === null) return null;
  const values = new Set<number>();
  let labelled = 0;
  for (const id of labels ?? []) {
    if (id < 0) continue;
    labelled++;
    values.add(id);
  }
  const stated = labelled === 0 ? '' : ` (${formatCount(values.size)} value${values.size === 1 ? '' : 's'} among ${formatCount(labelled)} sampled documents)`;
  return value === 0
    ? `The labels cannot judge the list: no sampled document has a neighbour with its label, with or without it${stated}; a label field that names each document (an identifier) rather than a class does that. So the verdict is by neighbour standout, as without labels; pass a column of classes (a topic, a rating) to measure precision.`
    : `The labels cannot judge the list: every sampled document's neighbours carry its label, with or without it${stated}. So the verdict is by neighbour standout, as without labels; pass a column of classes (a topic, a rating) to measure precision.`;
}

/** judgeSuggestions' verdict before the note on suggest.useLabels without labels. */
function judgeList(input: JudgeInput): Verdict {
  const { lab, suggestions, opinion } = input;
  const baseline = input.baseline.measures;
  const suggested = input.suggested.measures;
  const caveats = caveatsOf(baseline, suggested);
  const notEnglish = input.notEnglish ?? null;
  // The English grammar words kept as light say nothing about a text that has few of them.
  const light = lightSentences(notEnglish === null ? input.light : { ...input.light, grammar: undefined });
  const language = notEnglish === null ? '' : languageSentence(notEnglish);
  const choice = input.labelChoice ?? null;
  const labelChoice = choice === null ? {} : { labelChoice: figuresOf(choice) };
  if (suggestions.length === 0) {
    return {
      outcome: 'nothing suggested',
      headline: (input.documents ?? lab.sampleRows.rows) < 2
        ? `No stop list suggested: a corpus of one document has no pairs of documents, so no distance to measure or distort; review at least two documents, and more documents than k (${lab.k}) for the neighbour measures.`
        : choice?.kept === true
        ? `No stop list suggested. ${choiceSentence(choice, lab.k)}`
        : input.agreedStopped > 0
        ? `Nothing more to suggest: the ${input.agreedStopped} term${input.agreedStopped === 1 ? '' : 's'} the rule would pick ${input.agreedStopped === 1 ? 'is' : 'are'} already on the stop list.`
        : opinion.opinionText
        ? `No stop list suggested: ${pct(opinion.share)} of the sampled documents carry a clear opinion, and in opinion text negations, intensifiers and contrast words carry what tells documents apart; no other term is in more than half the documents.`
        : light !== '' || language !== ''
        ? `No stop list suggested. ${[light, language].filter((x) => x !== '').join(' ')}`
        : 'No stop list suggested: no term is in more than half the documents, and no grammar word is spread evenly enough here to be noise.',
      estimate: null,
      caveats: [],
      ...labelChoice,
    };
  }
  const labels = lab.sampleLabels;
  const before = perQueryQuality(input.baseline, lab.k, labels);
  const after = perQueryQuality(input.suggested, lab.k, labels);
  // With labels, precision with neighbours from the corpus where it was measured, else from the sample.
  const corpus = input.corpus ?? null;
  // With a label choice, only the documents that did not decide count: the figure is held out.
  const precisionBefore = heldOut(corpus?.before ?? before.precision, choice);
  const precisionAfter = heldOut(corpus?.after ?? after.precision, choice);
  // Labels that cannot tell one list from another (an identifier, or one value for all) judge by standout instead.
  const blind = precisionBefore !== null && precisionAfter !== null ? blindLabels(precisionBefore, precisionAfter, labels) : null;
  const useLabels = precisionBefore !== null && precisionAfter !== null && blind === null;
  const boot = useLabels
    ? pairedBootstrap(precisionBefore, precisionAfter, 'mean', VERDICT_DRAWS, lab.seed)
    : pairedBootstrap(before.standout, after.standout, 'median', VERDICT_DRAWS, lab.seed);
  // The CLI and the panel put "the suggested list helps/hurts" before the headline, so the
  // headline names the terms instead of repeating "the suggested list"; verbs agree with it.
  const one = suggestions.length === 1;
  const list = one ? 'This one term' : `These ${formatCount(suggestions.length)} terms`;
  const agree = (singular: string, plural: string): string => (one ? singular : plural);
  if (boot === null) {
    return { outcome: 'no clear change', headline: `${list} could not be judged: too few sampled documents have neighbours.`, estimate: null, caveats, ...labelChoice };
  }
  const measure = useLabels ? `label precision@${lab.k}` : 'neighbour standout';
  const searched = useLabels && corpus !== null ? { neighborsAmong: corpus.among, neighborsFor: corpus.queries } : {};
  const estimate = { measure, change: boot.change, low: boot.low, high: boot.high, draws: VERDICT_DRAWS, method: 'bootstrap' as const, ...searched };
  const digits = estimateDigits(measure, boot.low, boot.high);
  const sampled = lab.sampleRows.rows;
  const fewer = useLabels && corpus !== null && corpus.queries < sampled;
  // boot.queries: the documents with a label and a neighbour in both settings, of those searched for.
  const over = fewer
    ? `${formatCount(boot.queries)} sampled documents, ${boot.queries === corpus.queries ? '' : `of ${formatCount(corpus.queries)} `}drawn at random from the ${formatCount(sampled)} (a search of the corpus for all of them would cost too much)`
    : `${formatCount(boot.queries)} sampled documents`;
  const interval = `95% interval ${signed(boot.low, digits)} to ${signed(boot.high, digits)} over ${over}`;
  const outcome: Verdict['outcome'] = boot.low > 0 ? 'helps' : boot.high < 0 ? 'hurts' : 'no clear change';
  let headline: string;
  if (useLabels) {
    const from = corpus !== null
      ? `${f3(meanOf(corpus.before))} → ${f3(meanOf(corpus.after))}`
      : `${f3(baseline.labelPrecisionAtK ?? Number.NaN)} → ${f3(suggested.labelPrecisionAtK ?? Number.NaN)}`;
    const verb = outcome === 'helps' ? agree('raises', 'raise') : outcome === 'hurts' ? agree('lowers', 'lower') : agree('does', 'do') + ' not clearly change';
    const where = whereSought(corpus, input.documents ?? sampled, sampled);
    const heldOutSentence = choice === null
      ? 'The list was chosen without the labels, so every sampled document is held out.'
      : `${choiceSentence(choice, lab.k)} The figure above counts only the other sampled documents, which had no part in that choice.`;
    headline = `${list} ${verb} ${measure} (${from}, ${signed(boot.change, digits)}; ${interval}${where}). ${heldOutSentence}`;
    const n = input.grammarWords ?? 0;
    if (outcome !== 'helps' && input.useLabels !== true && n > 0) {
      const which = one ? 'It is a grammar word' : `${formatCount(n)} of them ${n === 1 ? 'is a grammar word' : 'are grammar words'}`;
      headline += ` ${which} below half the documents, which can carry kinds of document rather than blur topics: --use-labels ("suggest.useLabels": true) lets half the sample decide whether ${n === 1 ? 'it stays' : 'they stay'}.`;
    }
    if (outcome === 'no clear change') {
      headline += fewer
        ? ' A difference this small needs more documents searched for than a search of this corpus can take here.'
        : ' A difference this small needs a larger sample (sample.documents) to resolve.';
    }
  } else {
    const make = agree('makes', 'make');
    const verb = outcome === 'helps' ? `${make} nearest neighbours stand out more` : outcome === 'hurts' ? `${make} nearest neighbours stand out less` : `${agree('does', 'do')} not clearly change how much nearest neighbours stand out`;
    headline = `${list} ${verb}: ${measure} ${signed(boot.change, digits)} (${interval}). ${blind !== null
      ? `${blind} Standout is only a proxy for neighbour quality: it rises whenever common words are removed, also on corpora where label precision falls (docs/methods.md §9).`
      : 'Without labels this is only a proxy for neighbour quality: standout rises whenever common words are removed, also on corpora where label precision falls (docs/methods.md §9); pass --label to measure precision.'}`;
    const formula = formulaSentence(input.formula, input.documents ?? sampled);
    if (formula !== '') headline += ` ${formula}`;
  }
  if (opinion.opinionText) {
    headline += ` This corpus reads as opinion text (${pct(opinion.share)} of documents carry a clear opinion), so negations, intensifiers and contrast words were kept: they carry the opinion.`;
  }
  if (light !== '') headline += ` ${light}`;
  if (language !== '') headline += ` ${language}`;
  if (corpus !== null) {
    const sampleSentence = sampleDisagrees(baseline.labelPrecisionAtK, suggested.labelPrecisionAtK, boot.change);
    if (sampleSentence !== null) caveats.push({ measure: 'label precision', sentence: sampleSentence });
  }
  return { outcome, headline, estimate, caveats, ...labelChoice };
}

/** Per-query values with the deciding documents' set to NaN (left out), or as they are without a choice. */
function heldOut(values: Float64Array | null, choice: LabelChoice | null): Float64Array | null {
  return values === null || choice === null ? values : onlyWhere(values, choice.deciding, 0);
}

/** The Report's figures of a label choice (without its columns and masks). */
function figuresOf(choice: LabelChoice): NonNullable<Verdict['labelChoice']> {
  const { words, kept, change, low, high, decidedBy } = choice;
  return { words, kept, change, low, high, decidedBy };
}

/** What the labels said about the grammar words, one sentence. */
function choiceSentence(choice: LabelChoice, k: number): string {
  const words = `${formatCount(choice.words)} grammar word${choice.words === 1 ? '' : 's'} below half the documents`;
  const measure = `label precision@${k}`;
  if (!Number.isFinite(choice.change)) return `The labels could not decide about the ${words} (too few deciding documents have a label and neighbours), so the rule's choice stands.`;
  const digits = estimateDigits(measure, choice.low, choice.high);
  const figures = `on ${formatCount(choice.decidedBy)} sampled documents keeping them changed ${measure} by ${signed(choice.change, digits)} (95% interval ${signed(choice.low, digits)} to ${signed(choice.high, digits)})`;
  return choice.kept
    ? `The labels kept the ${words} that the rule would suggest: ${figures}, so here they carry what the labels are about.`
    : `The labels were asked whether the ${words} should stay: ${figures}, no clear gain, so they are suggested.`;
}

/**
 * The sentence for a table whose label precision (neighbours within the sample) moves the other
 * way from the verdict's (neighbours from the corpus); null when they agree in direction.
 */
function sampleDisagrees(before: number | null, after: number | null, corpusChange: number): string | null {
  if (before === null || after === null) return null;
  const change = after - before;
  if (change === 0 || corpusChange === 0 || Math.sign(change) === Math.sign(corpusChange)) return null;
  return `Label precision with neighbours from the sample alone ${change > 0 ? 'rose' : 'fell'} (${f3(before)} → ${f3(after)}) while with neighbours from the corpus it ${corpusChange > 0 ? 'rose' : 'fell'}: inside a sample the neighbours are farther apart than in the corpus, so the verdict's figure is the one to go by.`;
}

/** Where the sampled documents' neighbours were sought, for the headline ('' when the sample is the corpus). */
function whereSought(corpus: CorpusPrecision | null, documents: number, sampled: number): string {
  if (corpus !== null) {
    return corpus.among === corpus.documents
      ? `, their neighbours sought among all ${formatCount(corpus.among)} documents`
      : `, their neighbours sought among ${formatCount(corpus.among)} of the ${formatCount(corpus.documents)} documents, drawn at random`;
  }
  return documents > sampled ? ', their neighbours sought within the sample, as a search of the corpus would cost too much here' : '';
}

/** Mean over the values that are numbers (NaN: a query with no label, or no value for standout). */
function meanOf(values: Float64Array): number {
  let sum = 0;
  let count = 0;
  for (const v of values) {
    if (Number.isNaN(v)) continue;
    sum += v;
    count++;
  }
  return count === 0 ? Number.NaN : sum / count;
}

/** A sample with fewer than this many other documents per neighbour is too small for its k (caveatsOf). */
const NEIGHBOURS_PER_OTHERS = 5;

/**
 * Measures that moved the unhealthy way, each with the reason it usually does so; first, a
 * sample too small for its k.
 */
export function caveatsOf(before: Measures, after: Measures): Verdict['caveats'] {
  const out: Verdict['caveats'] = [];
  const { documents, k } = before.sample;
  // Our own bound, no published one: with k above a fifth of the others, every document's
  // neighbours are much of the sample, near and far alike, and no neighbour measure can tell.
  if (documents > 1 && k * NEIGHBOURS_PER_OTHERS > documents - 1) {
    const share = Math.round((100 * Math.min(k, documents - 1)) / (documents - 1));
    out.push({ measure: 'sample', sentence: `Only ${documents} sampled documents for k = ${k}: each one's neighbours are ${share}% of the others, so the neighbour measures say little here; use a smaller k (sample.k) or more documents (sample.documents).` });
  }
  const h0 = before.hubness;
  const h1 = after.hubness;
  if (h0 !== null && h1 !== null) {
    if (h1.skewness > h0.skewness + 0.05) {
      out.push({ measure: 'hubness', sentence: `Hubness skew rose (${f2(h0.skewness)} → ${f2(h1.skewness)}): without the shared grammar words, documents that share rarer words become everyone's neighbour; look at the hub list.` });
    }
    if (h1.orphans > h0.orphans) {
      out.push({ measure: 'orphans', sentence: `More documents are in no neighbour list (${h0.orphans} → ${h1.orphans}): short documents lose much of their text to the list and drift apart from everything.` });
    }
  }
  // A sentence says "fell" or "rose" only where the figures it prints differ ("0.11 → 0.11" read as a contradiction).
  if (before.contrast !== null && after.contrast !== null && after.contrast.median < before.contrast.median && f2(after.contrast.median) !== f2(before.contrast.median)) {
    out.push({ measure: 'relative contrast', sentence: `Relative contrast fell (${f2(before.contrast.median)} → ${f2(after.contrast.median)}): on text it falls as neighbours improve, because removing shared words makes far documents farther too (docs/methods.md §4).` });
  }
  if (after.backgroundSimilarity > before.backgroundSimilarity && f3(after.backgroundSimilarity) !== f3(before.backgroundSimilarity)) {
    out.push({ measure: 'background similarity', sentence: `Background similarity rose (${f3(before.backgroundSimilarity)} → ${f3(after.backgroundSimilarity)}): the removed terms were rarer than what remains, so what every pair shares grew.` });
  }
  const p0 = before.labelPrecisionAtK;
  const p1 = after.labelPrecisionAtK;
  const s0 = before.neighborStandout;
  const s1 = after.neighborStandout;
  if (p0 !== null && p1 !== null && s0 !== null && s1 !== null && p1 < p0 && s1 > s0 && f2(s1) !== f2(s0)) {
    out.push({ measure: 'neighbour standout', sentence: `Neighbour standout rose (${f2(s0)} → ${f2(s1)}) while label precision fell: neighbours stand out more but agree less with the labels.` });
  }
  return out;
}
