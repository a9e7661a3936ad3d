import { readFile } from 'node:fs/promises';
import * as path from 'node:path';
import { compareUtf8 } from '../random/compare-utf8';
import { UserError } from '../user-error';
import { ChunkDecoder } from './chunk-decoder';
import type { CorpusRow, ReadOptions, SkippedRow } from './corpus-source';
import { walk } from './corpus-files';
import { binaryKind, detectEncoding } from './detect-encoding';
import type { PlacedCorpusSource } from './many-files-corpus';
import { DEFAULT_BATCH_SIZE } from './open-corpus';
import { MAX_SKIPPED_EXAMPLES } from './row-stream';

/** The fields of a folder read one document per file: the file's text, and its first subfolder. */
export const FILE_TEXT_FIELD = 'text';
export const FILE_FOLDER_FIELD = 'folder';

/**
 * A corpus given as a folder of documents, one document per file (format "files"): the layout of
 * most text collections that are not a table (a folder of articles, of chapters, of reviews), with
 * a subfolder per class where there are labels — the layout scikit-learn's `load_files` reads.
 * Every file under the folder is a document, hidden files and folders left out, in code point
 * order of their paths (the same order on every machine); the label field "folder" is a file's
 * first subfolder (none for a file at the top). A file that is binary or empty is skipped with
 * its reason, like a bad row; a file is decoded like a corpus file (a byte-order mark, else UTF-8,
 * else windows-1252, with a note). Its place is (path, line 1).
 */
export async function openFilePerDocument(folder: string, options: ReadOptions = {}): Promise<PlacedCorpusSource> {
  // Like plain text, a folder of files has no columns: a text or label setting that names one
  // (a project's loudword.json written for its tables) is left aside, and a note says so.
  const ignored: string[] = [];
  if (options.textField != null && options.textField !== FILE_TEXT_FIELD) ignored.push(`text "${options.textField}"`);
  if (options.labelField != null && options.labelField !== FILE_FOLDER_FIELD) ignored.push(`label "${options.labelField}"`);
  let keys: string[];
  try {
    keys = (await walk(folder)).sort(compareUtf8);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new UserError(code === 'ENOTDIR' ? 'format "files" reads a folder, one document per file; this is a file' : `cannot list the folder (${code ?? (e as Error).message})`, folder, null);
  }
  if (keys.length === 0) throw new UserError('the folder holds no files (hidden ones are left out)', folder, null);
  const note = ignored.length === 0
    ? null
    : `a folder read one document per file has no columns: the setting${ignored.length === 1 ? '' : 's'} ${ignored.join(' and ')} ${ignored.length === 1 ? 'was' : 'were'} ignored (its label can be "${FILE_FOLDER_FIELD}", each file's first subfolder)`;
  return new FilePerDocumentCorpus(folder, keys, options.labelField === FILE_FOLDER_FIELD ? FILE_FOLDER_FIELD : null, options.maxBytes ?? null, note);
}

class FilePerDocumentCorpus implements PlacedCorpusSource {
  readonly format = 'files' as const;
  readonly textField = FILE_TEXT_FIELD;
  readonly fields = [FILE_TEXT_FIELD, FILE_FOLDER_FIELD];
  skipped: { count: number; examples: SkippedRow[] } = { count: 0, examples: [] };
  truncated: { bytesRead: number; limitBytes: number } | null = null;
  notes: string[] = [];
  readonly places: { keys: string[]; documents: number[] };

  constructor(
    readonly file: string,
    private readonly keys: readonly string[],
    readonly labelField: string | null,
    private readonly maxBytes: number | null,
    private readonly settingsNote: string | null,
  ) {
    this.places = { keys: [...keys], documents: keys.map(() => 0) };
    this.notes = this.firstNotes();
  }

  async *batches(batchSize = DEFAULT_BATCH_SIZE): AsyncGenerator<CorpusRow[]> {
    const skipped = { count: 0, examples: [] as SkippedRow[] };
    this.skipped = skipped;
    this.truncated = null;
    const notes = this.firstNotes();
    this.notes = notes;
    const skip = (key: string, reason: string): void => {
      skipped.count++;
      if (skipped.examples.length < MAX_SKIPPED_EXAMPLES) skipped.examples.push({ line: 1, reason: `${key}: ${reason}` });
    };
    let bytesRead = 0;
    let rows: CorpusRow[] = [];
    for (let f = 0; f < this.keys.length; f++) {
      const key = this.keys[f]!;
      this.places.documents[f] = 0;
      const where = path.join(this.file, key);
      let bytes: Uint8Array;
      try {
        bytes = await readFile(where);
      } catch (e) {
        skip(key, `cannot be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
        continue;
      }
      if (this.maxBytes !== null && bytesRead + bytes.length > this.maxBytes) {
        this.truncated = { bytesRead, limitBytes: this.maxBytes };
        break;
      }
      bytesRead += bytes.length;
      const text = decodeDocument(bytes, where, key, notes);
      if (typeof text !== 'string') {
        skip(key, text.binary);
        continue;
      }
      if (text.trim() === '') {
        skip(key, 'an empty file');
        continue;
      }
      this.places.documents[f] = 1;
      rows.push({ text, label: this.labelField === null ? null : folderOf(key), line: 1 });
      if (rows.length >= batchSize) {
        yield rows;
        rows = [];
      }
    }
    if (rows.length > 0) yield rows;
  }

  private firstNotes(): string[] {
    const count = `${this.keys.length} file${this.keys.length === 1 ? '' : 's'} read as one document each`;
    return this.settingsNote === null ? [count] : [count, this.settingsNote];
  }
}

/** A file's text, decoded as a corpus file is, or why it is binary (what it is, where known). Decoding notes name the file. */
function decodeDocument(bytes: Uint8Array, where: string, key: string, notes: string[]): string | { binary: string } {
  let detected;
  try {
    detected = detectEncoding(bytes, where, true);
  } catch {
    const kind = binaryKind(bytes);
    return { binary: kind === null ? 'a binary file (a NUL byte), not text' : `${kind.what}, not text: ${kind.todo}` };
  }
  const decoder = new ChunkDecoder(detected.encoding, detected.bomLength);
  const text = decoder.decode(bytes.subarray(detected.bomLength), true);
  if (detected.note !== null) notes.push(`${key}: ${detected.note}`);
  for (const note of decoder.notes) notes.push(`${key}: ${note}`);
  return text;
}

/** A file's first subfolder under the corpus folder, or null for a file at the top. */
function folderOf(key: string): string | null {
  const slash = key.indexOf('/');
  return slash < 0 ? null : key.slice(0, slash);
}
