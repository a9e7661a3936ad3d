import { meantName } from '../../closest-word';
import { open, stat } from 'node:fs/promises';
import { parquetMetadataAsync, parquetReadObjects, parquetSchema, type AsyncBuffer, type FileMetaData } from 'hyparquet';
import type { CorpusFormatName } from '../../protocol';
import { UserError } from '../user-error';
import type { CorpusRow, CorpusSource, ReadOptions, SkippedRow } from './corpus-source';
import { DETECT_ROWS, detectTextField } from './detect-text-field';
import { DEFAULT_BATCH_SIZE } from './open-corpus';
import { MAX_SKIPPED_EXAMPLES } from './row-stream';

/**
 * Opens an Apache Parquet file (read with hyparquet, a dependency-free JavaScript reader that
 * handles the usual encodings and snappy compression). The text and label columns are chosen
 * by name; without a name the text column is the longest string column of the first rows, as
 * for CSV. A document's place is its row: `line` is the 1-based row number in the file.
 * Rows are read one row group at a time, only the two columns, so memory follows the row group.
 */
export async function openParquetCorpus(file: string, options: ReadOptions = {}): Promise<CorpusSource> {
  const buffer = await fileBuffer(file);
  try {
    let metadata: FileMetaData;
    try {
      metadata = await parquetMetadataAsync(buffer);
    } catch (e) {
      throw new UserError(`not a readable Parquet file (${(e as Error).message})`, file, null);
    }
    const fields = parquetSchema(metadata).children.map((c) => c.element.name);
    const labelField = options.labelField ? pickColumn(file, fields, options.labelField, 'label') : null;
    let textField = options.textField ? pickColumn(file, fields, options.textField, 'text') : null;
    const rows = Number(metadata.num_rows);
    if (rows === 0) throw new UserError('no documents: the Parquet file has no rows', file, null);
    if (textField === null) {
      const head = await readRows(buffer, metadata, fields, 0, Math.min(rows, DETECT_ROWS));
      textField = detectTextField(fields, head.map((r) => new Map(Object.entries(r))), labelField);
      if (textField === null) throw new UserError(`found no text column among ${fields.map((f) => `"${f}"`).join(', ')}; name one with the text setting`, file, null);
    }
    return new ParquetCorpus(file, fields, textField, labelField, metadata);
  } finally {
    await buffer.close();
  }
}

class ParquetCorpus implements CorpusSource {
  readonly format: CorpusFormatName = 'parquet';
  skipped: { count: number; examples: SkippedRow[] } = { count: 0, examples: [] };
  readonly truncated = null;
  readonly notes: readonly string[] = [];

  constructor(
    readonly file: string,
    readonly fields: readonly string[],
    readonly textField: string,
    readonly labelField: string | null,
    private readonly metadata: FileMetaData,
  ) {}

  async *batches(batchSize = DEFAULT_BATCH_SIZE): AsyncGenerator<CorpusRow[]> {
      const buffer = await fileBuffer(this.file);
    const skipped = { count: 0, examples: [] as SkippedRow[] };
    this.skipped = skipped;
    const columns = this.labelField === null ? [this.textField] : [this.textField, this.labelField];
    let documents = 0;
    try {
      let groupStart = 0;
      for (const group of this.metadata.row_groups) {
        const groupEnd = groupStart + Number(group.num_rows);
        const rows = await readRows(buffer, this.metadata, columns, groupStart, groupEnd);
        let batch: CorpusRow[] = [];
        for (let i = 0; i < rows.length; i++) {
          const line = groupStart + i + 1;
          const text = cellText(rows[i]![this.textField]);
          if (text === null || text.trim() === '') {
            skipped.count++;
            if (skipped.examples.length < MAX_SKIPPED_EXAMPLES) skipped.examples.push({ line, reason: `no text in column "${this.textField}"` });
            continue;
          }
          const label = this.labelField === null ? null : cellText(rows[i]![this.labelField]);
          batch.push({ text, label: label === '' ? null : label, line });
          documents++;
          if (batch.length >= batchSize) {
            yield batch;
            batch = [];
          }
        }
        if (batch.length > 0) yield batch;
        groupStart = groupEnd;
      }
    } finally {
      await buffer.close();
    }
    if (documents === 0) throw new UserError(`no documents with text in column "${this.textField}"`, this.file, null);
  }
}

function cellText(value: unknown): string | null {
  if (value === null || value === undefined) return null;
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'bigint' || typeof value === 'boolean') return String(value);
  if (value instanceof Uint8Array) return Buffer.from(value).toString('utf8');
  return JSON.stringify(value);
}

async function readRows(
  file: AsyncBuffer,
  metadata: FileMetaData,
  columns: readonly string[],
  rowStart: number,
  rowEnd: number,
): Promise<Record<string, unknown>[]> {
  try {
    return (await parquetReadObjects({ file, metadata, columns: [...columns], rowStart, rowEnd })) as Record<string, unknown>[];
  } catch (e) {
    throw new UserError(`cannot read rows ${rowStart + 1}–${rowEnd} (${(e as Error).message})`, (file as FileBuffer).path, rowStart + 1);
  }
}

function pickColumn(file: string, fields: readonly string[], wanted: string, role: 'text' | 'label'): string {
  if (fields.includes(wanted)) return wanted;
  const alt = meantName(wanted, fields);
  const hint = alt === null ? '' : ` (did you mean "${alt}"?)`;
  throw new UserError(`no ${role} column "${wanted}"${hint}; available: ${fields.map((f) => `"${f}"`).join(', ')}`, file, null);
}

interface FileBuffer extends AsyncBuffer {
  readonly path: string;
  close(): Promise<void>;
}

/** hyparquet reads by byte ranges; this serves them from an open file handle. */
async function fileBuffer(file: string): Promise<FileBuffer> {
  let size: number;
  try {
    const info = await stat(file);
    if (!info.isFile()) throw new UserError('not a file', file, null);
    size = info.size;
  } catch (e) {
    if (e instanceof UserError) throw e;
    throw new UserError(`cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`, file, null);
  }
  if (size === 0) throw new UserError('the file is empty', file, null);
  const handle = await open(file, 'r');
  return {
    path: file,
    byteLength: size,
    async slice(start: number, end?: number): Promise<ArrayBuffer> {
      const stop = Math.min(end ?? size, size);
      const out = new ArrayBuffer(Math.max(0, stop - start));
      const view = new Uint8Array(out);
      let filled = 0;
      while (filled < view.length) {
        const { bytesRead } = await handle.read(view, filled, view.length - filled, start + filled);
        if (bytesRead === 0) break;
        filled += bytesRead;
      }
      return out;
    },
    close: () => handle.close(),
  };
}
