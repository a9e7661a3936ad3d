import * as path from 'node:path';
import type { CorpusFormatName } from '../../protocol';
import { UserError } from '../user-error';
import { meantName } from '../../closest-word';
import type { ReadOptions } from './corpus-source';
import { CsvRecordSplitter } from './csv-record-splitter';
import { delimiterHint, sniffDelimiter, firstNonBlankLine, formatFromExtension, sniffFormat, tabSeparatedFirstLine } from './detect-format';
import { DETECT_ROWS, detectTextField } from './detect-text-field';
import { headerVotes } from './header-votes';
import { JsonArraySplitter } from './json-array-splitter';
import { flattenRecord, isStringList, parseJsonlLine } from './jsonl-value';
import { LineSplitter } from './line-splitter';

/** What the first part of a file says about how to read all of it. */
export interface CorpusLayout {
  format: CorpusFormatName;
  delimiter: string | null;
  /** Header names (CSV/TSV; empty ones named "column N") or keys seen (JSON Lines, a JSON array). */
  fields: string[];
  textField: string | null;
  labelField: string | null;
  /** Column positions for CSV/TSV; -1 where there is none. */
  textIndex: number;
  labelIndex: number;
  /** CSV/TSV: whether '"' quotes fields (always for CSV; for TSV only when the head shows it). */
  quoted: boolean;
  /** CSV/TSV: the first record is a document, not a header (the fields are "column 1", …). */
  headerless?: boolean;
  /** CSV/TSV: records before the header that belong to no column (a "sep=;" line). */
  preamble?: number;
  notes: string[];
  /** Data rows the detection saw; 0 with an incomplete head means a longer head may help. */
  sampled: number;
}

/**
 * Decides format, delimiter and fields from the head of the input (the first ~1 MiB, already
 * decoded and LF-normalised). `headComplete` says the head is the whole input, so its last
 * record is not cut.
 */
export function detectLayout(file: string, head: string, headComplete: boolean, options: ReadOptions): CorpusLayout {
  if (head.trim() === '') throw new UserError('no documents: the file holds only blank lines', file, null);
  let format: CorpusFormatName;
  let delimiter: string | null = null;
  const chosen = options.format !== undefined && options.format !== 'auto';
  if (chosen) format = options.format as CorpusFormatName;
  else {
    const byName = formatFromExtension(file);
    if (byName !== null) format = byName;
    else ({ format, delimiter } = sniffFormat(head, headComplete));
  }
  const notes: string[] = [];
  switch (format) {
    case 'csv':
    case 'tsv': {
      const hint = delimiterHint(head);
      if (hint !== null) {
        const table = tableLayout(file, head, headComplete, format, hint, options, 1);
        return { ...table, notes: [`line 1, "sep=${hint === '\t' ? '\\t' : hint}" (a spreadsheet's delimiter line), set the delimiter and is not a record`, ...table.notes] };
      }
      if (format === 'tsv') delimiter = '\t';
      else delimiter ??= sniffDelimiter(head, headComplete)?.delimiter ?? ',';
      return tableLayout(file, head, headComplete, format, delimiter, options);
    }
    case 'jsonl':
      return jsonlLayout(file, head, headComplete, options);
    case 'json':
      return jsonArrayLayout(file, head, headComplete, options);
    case 'text': {
      const columns = chosen ? null : tabSeparatedFirstLine(head, headComplete);
      if (columns !== null && [options.textField, options.labelField].some((f) => f != null && columns.includes(f))) {
        // The settings name a column of the first line: the user reads this file as a table.
        const table = tableLayout(file, head, headComplete, 'tsv', '\t', options);
        return { ...table, notes: [`the file is tab-separated with a header row (${list(columns)}), and the text or label setting names one of its columns: read as TSV`, ...table.notes] };
      }
      if (options.textField != null || options.labelField != null) {
        notes.push('plain text has one document per line and no fields: the text and label settings were ignored');
      }
      if (columns !== null) notes.push(tabTableNote(columns));
      return { format, delimiter: null, fields: [], textField: null, labelField: null, textIndex: -1, labelIndex: -1, quoted: false, notes, sampled: 1 };
    }
    case 'parquet':
      throw new UserError('this is not a Parquet file (name it .parquet, or choose another format)', file, null);
    case 'files':
      throw new UserError('format "files" reads a folder, one document per file; this is a single file', file, null);
  }
}

