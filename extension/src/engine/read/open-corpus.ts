import { open, stat } from 'node:fs/promises';
import type { CorpusFormatName } from '../../protocol';
import { UserError } from '../user-error';
import type { CorpusRow, CorpusSource, ReadOptions, SkippedRow } from './corpus-source';
import { detectLayout, type CorpusLayout } from './corpus-layout';
import { ChunkDecoder } from './chunk-decoder';
import { BINARY_PROBE_BYTES, detectEncoding } from './detect-encoding';
import { NewlineNormalizer } from './newline-normalizer';
import { checkPass, createRowSink, listLabelNote, type PassState } from './row-stream';
import { CHUNK_BYTES, fileTextChunks, memoryTextChunks } from './text-chunks';
import { completeUtf8Length } from './utf8-boundary';
import { fileKind, readErrorMessage } from './regular-file';

/** Bytes read at open time to detect encoding, format and fields (about DETECT_ROWS rows of most corpora). */
export const HEAD_BYTES = 1024 * 1024;
/** The head grows up to this when its first records are longer than HEAD_BYTES. */
export const MAX_HEAD_BYTES = 64 * 1024 * 1024;
export const DEFAULT_BATCH_SIZE = 1000;

/**
 * Opens a corpus file: reads its head to decide encoding, format and fields, and returns a
 * source that streams documents in batches. Throws UserError for what the user can fix
 * (missing, empty or binary file, unknown field, no documents).
 */
export async function openCorpus(file: string, options: ReadOptions = {}): Promise<CorpusSource> {
  const limitBytes = checkMaxBytes(options.maxBytes);
  let size: number;
  try {
    const info = await stat(file);
    if (!info.isFile()) throw new UserError(`the corpus is ${fileKind(info)}; Loudword reads regular files only${info.isFIFO() ? ' (save the stream to a file first; a .gz file is read as it is)' : ''}`, file, null);
    size = info.size;
  } catch (e) {
    if (e instanceof UserError) throw e;
    throw new UserError(readErrorMessage('the corpus', e), file, null);
  }
  if (size === 0) throw new UserError('the file is empty', file, null);
  const end = limitBytes === null ? size : Math.min(size, limitBytes);
  let headLength = Math.min(end, Math.max(HEAD_BYTES, BINARY_PROBE_BYTES));
  for (;;) {
    const headBytes = await readHead(file, headLength);
    const headIsAll = headBytes.length >= end;
    const encoding = detectEncoding(headBytes, file, headIsAll && end === size);
    if (size <= encoding.bomLength) throw new UserError('the file is empty (only a byte-order mark)', file, null);
    const decoder = new ChunkDecoder(encoding.encoding, encoding.bomLength);
    const head = new NewlineNormalizer().push(decoder.decode(headBytes.subarray(encoding.bomLength), headIsAll, headIsAll && end < size), headIsAll);
    const mayGrow = !headIsAll && headLength < MAX_HEAD_BYTES;
    const layout = tryLayout(file, head, headIsAll, mayGrow, options);
    // A head that ends inside the first records (very long documents) says too little: read more.
    if (layout === null || (layout.sampled === 0 && mayGrow)) {
      headLength = Math.min(end, headLength * 8, MAX_HEAD_BYTES);
      continue;
    }
    const baseNotes = encoding.note === null ? [] : [encoding.note];
    const cut = end < size ? { bytesRead: end, limitBytes: limitBytes as number } : null;
    const chunkBytes = checkChunkBytes(options.chunkBytes);
    return new StreamedCorpus(file, layout, baseNotes, cut, (notes) => fileTextChunks(file, encoding, end, notes, chunkBytes, end < size));
  }
}

/** Layout of a head, or null when a head cut short could not show a complete record yet. */
function tryLayout(file: string, head: string, headIsAll: boolean, mayGrow: boolean, options: ReadOptions): CorpusLayout | null {
  try {
    return detectLayout(file, head, headIsAll, options);
  } catch (e) {
    if (mayGrow && e instanceof UserError && /^no documents|^found no/.test(e.message)) return null;
    throw e;
  }
}

/**
 * Opens a corpus from text already in memory (an unsaved editor buffer, a test). `file` names
 * it in messages and picks the format by extension.
 */
