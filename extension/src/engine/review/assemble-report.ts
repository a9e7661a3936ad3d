import type { EffectiveSettings, HubRow, Report } from '../../protocol';
import type { CorpusSource } from '../read/corpus-source';
import type { PreparedWeights } from './prepare-weights';
import type { TermReview } from '../terms/review-terms';
import type { ReviewSample } from './choose-sample';
import type { DistanceResult } from '../what-if/distance-lab';
import { LOUDWORD_VERSION } from './version';
import { duplicatesOf } from '../matrix/duplicate-sketch';
import { markupNote } from './markup-note';
import { boilerplateNote } from './boilerplate-note';
import { unlabelledNote } from './unlabelled-note';
import { formatCount } from '../../number-format';

const HUBS_IN_REPORT = 12;

export interface ReportParts {
  settings: EffectiveSettings;
  source: CorpusSource;
  prepared: PreparedWeights;
  stopList: { file: string | null; exists: boolean; terms: string[]; unused: string[]; split?: Record<string, string[]> | undefined };
  baseline: DistanceResult;
  termReview: TermReview;
  sample: ReviewSample;
  /** Documents with no label (engine/review/unlabelled-note.ts); 0 without a label field. */
  unlabelled: number;
}

/** The Report (README.md "The Report") from the parts of a finished review. */
export function assembleReport(p: ReportParts): Report {
  const { documents, tokens } = p.prepared;
  const duplicates = duplicatesOf(p.prepared.duplicates);
  return {
    tool: { name: 'loudword', version: LOUDWORD_VERSION },
    input: {
      file: p.source.file,
      format: p.source.format,
      textField: p.source.textField,
      labelField: p.source.labelField,
      documents,
      skipped: p.source.skipped.count,
      unlabelled: p.source.labelField === null ? undefined : p.unlabelled,
      truncated: p.source.truncated ?? undefined,
      skippedExamples: p.source.skipped.examples.slice(0, 5),
      notes: notesOf(p, duplicates),
    },
    settings: p.settings,
    vocabulary: { terms: p.prepared.terms.length, tokens, nonzeros: p.prepared.nonzeros, meanDocLength: documents > 0 ? tokens / documents : 0, englishGrammarShare: p.termReview.englishGrammarShare, duplicates },
    baseline: p.baseline.measures,
    suggested: p.termReview.suggested.measures,
    terms: p.termReview.rows,
    suggestions: p.termReview.suggestions,
    suggestionSpellings: p.termReview.spellings,
    suggestionPieces: p.termReview.pieces,
    verdict: p.termReview.verdict,
    hubs: hubRows(p),
    stopList: { file: p.stopList.file, exists: p.stopList.exists, terms: p.stopList.terms.length, unused: p.stopList.unused, split: p.stopList.split },
  };
}

/**
 * The reader's notes, then the tokenizer's, then one each on documents without a label, HTML left
 * in the text, lines repeated across documents and duplicates; undefined when there are none.
 */
function notesOf(p: ReportParts, duplicates: { documents: number; exact: boolean }): string[] | undefined {
  const notes = [...(p.source.notes ?? []), ...(p.prepared.notes ?? [])];
  const unlabelled = unlabelledNote(p.unlabelled, p.prepared.documents, p.source.labelField);
  if (unlabelled !== null) notes.push(unlabelled);
  const markup = markupNote(p.prepared.terms, p.prepared.counts.df, p.prepared.documents);
  if (markup !== null) notes.push(markup);
  const boilerplate = boilerplateNote(p.prepared.repeatedLines, p.prepared.documents);
  if (boilerplate !== null) notes.push(boilerplate);
  const note = duplicatesNote(duplicates, p.prepared.documents);
  if (note !== null) notes.push(note);
  return notes.length > 0 ? notes : undefined;
}

/**
 * Below this share of the documents, duplicates go unmentioned: a round value, common practice,
 * no source (a few repeated one-line messages are normal in most collections).
 */
export const DUPLICATES_NOTE_SHARE = 0.01;

/** What a user deduplicating or measuring distances should know about the exact duplicates; null when they are few. */
export function duplicatesNote(duplicates: { documents: number; exact: boolean }, documents: number): string | null {
  if (documents <= 0 || duplicates.documents < DUPLICATES_NOTE_SHARE * documents) return null;
  const share = Math.round((100 * duplicates.documents) / documents);
  const count = `${duplicates.exact ? '' : 'about '}${formatCount(duplicates.documents)} document${duplicates.documents === 1 ? '' : 's'} (${share < 1 ? '<1' : share}%)`;
  const how = duplicates.exact ? '' : ' (estimated from a sketch of 4,096 distinct documents)';
  return `${count} repeat another document exactly under this tokenising and weighting${how}: at distance 0 from their twins, they fill each other's neighbour lists and weigh on hubness and the neighbour measures. If the duplicates are not what you study, remove them before reviewing (and before clustering or k-NN).`;
}

function hubRows(p: ReportParts): HubRow[] {
  const { hubPositions, kOccurrence } = p.baseline;
  const rows: HubRow[] = [];
  for (let i = 0; i < hubPositions.length && rows.length < HUBS_IN_REPORT; i++) {
    const position = hubPositions[i]!;
    const doc = p.sample.positions[position]!;
    rows.push({ doc, line: p.prepared.lines[doc]!, kOccurrence: Math.round(kOccurrence[position]! * 100) / 100, preview: p.prepared.previews[doc] ?? '' });
  }
  return rows;
}