/** `preamble`: records before the header that are no part of the table (a "sep=" line). */
function tableLayout(file: string, head: string, headComplete: boolean, format: 'csv' | 'tsv', delimiter: string, options: ReadOptions, preamble = 0): CorpusLayout {
  const quoted = format === 'csv' || tsvUsesQuotes(head, headComplete);
  const splitter = new CsvRecordSplitter(delimiter, file, quoted);
  // The first records as read, and how many there are in the head.
  const records: Array<{ fields: string[]; line: number }> = [];
  let recordCount = 0;
  let before = preamble;
  const take = (fields: string[], line: number): void => {
    if (fields.length === 1 && (fields[0] as string).trim() === '') return;
    if (before > 0) {
      before--;
      return;
    }
    recordCount++;
    if (records.length <= DETECT_ROWS) records.push({ fields, line });
  };
  splitter.push(head, take);
  splitter.end(take, !headComplete);
  const first = records[0];
  if (first === undefined) throw new UserError('no documents: no header row found', file, null);
  const headerless = firstRecordIsData(first.fields, records.slice(1).map((r) => r.fields), options);
  const fields = first.fields.map((name, i) => (headerless || name.trim() === '' ? `column ${i + 1}` : name));
  const headerLine = first.line;
  const dataRecords = headerless ? recordCount : recordCount - 1;
  if (dataRecords === 0 && headComplete) throw new UserError('no documents: the file has a header row and nothing else', file, headerLine);
  const sample: Array<Map<string, unknown>> = [];
  for (const { fields: values } of headerless ? records : records.slice(1)) {
    if (values.length !== fields.length || sample.length >= DETECT_ROWS) continue;
    const row = new Map<string, unknown>();
    for (let i = fields.length - 1; i >= 0; i--) row.set(fields[i] as string, values[i]);
    sample.push(row);
  }

  const labelField = pickField(file, fields, options.labelField ?? null, 'label', headerLine, headerless);
  let textField = pickField(file, fields, options.textField ?? null, 'text', headerLine, headerless);
  textField ??=
    detectTextField(fields, sample, labelField) ??
    (sample.length > 0 ? null : headComplete ? firstField(fields, labelField) : fieldBeingCut(file, head, delimiter, quoted, fields, labelField, headerLine));
  if (textField === null) {
    throw new UserError(`found no column with text; name one with the text setting (columns: ${list(fields)})`, file, headerLine);
  }
  const notes = duplicateColumnNotes(fields, textField, labelField);
  if (headerless) notes.unshift(headerlessNote(headerLine, fields.length));
  if (format === 'tsv' && !quoted && /(^|\t)"/m.test(head)) {
    notes.push('TSV read without quoting (IANA text/tab-separated-values): a field that starts with a quote is text, quote included');
  }
  return {
    format,
    delimiter,
    fields,
    textField,
    labelField,
    textIndex: fields.indexOf(textField),
    labelIndex: labelField === null ? -1 : fields.indexOf(labelField),
    quoted,
    headerless,
    preamble,
    notes,
    sampled: sample.length,
  };
}

/**
 * Whether a table's first record is a document rather than a header: when csv.Sniffer's vote
 * (header-votes.ts) finds evidence of it (a file exported without its header row, the first
 * document then lost as column names, and the text column named by its text), unless the text or
 * label setting names one of the record's values, which makes it the header the user reads.
 */
function firstRecordIsData(first: readonly string[], next: readonly (readonly string[])[], options: ReadOptions): boolean {
  if ([options.textField, options.labelField].some((f) => f != null && first.includes(f))) return false;
  return headerVotes(first, next) < 0;
}

function headerlessNote(line: number, columns: number): string {
  return (
    `line ${line} reads as a document, not a header: in the columns whose values below it all have one type or one length (ids, numbers, dates), its values fit as data do ` +
    `(the test of Python's csv.Sniffer.has_header), so every row was read as a document and the columns are called "column 1" to "column ${columns}". ` +
    `If line ${line} is the header, name one of its columns with the text or label setting`
  );
}