export function openCorpusFromText(file: string, text: string, options: ReadOptions = {}): CorpusSource {
  const limitBytes = checkMaxBytes(options.maxBytes);
  if (text.length === 0 || (text.length === 1 && text.charCodeAt(0) === 0xfeff)) throw new UserError('the file is empty', file, null);
  const nul = text.slice(0, BINARY_PROBE_BYTES).indexOf('\0');
  if (nul >= 0) throw new UserError(`looks like a binary file (a NUL character at offset ${nul})`, file, null);
  let body = text;
  let cut: { bytesRead: number; limitBytes: number } | null = null;
  if (limitBytes !== null && text.length > limitBytes / 3) {
    const bytes = Buffer.from(text, 'utf8');
    if (bytes.length > limitBytes) {
      const kept = bytes.subarray(0, completeUtf8Length(bytes.subarray(0, limitBytes)));
      body = kept.toString('utf8');
      cut = { bytesRead: limitBytes, limitBytes };
    }
  }
  const headChars = HEAD_BYTES;
  const headIsAll = body.length <= headChars;
  const headSource = body.charCodeAt(0) === 0xfeff ? body.slice(1, headChars + 1) : body.slice(0, headChars);
  const head = new NewlineNormalizer().push(headSource, headIsAll);
  const layout = detectLayout(file, head, headIsAll, options);
  const chunkChars = checkChunkBytes(options.chunkBytes);
  return new StreamedCorpus(file, layout, [], cut, () => memoryTextChunks(body, chunkChars));
}

type ChunkSource = (notes: string[]) => AsyncIterable<string> | Iterable<string>;

class StreamedCorpus implements CorpusSource {
  readonly format: CorpusFormatName;
  readonly textField: string | null;
  readonly labelField: string | null;
  readonly fields: readonly string[];
  readonly delimiter?: string;
  skipped: { count: number; examples: SkippedRow[] } = { count: 0, examples: [] };
  truncated: { bytesRead: number; limitBytes: number } | null = null;
  notes: string[];

  constructor(
    readonly file: string,
    private readonly layout: CorpusLayout,
    private readonly baseNotes: readonly string[],
    private readonly cut: { bytesRead: number; limitBytes: number } | null,
    private readonly chunks: ChunkSource,
  ) {
    this.format = layout.format;
    this.textField = layout.textField;
    this.labelField = layout.labelField;
    this.fields = layout.fields;
    if (layout.delimiter !== null) this.delimiter = layout.delimiter;
    this.notes = [...baseNotes, ...layout.notes];
  }

  async *batches(batchSize = DEFAULT_BATCH_SIZE): AsyncGenerator<CorpusRow[]> {
    if (!Number.isInteger(batchSize) || batchSize < 1) throw new RangeError(`batchSize must be a positive integer, got ${batchSize}`);
    const state: PassState = { skipped: { count: 0, examples: [] }, documents: 0, brokenJson: 0 };
    this.skipped = state.skipped;
    this.truncated = null;
    const notes = [...this.baseNotes, ...this.layout.notes];
    this.notes = notes;
    let pending: CorpusRow[] = [];
    const sink = createRowSink(this.file, this.layout, state, (row) => pending.push(row));
    for await (const chunk of this.chunks(notes)) {
      sink.push(chunk);
      if (pending.length >= batchSize) {
        const full = pending;
        const whole = full.length - (full.length % batchSize);
        pending = full.slice(whole);
        for (let i = 0; i < whole; i += batchSize) yield full.slice(i, i + batchSize);
      }
    }
    sink.end(this.cut !== null);
    if (state.listLabels !== undefined && this.labelField !== null) notes.push(listLabelNote(this.labelField, state.listLabels));
    this.truncated = this.cut;
    checkPass(this.file, state, this.layout.format);
    for (let i = 0; i < pending.length; i += batchSize) yield pending.slice(i, i + batchSize);
  }
}

async function readHead(file: string, length: number): Promise<Uint8Array> {
  let handle;
  try {
    handle = await open(file, 'r');
  } catch (e) {
    throw new UserError(readErrorMessage('the corpus', e), file, null);
  }
  try {
    const buffer = Buffer.alloc(length);
    let filled = 0;
    while (filled < length) {
      const { bytesRead } = await handle.read(buffer, filled, length - filled, filled);
      if (bytesRead === 0) break;
      filled += bytesRead;
    }
    return buffer.subarray(0, filled);
  } finally {
    await handle.close();
  }
}

function checkMaxBytes(maxBytes: number | undefined): number | null {
  if (maxBytes === undefined) return null;
  if (!Number.isInteger(maxBytes) || maxBytes < 1) throw new RangeError(`maxBytes must be a positive integer, got ${maxBytes}`);
  return maxBytes;
}

function checkChunkBytes(chunkBytes: number | undefined): number {
  if (chunkBytes === undefined) return CHUNK_BYTES;
  if (!Number.isInteger(chunkBytes) || chunkBytes < 1) throw new RangeError(`chunkBytes must be a positive integer, got ${chunkBytes}`);
  return chunkBytes;
}

/**
 * Opens a corpus whose decoded, LF-normalised text arrives from `chunks` (a compressed file):
 * `head` is its start, already decoded, for the layout. Each call of `chunks` starts a new pass.
 */
export function openCorpusFromChunks(
  file: string,
  head: string,
  headIsAll: boolean,
  notes: readonly string[],
  chunks: (notes: string[]) => AsyncIterable<string>,
  options: ReadOptions = {},
): CorpusSource {
  const layout = detectLayout(file, head, headIsAll, options);
  return new StreamedCorpus(file, layout, notes, null, chunks);
}
