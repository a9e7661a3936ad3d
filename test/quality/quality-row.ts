// One row of the suggestion method's quality table (quality-table.ts): leave-one-out precision@10
// by scikit-learn's TfidfVectorizer (defaults) with no list, its English list, max_df = 0.5, and
// Loudword's suggestions made WITHOUT the labels. Reference: scikit-learn (Debian python3-sklearn)
// via precision_at_k.py.
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { startReview } from '../../extension/src/engine/review/start-review';
import { suggestionLines } from '../../extension/src/engine/terms/stop-list-spelling';
import type { DevCorpus, LabelledDoc } from '../corpora/labelled-corpus';
import type { Report } from '../../extension/src/protocol';

const PYTHON = '/usr/bin/python3';

export interface Row {
  name: string;
  role: string;
  documents: number;
  none: number;
  english: number;
  maxDf: number;
  ours: number;
  suggested: number;
  seconds: number;
  outcome: string;
}

/**
 * Writes `corpus` to `dir` as NAME.jsonl (text and label) and reviews it with `configPath`,
 * WITHOUT its labels and without a stop list; `seconds` is the review's wall time.
 */
export async function reviewWithoutLabels(corpus: DevCorpus, dir: string, configPath: string | null): Promise<{ docs: LabelledDoc[]; report: Report; seconds: number }> {
  const docs = await corpus.load();
  const file = path.join(dir, `${corpus.name}.jsonl`);
  // The label is written for scikit-learn's check only; the review is told not to read it.
  writeFileSync(file, docs.map((d) => JSON.stringify({ text: d.text, label: d.label })).join('\n') + '\n');
  const started = performance.now();
  const session = await startReview({ file, configPath, overrides: { text: 'text', label: null, stopList: null } });
  return { docs, report: session.report, seconds: (performance.now() - started) / 1000 };
}

/** Reviews `corpus` (its texts written to `dir`) with `configPath`, and scores the four lists. */
export async function qualityRow(corpus: DevCorpus, dir: string, configPath: string | null): Promise<Row> {
  const { docs, report, seconds } = await reviewWithoutLabels(corpus, dir, configPath);
  // What `loudword apply` writes to a stop list file (plain spellings: "through", not "thru").
  const suggestions = suggestionLines(report);
  const job = {
    texts: docs.map((d) => d.text),
    labels: docs.map((d) => d.label),
    k: 10,
    stop_lists: { none: null, english: 'english', maxDf: { max_df: 0.5 }, ours: suggestions },
  };
  const out = execFileSync(PYTHON, [path.join(__dirname, 'precision_at_k.py')], { input: JSON.stringify(job), maxBuffer: 1 << 26, stdio: ['pipe', 'pipe', 'ignore'] });
  const p = JSON.parse(out.toString()) as { none: number; english: number; maxDf: number; ours: number };
  return {
    name: corpus.name,
    role: corpus.role,
    documents: docs.length,
    ...p,
    // Terms, not lines: the lines add the pieces of contractions (stop-list-spelling.ts).
    suggested: report.suggestions.length,
    seconds,
    outcome: report.verdict?.outcome ?? '—',
  };
}

/**
 * The per-corpus conditions: ours ≥ max(English, max_df) − 0.002 and ours ≥ none − 0.005.
 * P@10 values are multiples of 1/(10·documents), so a difference can land exactly on a bound;
 * the tolerance only absorbs floating-point error (−0.002 is −0.0020000000000000573 in doubles).
 */
export function bounds(r: Row): { vsBest: number; vsNone: number; passBest: boolean; passNone: boolean } {
  const vsBest = r.ours - Math.max(r.english, r.maxDf);
  const vsNone = r.ours - r.none;
  return { vsBest, vsNone, passBest: vsBest >= -0.002 - 1e-12, passNone: vsNone >= -0.005 - 1e-12 };
}