function jsonlLayout(file: string, head: string, headComplete: boolean, options: ReadOptions): CorpusLayout {
  return recordsLayout(file, 'jsonl', options, (take) => {
    const lines = new LineSplitter();
    lines.push(head, take);
    lines.end(take, !headComplete);
  });
}

/**
 * A `.json` file: a JSON array of records, or — when it holds one object a line, as pandas'
 * `to_json(lines=True)` writes under that name — JSON Lines, with a note. One JSON object alone
 * gets a message naming the keys that hold arrays, since the records are usually under one.
 */
function jsonArrayLayout(file: string, head: string, headComplete: boolean, options: ReadOptions): CorpusLayout {
  const firstLine = firstNonBlankLine(head);
  if (firstLine !== null && firstLine.text.trimStart().startsWith('{')) {
    const parsed = parseJsonlLine(firstLine.text);
    // One object on one line that holds an array ({"data": [...]}) or only objects (pandas'
    // columns) wraps the records: it is not JSON Lines.
    const values = parsed.ok ? Object.values(parsed.object) : [];
    const wraps = values.some(Array.isArray) || (values.length > 0 && values.every((v) => typeof v === 'object' && v !== null)) || isTextMapping(values);
    const wrapper = parsed.ok && headComplete && head.trim() === firstLine.text.trim() && wraps;
    if (!parsed.ok || wrapper) throw new UserError(singleObjectMessage(file, head, headComplete), file, firstLine.line);
    const layout = jsonlLayout(file, head, headComplete, options);
    return { ...layout, notes: [...layout.notes, 'the .json file holds one JSON object a line: read as JSON Lines'] };
  }
  const elements: Array<{ text: string; line: number }> = [];
  const splitter = new JsonArraySplitter(file);
  const take = (text: string, line: number): void => {
    if (elements.length < DETECT_ROWS) elements.push({ text, line });
  };
  // Only the head's records are needed; where the head is not the whole file its end is a cut.
  splitter.push(head, take);
  splitter.end(take, !headComplete);
  if (elements.length === 0) {
    throw new UserError(headComplete ? 'no documents: the JSON array is empty' : 'found no complete record in the start of the JSON array', file, null);
  }
  // Rows without field names: say how to write records instead of "not records" 200 times over.
  if (elements[0]!.text.startsWith('[')) {
    throw new UserError(
      'a JSON array of arrays (rows without field names, as pandas\' DataFrame.to_json(orient="values") writes): Loudword reads an array of objects or of strings; write the frame with orient="records"',
      file,
      elements[0]!.line,
    );
  }
  // An array of strings (json.dump of a list of texts): each string is a document.
  if (elements[0]!.text.startsWith('"')) {
    const notes = options.textField != null || options.labelField != null ? ['a JSON array of strings has no fields: the text and label settings were ignored'] : [];
    return { format: 'json', delimiter: null, fields: [], textField: null, labelField: null, textIndex: -1, labelIndex: -1, quoted: false, notes, sampled: elements.length };
  }
  return recordsLayout(file, 'json', options, (each) => {
    for (const { text, line } of elements) each(text, line);
  });
}

/** What a file holding a single JSON object (not records) gets: where its records may be. */
function singleObjectMessage(file: string, head: string, headComplete: boolean): string {
  const base = 'a single JSON object, not records: Loudword reads a JSON array of objects ([{"text": …}, …]) or JSON Lines (one object a line)';
  if (!headComplete) return base + layoutByItsStart(head, path.basename(file));
  let value: unknown;
  try {
    value = JSON.parse(head);
  } catch {
    return base;
  }
  if (typeof value !== 'object' || value === null) return base;
  const entries = Object.entries(value);
  // pandas' own layouts: DataFrame.to_json() with no orient writes columns of {index: value}, orient="split" {columns, index, data}.
  const pandas = '; this looks like pandas\' DataFrame.to_json() without orient="records": write it with orient="records" (or lines=True for JSON Lines)';
  if (isTextMapping(entries.map(([, v]) => v))) {
    const name = path.basename(file);
    return (
      `${base}; it maps ${entries.length} keys to strings, as json.dump of a dict or pandas' Series.to_json() writes texts by their id: ` +
      `write one record a line, jq -c 'to_entries[] | {id: .key, text: .value}' ${name} > ${name.replace(/\.json$/i, '')}.jsonl, or in pandas Series.to_json(orient="records")`
    );
  }
  if (entries.length > 0 && entries.every(([, v]) => typeof v === 'object' && v !== null && !Array.isArray(v))) return base + pandas;
  if (Array.isArray((value as Record<string, unknown>).columns) && Array.isArray((value as Record<string, unknown>).data)) return base + pandas;
  const arrays = entries.filter(([, v]) => Array.isArray(v));
  if (arrays.length === 0) return base;
  const [key] = arrays[0] as [string, unknown[]];
  const named = arrays.map(([k, v]) => `"${k}" (${(v as unknown[]).length} items)`).join(', ');
  const name = path.basename(file);
  const jqKey = /^[A-Za-z_][A-Za-z0-9_]*$/.test(key) ? key : JSON.stringify(key);
  return `${base}; its arrays: ${named} — to read "${key}", write it one record a line: jq -c '.${jqKey}[]' ${name} > ${name.replace(/\.json$/i, '')}.jsonl`;
}

