import type { CorpusFormatName } from '../../protocol';
import type { CorpusRow, SkippedRow } from './corpus-source';
import type { CorpusLayout } from './corpus-layout';
import { CsvRecordSplitter } from './csv-record-splitter';
import { JsonArraySplitter } from './json-array-splitter';
import { describeJson, documentText, parseJsonlLine, parseJsonValue, scalarText, valueAt } from './jsonl-value';
import { LineSplitter, MAX_LINE_CHARS } from './line-splitter';
import { formatCount } from '../../number-format';
import { UserError } from '../user-error';

/** How many skipped rows are kept with their reason; the rest are only counted. */
export const MAX_SKIPPED_EXAMPLES = 20;

export interface PassState {
  skipped: { count: number; examples: SkippedRow[] };
  documents: number;
  /** Lines (JSON Lines) or elements (a JSON array) that were not valid JSON. */
  brokenJson: number;
  /** Documents whose label is a list (tags), read without a label, and the line of the first. */
  listLabels?: { count: number; firstLine: number };
}

type Emit = (row: CorpusRow) => void;

/** A format-specific consumer of LF-normalised text chunks that emits documents. */
export interface RowSink {
  push(chunk: string): void;
  /** `cut`: the input stopped at a size limit, so an unfinished last record is dropped. */
  end(cut: boolean): void;
}

export function createRowSink(file: string, layout: CorpusLayout, state: PassState, emit: Emit): RowSink {
  const skip = (line: number, reason: string): void => {
    state.skipped.count++;
    if (state.skipped.examples.length < MAX_SKIPPED_EXAMPLES) state.skipped.examples.push({ line, reason });
  };
  const accept = (row: CorpusRow): void => {
    state.documents++;
    emit(row);
  };
  switch (layout.format) {
    case 'csv':
    case 'tsv':
      return tableSink(file, layout, skip, accept);
    case 'jsonl':
      return lineSink((text, line) => jsonlRow(layout, text, line, skip, accept, state), skip);
    case 'json':
      return arraySink(file, layout.textField === null ? (text, line) => stringElement(text, line, skip, accept, state) : (text, line) => jsonlRow(layout, text, line, skip, accept, state), skip);
    case 'text':
      return lineSink((text, line) => {
        if (text.trim() !== '') accept({ text, label: null, line });
      }, skip);
    case 'parquet':
      throw new UserError('a Parquet file is read by the Parquet reader, not as text', file, null);
    case 'files':
      throw new UserError('a folder of one document per file is read by its own reader, not as lines', file, null);
  }
}

function tableSink(file: string, layout: CorpusLayout, skip: (line: number, reason: string) => void, accept: Emit): RowSink {
  const splitter = new CsvRecordSplitter(layout.delimiter ?? ',', file, layout.quoted);
  const width = layout.fields.length;
  const { textIndex, labelIndex } = layout;
  let headerSeen = layout.headerless === true;
  let preamble = layout.preamble ?? 0;
  const widthOf = layout.headerless === true ? 'the first row' : 'the header';
  const take = (fields: string[], line: number, malformedQuote: boolean): void => {
    if (fields.length === 1 && (fields[0] as string).trim() === '') return;
    if (preamble > 0) {
      preamble--;
      return;
    }
    if (!headerSeen) {
      headerSeen = true;
      return;
    }
    if (malformedQuote) return skip(line, 'malformed quotes (RFC 4180 §2: a quoted field ends with a quote followed by a delimiter or line end)');
    if (fields.length !== width) return skip(line, `${fields.length} ${fields.length === 1 ? 'field' : 'fields'} where ${widthOf} has ${width}`);
    const text = fields[textIndex] as string;
    if (text.trim() === '') return skip(line, `empty text in "${layout.textField}"`);
    const label = labelIndex < 0 ? null : (fields[labelIndex] as string);
    accept({ text, label: label === '' ? null : label, line });
  };
  return {
    push: (chunk) => splitter.push(chunk, take),
    end: (cut) => splitter.end(take, cut),
  };
}

