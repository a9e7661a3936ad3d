// The columns (CSV/TSV) or keys (JSON Lines, a JSON array) of a corpus with a preview of their first values,
// for the picker offered when the text or label field is missing. Reads only the start of the
// text it is given. Pure: no editor types.
import Papa from 'papaparse';
import { JsonArraySplitter } from '../../engine/read/json-array-splitter';
import { flattenRecord } from '../../engine/read/jsonl-value';

export interface ColumnPreview {
  name: string;
  /** The first non-empty values, shortened. */
  samples: string[];
}

const PREVIEW_ROWS = 3;
const SAMPLE_CHARS = 60;

function shorten(value: unknown): string {
  const text = (typeof value === 'string' ? value : JSON.stringify(value) ?? '').replace(/\s+/g, ' ').trim();
  return text.length > SAMPLE_CHARS ? `${text.slice(0, SAMPLE_CHARS - 1)}…` : text;
}

/** `head`: the first few kilobytes of the corpus; `format` as the Report names it. */
export function columnPreviews(head: string, format: 'csv' | 'tsv' | 'jsonl' | 'json'): ColumnPreview[] {
  const text = head.replace(/^\uFEFF/, '');
  if (format === 'jsonl') return keyPreviews(text.split(/\r?\n/).slice(0, 20));
  if (format === 'json') return keyPreviews(firstElements(text, 20));
  const parsed = Papa.parse<string[]>(text, { delimiter: format === 'tsv' ? '\t' : ',', preview: 1 + 20, skipEmptyLines: true });
  const [header, ...rows] = parsed.data;
  if (header === undefined) return [];
  return header.map((name, c) => ({
    name,
    samples: rows
      .map((r) => r[c] ?? '')
      .filter((v) => v.trim() !== '')
      .slice(0, PREVIEW_ROWS)
      .map(shorten),
  }));
}

/** The keys of the first JSON records given, each with its first values. */
function keyPreviews(records: readonly string[]): ColumnPreview[] {
  const byKey = new Map<string, string[]>();
  for (const record of records) {
    let row: unknown;
    try {
      row = JSON.parse(record);
    } catch {
      continue;
    }
    if (typeof row !== 'object' || row === null || Array.isArray(row)) continue;
    // Nested objects' keys too, dotted, as the reader names them ("meta.topic").
    for (const [key, value] of flattenRecord(row as Record<string, unknown>)) {
      const list = byKey.get(key) ?? [];
      if (list.length < PREVIEW_ROWS && value !== null && value !== '') list.push(shorten(value));
      byKey.set(key, list);
    }
  }
  return [...byKey].map(([name, samples]) => ({ name, samples }));
}

/** The source text of a JSON array's first elements in `head` (the start of the file). */
function firstElements(head: string, count: number): string[] {
  const found: string[] = [];
  const splitter = new JsonArraySplitter('');
  try {
    splitter.push(head.replace(/\r\n?/g, '\n'), (text) => {
      if (found.length < count) found.push(text);
    });
  } catch {
    // Not an array after all: whatever was read before the break still previews.
  }
  return found;
}

/**
 * Which field a review error says is missing: 'text', 'label', or null for other errors. Also
 * reads the error once it names where the setting came from (engine/config/blame-setting.ts):
 * `label "topic": no such field in …` (loudword.json), `--text "body" (command-line flag): …`,
 * `loudword.labelField "topic" (editor setting): …`.
 */
export function missingFieldRole(message: string): 'text' | 'label' | null {
  const m = /^no (text|label) (?:field|column) "/.exec(message);
  if (m) return m[1] as 'text' | 'label';
  const blamed = /^(?:--|loudword\.)?(text|label)\w* "(?:[^"\\]|\\.)*"(?: \([^)]*\))?: no such field in /.exec(message);
  if (blamed) return blamed[1] as 'text' | 'label';
  if (/^found no (?:column|key|text column)/.test(message)) return 'text';
  // A text field that gave no terms at all (a column of URLs): another column may hold the text
  // (engine/matrix/prune-terms.ts noTermsLeftMessage).
  if (/^no terms are left after tokenising and pruning of the text field "/.test(message) && message.includes('another field may hold the text')) return 'text';
  return null;
}