/**
 * What a single JSON object too long to parse from its start shows of its layout there: pandas'
 * orient="table" (a schema, then the records under "data"), a frame's columns or index (objects
 * under keys), or texts under keys (a dict or a Series); "" when the start shows none of them.
 */
function layoutByItsStart(head: string, name: string): string {
  const stem = name.replace(/\.json$/i, '');
  if (/^\s*\{\s*"schema"\s*:\s*\{\s*"fields"/.test(head)) {
    return `; this looks like pandas' DataFrame.to_json(orient="table"), whose records are under "data": write them one a line, jq -c '.data[]' ${name} > ${stem}.jsonl, or write the frame with orient="records"`;
  }
  if (/^\s*\{\s*"(?:[^"\\]|\\.)*"\s*:\s*\{/.test(head)) return '; this looks like pandas\' DataFrame.to_json() without orient="records": write it with orient="records" (or lines=True for JSON Lines)';
  if (/^\s*\{\s*"(?:[^"\\]|\\.)*"\s*:\s*"/.test(head)) {
    return `; it maps keys to strings, as json.dump of a dict or pandas' Series.to_json() writes texts by their id: write one record a line, jq -c 'to_entries[] | {id: .key, text: .value}' ${name} > ${stem}.jsonl, or in pandas Series.to_json(orient="records")`;
  }
  return '';
}

/**
 * Values of one JSON object that read as texts by their keys (ids): strings, at least
 * MAPPING_KEYS of them. One record of that many string fields is not what anyone reviews, and
 * read as one it made "a corpus of one document" of a file of texts.
 */
function isTextMapping(values: readonly unknown[]): boolean {
  return values.length >= MAPPING_KEYS && values.every((v) => typeof v === 'string');
}

/** Fewest keys of a one-object file read as a mapping of ids to texts (our own bound: records have a handful of fields). */
const MAPPING_KEYS = 20;

/**
 * Fields and text field of JSON records (JSON Lines lines or a JSON array's elements), from the
 * first DETECT_ROWS records that `feed` passes to its callback.
 */
function recordsLayout(
  file: string,
  format: 'jsonl' | 'json',
  options: ReadOptions,
  feed: (take: (text: string, line: number) => void) => void,
): CorpusLayout {
  const keys = new Set<string>();
  const sample: Array<Map<string, unknown>> = [];
  let nonBlank = 0;
  let broken = 0;
  let firstBad: { line: number; reason: string } | null = null;
  feed((text: string, line: number): void => {
    if (nonBlank >= DETECT_ROWS || text.trim() === '') return;
    nonBlank++;
    const parsed = parseJsonlLine(text);
    if (!parsed.ok) {
      if (parsed.brokenJson) broken++;
      firstBad ??= { line, reason: parsed.reason };
      return;
    }
    // Nested objects' keys too, dotted ("meta.topic"): the settings and the detection may name them.
    const row = flattenRecord(parsed.object);
    for (const k of row.keys()) keys.add(k);
    sample.push(row);
  });
  const bad = firstBad as { line: number; reason: string } | null;
  // A JSON Lines file counts the lines that are not JSON at all; an array, its elements that are not objects.
  const failed = format === 'jsonl' ? broken : nonBlank - sample.length;
  if (bad !== null && (failed * 2 > nonBlank || sample.length === 0)) {
    // Source: jsonlines.org — every line must be a valid JSON value; most lines failing means this is not JSON Lines.
    const what = format === 'jsonl' ? 'lines are not JSON Lines documents; first bad line' : 'elements of the JSON array are not records (objects or strings); the first bad one is on line';
    throw new UserError(`${failed} of the first ${nonBlank} ${what} ${bad.line}: ${bad.reason}`, file, bad.line);
  }
  const fields = [...keys];
  const labelField = pickField(file, fields, options.labelField ?? null, 'label', null);
  let textField = pickField(file, fields, options.textField ?? null, 'text', null);
  textField ??= detectTextField(fields, sample, labelField);
  if (textField === null) {
    throw new UserError(`found no key with text; name one with the text setting (keys: ${list(fields)})`, file, null);
  }
  const text = textField;
  const notes = sample.some((row) => isStringList(row.get(text)))
    ? [`"${text}" holds lists of strings (sentences, paragraphs or tokens): each document is its strings joined by line breaks`]
    : [];
  return { format, delimiter: null, fields, textField, labelField, textIndex: -1, labelIndex: -1, quoted: false, notes, sampled: sample.length };
}

/**
 * A head that holds no complete data record (the first record is longer than MAX_HEAD_BYTES)
 * still shows which field is long: the one the head ends inside. Taking the first column instead
 * picked "id" for a 70 MB first record. If the cut field is the label or the first record is
 * not even begun, the user must name the text field.
 */
function fieldBeingCut(file: string, head: string, delimiter: string, quoted: boolean, fields: readonly string[], label: string | null, headerLine: number): string | null {
  const name = fields[fieldIndexAtEnd(head, delimiter, quoted)];
  if (name === undefined || name === label) {
    throw new UserError(
      `found no column with text in a sample: the first record is too long to sample (over ${Math.max(1, Math.round(head.length / 1024 / 1024))} Mi characters); name the text column with the text setting (columns: ${list(fields)})`,
      file,
      headerLine,
    );
  }
  return name;
}

/**
 * The 0-based field the text ends inside, counting from the start of the last record (RFC 4180:
 * delimiters and line breaks inside quotes do not count). -1 when the text ends in the header.
 */
function fieldIndexAtEnd(text: string, delimiter: string, quoted: boolean): number {
  let inQuotes = false;
  let records = 0;
  let field = 0;
  let fieldStart = true;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (inQuotes) {
      if (c === '"') {
        if (text[i + 1] === '"') i++;
        else inQuotes = false;
      }
      continue;
    }
    if (quoted && c === '"' && fieldStart) inQuotes = true;
    else if (c === delimiter) {
      field++;
      fieldStart = true;
      continue;
    } else if (c === '\n') {
      records++;
      field = 0;
      fieldStart = true;
      continue;
    }
    fieldStart = false;
  }
  return records === 0 ? -1 : field;
}