function jsonlRow(
  layout: CorpusLayout,
  text: string,
  line: number,
  skip: (line: number, reason: string) => void,
  accept: Emit,
  state: PassState,
): void {
  if (text.trim() === '') return;
  const parsed = parseJsonlLine(text);
  if (!parsed.ok) {
    if (parsed.brokenJson) state.brokenJson++;
    return skip(line, parsed.reason);
  }
  const key = layout.textField as string;
  const value = documentText(valueAt(parsed.object, key));
  if ('reason' in value) return skip(line, `"${key}" ${value.reason}`);
  if (value.text.trim() === '') return skip(line, `empty text in "${key}"`);
  let label: string | null = null;
  if (layout.labelField !== null) {
    const raw = valueAt(parsed.object, layout.labelField);
    if (Array.isArray(raw)) {
      // A list of tags is no class: the document is reviewed without a label, and a note says why.
      state.listLabels ??= { count: 0, firstLine: line };
      state.listLabels.count++;
    } else if (raw !== undefined && raw !== null) {
      const l = scalarText(raw);
      if ('reason' in l) return skip(line, `"${layout.labelField}" ${l.reason}`);
      label = l.text === '' ? null : l.text;
    }
  }
  accept({ text: value.text, label, line });
}

/**
 * The note on documents whose label is a list (tags, several classes): label precision asks
 * whether a neighbour has the document's class, which needs one class a document, so they are
 * reviewed without a label rather than left out of a review of distances.
 */
export function listLabelNote(labelField: string, lists: { count: number; firstLine: number }): string {
  const documents = `${formatCount(lists.count)} document${lists.count === 1 ? '' : 's'}`;
  return `${documents} ${lists.count === 1 ? 'holds' : 'hold'} a list in "${labelField}" (the first on line ${lists.firstLine}), not one label: label precision needs one class per document, so they were reviewed without a label; to measure precision, write each document's class in a field of its own`;
}

/** An element of a JSON array of strings: the string is the document. */
function stringElement(text: string, line: number, skip: (line: number, reason: string) => void, accept: Emit, state: PassState): void {
  const parsed = parseJsonValue(text);
  if (!parsed.ok) {
    state.brokenJson++;
    return skip(line, parsed.reason);
  }
  const { value } = parsed;
  if (typeof value !== 'string') return skip(line, `a JSON ${describeJson(value)} in an array of strings`);
  if (value.trim() === '') return skip(line, 'an empty string');
  accept({ text: value, label: null, line });
}

function arraySink(file: string, onElement: (text: string, line: number) => void, skip: (line: number, reason: string) => void): RowSink {
  const splitter = new JsonArraySplitter(file, MAX_LINE_CHARS, (line, chars) =>
    skip(line, `${(chars / 1024 / 1024).toFixed(0)} Mi characters in one element of the array, more than the ${MAX_LINE_CHARS / 1024 / 1024} Mi a document may have`),
  );
  return {
    push: (chunk) => splitter.push(chunk, onElement),
    end: (cut) => splitter.end(onElement, cut),
  };
}

function lineSink(onLine: (text: string, line: number) => void, skip: (line: number, reason: string) => void): RowSink {
  const splitter = new LineSplitter(MAX_LINE_CHARS, (line, chars) =>
    skip(line, `${(chars / 1024 / 1024).toFixed(0)} Mi characters on one line, more than the ${MAX_LINE_CHARS / 1024 / 1024} Mi a document may have (a minified or binary blob?)`),
  );
  return {
    push: (chunk) => splitter.push(chunk, onLine),
    end: (cut) => splitter.end(onLine, cut),
  };
}

/** After a full pass: a pass with no documents, or mostly broken JSON, is the user's to fix. */
export function checkPass(file: string, state: PassState, format: CorpusFormatName): void {
  const first = state.skipped.examples[0];
  if (state.documents === 0) {
    const why = first === undefined ? '' : `; ${state.skipped.count} skipped, first on line ${first.line}: ${first.reason}`;
    throw new UserError(`no documents${why}`, file, first?.line ?? null);
  }
  if (state.brokenJson > state.documents && first !== undefined) {
    // Source: jsonlines.org — each line is one valid JSON value (RFC 8259 for an array's elements).
    throw new UserError(
      `${formatCount(state.brokenJson)} ${format === 'json' ? 'elements of the array' : 'lines'} are not valid JSON against ${formatCount(state.documents)} documents; first bad line ${first.line}: ${first.reason}`,
      file,
      first.line,
    );
  }
}
