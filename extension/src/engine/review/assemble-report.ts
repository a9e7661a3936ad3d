import type { EffectiveSettings, HubRow, Report } from '../../protocol';
import type { CorpusSource } from '../read/corpus-source';
import type { PreparedWeights } from './prepare-weights';
import type { TermReview } from '../terms/review-terms';
import type { ReviewSample } from './choose-sample';
import type { DistanceResult } from '../what-if/distance-lab';
import { LOUDWORD_VERSION } from './version';

const HUBS_IN_REPORT = 12;

export interface ReportParts {
  settings: EffectiveSettings;
  source: CorpusSource;
  prepared: PreparedWeights;
  stopList: { file: string | null; exists: boolean; terms: string[]; unused: string[] };
  baseline: DistanceResult;
  termReview: TermReview;
  sample: ReviewSample;
}

/** The Report (README.md "The Report") from the parts of a finished review. */
export function assembleReport(p: ReportParts): Report {
  const { documents, tokens } = p.prepared;
  return {
    tool: { name: 'loudword', version: LOUDWORD_VERSION },
    input: {
      file: p.source.file,
      format: p.source.format,
      textField: p.source.textField,
      labelField: p.source.labelField,
      documents,
      skipped: p.source.skipped.count,
      truncated: p.source.truncated ?? undefined,
      skippedExamples: p.source.skipped.examples.slice(0, 5),
      notes: notesOf(p),
    },
    settings: p.settings,
    vocabulary: { terms: p.prepared.terms.length, tokens, nonzeros: p.prepared.nonzeros, meanDocLength: documents > 0 ? tokens / documents : 0, englishGrammarShare: p.termReview.englishGrammarShare },
    baseline: p.baseline.measures,
    suggested: p.termReview.suggested.measures,
    terms: p.termReview.rows,
    suggestions: p.termReview.suggestions,
    suggestionSpellings: p.termReview.spellings,
    suggestionPieces: p.termReview.pieces,
    verdict: p.termReview.verdict,
    hubs: hubRows(p),
    stopList: { file: p.stopList.file, exists: p.stopList.exists, terms: p.stopList.terms.length, unused: p.stopList.unused },
  };
}

/** The reader's notes, then the tokenizer's; undefined when there are none. */
function notesOf(p: ReportParts): string[] | undefined {
  const notes = [...(p.source.notes ?? []), ...(p.prepared.notes ?? [])];
  return notes.length > 0 ? notes : undefined;
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