/** No row had the header's width (mixed delimiters): the read then names the bad rows. */
function firstField(fields: readonly string[], exclude: string | null): string | null {
  return fields.find((f) => f !== exclude) ?? null;
}

/** Two columns of one name: only the first is read, so say so, naming them (1-based). */
function duplicateColumnNotes(fields: readonly string[], textField: string, labelField: string | null): string[] {
  const positions = new Map<string, number[]>();
  fields.forEach((f, i) => positions.set(f, [...(positions.get(f) ?? []), i + 1]));
  const notes: string[] = [];
  for (const [name, at] of positions) {
    if (at.length < 2) continue;
    const role = name === textField ? ' (the text field)' : name === labelField ? ' (the label field)' : '';
    notes.push(`columns ${at.join(' and ')} are both named "${name}"${role}; only column ${at[0]} is read — rename one to read the other`);
  }
  return notes;
}

/**
 * Whether a TSV file quotes its fields. IANA's text/tab-separated-values has no quoting, but
 * spreadsheet exports quote fields holding tabs or line breaks. Quoting is assumed only when
 * the head has fields that are whole quoted fields ("…", inner quotes doubled, closed before a
 * tab or a line's end) and no field that starts with a quote and then breaks the rule ("Best"
 * pizza): an inch mark is text. A quoted field may hold line breaks (a spreadsheet's cell of
 * several lines, often the only quoted fields of a file of messages); when one does, quoting must
 * be what makes the head a table: read with it, nearly every record has the header's field count
 * (sniffDelimiter's test), read line by line, not, so that a lone quote in a plain TSV file does
 * not swallow the lines up to the next quote.
 */
