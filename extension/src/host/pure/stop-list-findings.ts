// Which stop-list entries deserve a diagnostic, from the stop list's text and the Report.
// Two findings, both fixed by removing the entry:
//  - unused: the entry never occurs in the corpus (Report.stopList.unused), so it only adds noise;
//  - neighbour signal: the term was stopped, yet documents that are each other's nearest
//    neighbours share it far more than random pairs do (neighbour lift ≥ NEIGHBOR_SIGNAL_LIFT),
//    so stopping it throws away what tells neighbours apart.
import type { Report } from '../../protocol';
import { splitStopListLines, stopListTerm } from '../../engine/stoplist/stop-list-lines';
import { unusedEntrySentence } from '../../stop-list-wording';

/** A stopped term with neighbour lift at or above this gets a warning. Lift 1 means "no more
 * shared inside k-NN pairs than across all pairs"; 1.25 asks for a quarter more — a judgement
 * call (common practice, no source), kept in one place so it can be tuned. Boilerplate terms
 * sit far below 1 (≈0.26 for a helpdesk footer in samples/), so the margin is wide. */
export const NEIGHBOR_SIGNAL_LIFT = 1.25;

export interface StopListEntry {
  /** The entry as compared with the Report's terms (lowercased when the review lowercases). */
  term: string;
  /** 0-based line and UTF-16 columns of the entry's text, end exclusive. */
  line: number;
  start: number;
  end: number;
}

export type FindingKind = 'unused' | 'neighborSignal';

export interface StopListFinding extends StopListEntry {
  kind: FindingKind;
  message: string;
}

/** Entries of a stop list, read by the engine's own line rules so both sides agree on what is an entry. */
export function stopListEntries(text: string, lowercase: boolean): StopListEntry[] {
  const entries: StopListEntry[] = [];
  const lines = splitStopListLines(text);
  for (let line = 0; line < lines.length; line++) {
    const raw = lines[line]!.text;
    const term = stopListTerm(raw);
    if (term === null) continue;
    const start = raw.indexOf(term);
    entries.push({ term: lowercase ? term.toLowerCase() : term, line, start, end: start + term.length });
  }
  return entries;
}

function fixed(x: number): string {
  return x.toFixed(2);
}

/** The findings for `stopListText`, in line order; at most `max` (a huge list stays responsive). */
export function stopListFindings(stopListText: string, report: Report, max = 1000): StopListFinding[] {
  // The file's entries are matched as the review read them: lower-cased when the tokens are.
  const lowercase = report.settings.tokens.lowercase;
  const unused = new Map(report.stopList.unused.map((written) => [lowercase ? written.toLowerCase() : written, written]));
  const lift = new Map<string, number>();
  for (const row of report.terms) {
    // A term the suggestion rule would suggest itself is never flagged: applying the suggestions
    // must not raise warnings on the terms just added (the rule's reasons are in its `why`).
    if (row.status === 'stopped' && row.ruleWouldSuggest !== true && row.neighborLift !== null && row.neighborLift >= NEIGHBOR_SIGNAL_LIFT) lift.set(row.term, row.neighborLift);
  }
  const findings: StopListFinding[] = [];
  for (const entry of stopListEntries(stopListText, report.settings.tokens.lowercase)) {
    if (findings.length >= max) break;
    const written = unused.get(entry.term);
    if (written !== undefined) {
      findings.push({ ...entry, kind: 'unused', message: unusedEntrySentence(report.stopList, written, baseName(report.input.file)) });
      continue;
    }
    const l = lift.get(entry.term);
    if (l !== undefined) {
      findings.push({
        ...entry,
        kind: 'neighborSignal',
        message: `'${entry.term}' carries neighbour signal (neighbour lift ${fixed(l)} ≥ ${fixed(NEIGHBOR_SIGNAL_LIFT)}): nearest neighbours share it more than random pairs do, so stopping it may blur which documents belong together.`,
      });
    }
  }
  return findings;
}

function baseName(file: string): string {
  const parts = file.split(/[\\/]/);
  return parts[parts.length - 1] || file;
}
