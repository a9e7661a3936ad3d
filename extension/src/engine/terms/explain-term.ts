import { formatCount, formatSignedChange, withMinus } from '../../number-format';
import type { TermRow } from '../../protocol';
import { GROUP_SHARE, type Decision } from './choose-suggestions';
import type { PriorClass } from './prior-columns';

const pct = (x: number): string => (x >= 0.1 ? `${(x * 100).toFixed(0)}%` : x >= 0.001 ? `${(x * 100).toFixed(1)}%` : `${(x * 100).toFixed(2)}%`);
const times = (x: number | null): string => (x === null ? 'no' : `${x.toFixed(2)}×`);

const CLASS_NAMES: Record<PriorClass, string> = {
  determiner: 'determiner',
  pronoun: 'pronoun',
  preposition: 'preposition',
  conjunction: 'conjunction',
  auxiliary: 'auxiliary verb',
  adverb: 'grammatical adverb',
  negation: 'negation',
  degree: 'degree word',
  contrast: 'contrast word',
  quantity: 'quantifier',
  number: 'number word',
  frequency: 'adverb of frequency',
  markup: 'markup residue (an HTML tag or entity name)',
  phrase: 'pair of grammar words',
};

/** What the word is, as the prior names it; null for a term outside the prior. */
export function wordKind(cls: PriorClass | null): string | null {
  return cls === null ? null : CLASS_NAMES[cls];
}

function burst(d: Decision): string {
  const b = d.signal.burstiness;
  return Number.isFinite(b) ? `burstiness ${withMinus(b.toFixed(2))} ± ${d.signal.burstinessSe.toFixed(2)}, where 0 means spread like chance` : 'burstiness unknown';
}

/**
 * One line a person can read: why the term is (or is not) suggested. It names the rule that
 * decided (docs/methods.md §9) and what kind of word the term is — a number is never called a
 * function word, because only the prior's own classes are named.
 */
export function explainTerm(row: TermRow, documents: number, decision: Decision | null): string {
  const inDocs = `in ${pct(row.df / Math.max(1, documents))} of documents`;
  const pull = `${pct(row.pullShare)} of all-pair similarity`;
  const lift = `${times(row.neighborLift)} that share among nearest neighbours`;
  const kind = decision === null ? null : wordKind(decision.cls);
  const because = (d: Decision): string => {
    switch (d.reason) {
      case 'everywhere':
        return `${inDocs}: more than half, so it tells few documents apart${kind === null ? '' : ` (${kind})`}`;
      case 'grammar':
        return `${kind ?? 'grammar word'} ${inDocs}, spread evenly (${burst(d)})`;
      case 'markup':
        return `${kind ?? 'markup residue'} ${inDocs}`;
      case 'bursty':
        return `${kind ?? 'word'} ${inDocs}, but it clusters in some documents here (${burst(d)}) more than this corpus's typical content word, as topic words do`;
      case 'opinion':
        return `${kind ?? 'word'} ${inDocs}: this corpus reads as opinion text, where such words carry the opinion`;
      case 'light':
        return d.group === 'common'
          ? `${inDocs}: more than half, but the words above half that are not grammar words together carry only ${pct(d.groupShare)} of the all-pair similarity left once the other suggestions are removed (under ${pct(GROUP_SHARE)}): too little to distort distances, and such words can be the collection's own subject`
          : `${kind ?? 'grammar word'} ${inDocs}, spread evenly, but the grammar words below half the documents together carry only ${pct(d.groupShare)} of the all-pair similarity left once the other suggestions are removed (under ${pct(GROUP_SHARE)}): too little to distort distances, and in such corpora they can mark the kind of document`;
      case 'formula':
        return `${kind ?? 'grammar word'} ${inDocs}, but ${pct(d.opensShare)} of its occurrences open a document: it heads this corpus's formula ("someone who …", "of or pertaining to …"), which names the kind of document, so it is kept`;
      case 'labels':
        return `${kind ?? 'grammar word'} ${inDocs}, spread evenly, but the labels kept the grammar words below half the documents ("suggest.useLabels"): keeping them raised label precision by ${formatSignedChange(d.change, 3)} on ${formatCount(d.decidedBy)} sampled documents, so here they carry what the labels are about`;
      case 'protected':
        return `protected by "suggest.protect"`;
      case 'format':
        return `${kind ?? 'markup residue'} ${inDocs}: in topic text markup can mark the kind of document (HTML or plain), which may be what separates the topics, so it is suggested only in opinion text or above half the documents`;
    }
  };
  switch (row.status) {
    case 'stopped':
      if (decision?.suggested) return `on the stop list; the suggestion rule agrees: ${because(decision)}`;
      if (decision !== null) return `on the stop list, though the suggestion rule would keep it: ${because(decision)}; carries ${pull}, ${lift}`;
      if (row.neighborLift !== null && row.neighborLift >= 1.5) {
        return `on the stop list, yet it carries neighbour signal (${lift}); consider removing it from the list`;
      }
      return `on the stop list; unstopped it would carry ${pull}, ${lift}`;
    case 'suggested':
      return decision === null ? `suggested; carries ${pull}` : `${because(decision)}; carries ${pull}`;
    case 'protected':
      return `protected by "suggest.protect": never suggested`;
    case 'kept':
      if (decision !== null && decision.suggested) return `would be suggested (${because(decision)}), but "suggest.max" was reached`;
      if (decision !== null) return `kept: ${because(decision)}`;
      if (row.neighborLift !== null && row.neighborLift >= 1) return `neighbour signal: ${lift}; ${inDocs}`;
      return `${inDocs}; carries ${pull}, ${lift}`;
  }
}