export function tsvUsesQuotes(head: string, headComplete = true): boolean {
  let whole = 0;
  let broken = 0;
  let multiLine = false;
  let i = 0;
  const n = head.length;
  while (i < n) {
    // i is at the start of a field.
    if (head.charCodeAt(i) === 0x22) {
      const end = closingQuote(head, i);
      if (end >= 0) {
        whole++;
        if (!multiLine && head.lastIndexOf('\n', end) > i) multiLine = true;
        i = end + 1;
      } else if (end === BROKEN) broken++;
      else break; // still open where the head ends: no evidence either way
    }
    // To the field's end, then past the tab or line break.
    while (i < n && head.charCodeAt(i) !== 0x09 && head.charCodeAt(i) !== 0x0a) i++;
    i++;
  }
  if (whole === 0 || broken > 0) return false;
  if (!multiLine) return true;
  const quoted = sniffDelimiter(head, headComplete, ['\t']);
  return quoted !== null && quoted.consistency >= 0.9 && unquotedConsistency(head, headComplete) < 0.9;
}

/** Share of the head's first lines (blank ones, and a last line the head may cut, left out) with as many tab-separated fields as the first. */
function unquotedConsistency(head: string, headComplete: boolean): number {
  const lines = head.split('\n', 61).filter((l) => l.trim() !== '');
  if (!headComplete && lines.length > 1) lines.pop();
  if (lines.length === 0) return 0;
  const fields = lines[0]!.split('\t').length;
  return lines.filter((l) => l.split('\t').length === fields).length / lines.length;
}

/** A quoted field's closing quote was followed by text ("Best" pizza). */
const BROKEN = -1;
/** The head ended inside the quoted field. */
const OPEN = -2;

/** The position of the quote that closes the field opened at `start`, or BROKEN or OPEN. */
function closingQuote(head: string, start: number): number {
  for (let j = start + 1; j < head.length; j++) {
    if (head.charCodeAt(j) !== 0x22) continue;
    if (head.charCodeAt(j + 1) === 0x22) {
      j++; // a doubled quote inside the field
      continue;
    }
    const next = head.charCodeAt(j + 1);
    return j + 1 >= head.length || next === 0x09 || next === 0x0a ? j : BROKEN;
  }
  return OPEN;
}

function pickField(file: string, fields: readonly string[], wanted: string | null, role: 'text' | 'label', line: number | null, headerless = false): string | null {
  if (wanted === null) return null;
  if (fields.includes(wanted)) return wanted;
  // A number where a name is wanted is a column's position, as cut -f counts them (from 1).
  const position = /^[1-9][0-9]*$/.test(wanted) ? fields[Number(wanted) - 1] : undefined;
  const alt = position ?? meantName(wanted, fields);
  const hint = position !== undefined ? ` (columns are named, not numbered: column ${wanted} is "${position}")` : alt === null ? '' : ` (did you mean "${alt}"?)`;
  const why = headerless ? ` (line ${line} reads as a document, not a header, so the columns are numbered)` : '';
  throw new UserError(`no ${role} field "${wanted}"${hint}; available: ${list(fields)}${why}`, file, line, role);
}

/** The note for a plain-text file whose lines are tab-separated columns, read as lines all the same. */
function tabTableNote(columns: readonly string[]): string {
  const shown = columns.map((c) => (c.length > 30 ? `${c.slice(0, 29)}…` : c));
  return (
    `every line holds ${columns.length} tab-separated fields (the first line: ${list(shown)}), and each whole line was read as one document, fields and all. ` +
    'If this is a table (a spreadsheet saved as "Unicode text" is one), read it with --input-format tsv ("format": "tsv"), which takes the first line as the header, ' +
    'or name one of its columns with the text setting'
  );
}

function list(fields: readonly string[]): string {
  return fields.length === 0 ? '(none)' : fields.map((f) => `"${f}"`).join(', ');
}
