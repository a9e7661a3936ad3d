import { readFile } from 'node:fs/promises';
import * as path from 'node:path';
import { promisify } from 'node:util';
import { gunzip } from 'node:zlib';
import { groupedInteger } from '../../number-format';
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
 * else windows-1252, with a note). A gzip-compressed file (by its signature, whatever its name:
 * the changelog.gz and README.gz of a documentation tree) is inflated first, as a corpus file
 * named .gz is. Its place is (path, line 1).
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
    let documents = 0;
    let inflatedFiles = 0;
    const fileNotes = new FileNotes(notes);
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
      let wasInflated = false;
      if (isGzip(bytes)) {
        const inflated = await inflateDocument(bytes);
        if ('unreadable' in inflated) {
          skip(key, inflated.unreadable);
          continue;
        }
        bytes = inflated.bytes;
        wasInflated = true;
        if (this.maxBytes !== null && bytesRead + bytes.length > this.maxBytes) {
          this.truncated = { bytesRead, limitBytes: this.maxBytes };
          break;
        }
      }
      bytesRead += bytes.length;
      const text = decodeDocument(bytes, where, key, fileNotes);
      if (typeof text !== 'string') {
        skip(key, wasInflated ? `inflated from gzip: ${text.binary}` : text.binary);
        continue;
      }
      if (text.trim() === '') {
        skip(key, 'an empty file');
        continue;
      }
      this.places.documents[f] = 1;
      documents++;
      if (wasInflated) inflatedFiles++;
      rows.push({ text, label: this.labelField === null ? null : folderOf(key), line: 1 });
      if (rows.length >= batchSize) {
        yield rows;
        rows = [];
      }
    }
    if (rows.length > 0) yield rows;
    // Before the pass the count is of the files found; now it is of those read.
    notes[0] = readCountNote(documents, skipped.count, inflatedFiles);
    fileNotes.finish();
  }

  private firstNotes(): string[] {
    const count = `${groupedInteger(this.keys.length)} file${this.keys.length === 1 ? '' : 's'} to read as one document each`;
    return this.settingsNote === null ? [count] : [count, this.settingsNote];
  }
}

/** Decoding notes shown one by one, per file; past that, one note counts the rest. */
const MAX_FILE_NOTES = 5;

/**
 * The decoding notes of a folder's files (read as windows-1252, a byte read as U+FFFD), each
 * naming its file: the first few in full, the rest counted in one note with a few of their
 * names, so that a folder of thousands of Latin-1 files does not bury the review under notes.
 */
class FileNotes {
  private shown = 0;
  private readonly more: string[] = [];

  constructor(private readonly notes: string[]) {}

  add(key: string, note: string): void {
    if (this.shown < MAX_FILE_NOTES) {
      this.notes.push(`${key}: ${note}`);
      this.shown++;
    } else if (this.more[this.more.length - 1] !== key) this.more.push(key);
  }

  finish(): void {
    if (this.more.length === 0) return;
    const named = this.more.slice(0, MAX_FILE_NOTES).join(', ');
    const files = `${groupedInteger(this.more.length)} more file${this.more.length === 1 ? '' : 's'}`;
    this.notes.push(`${files} had a note like those above (not valid UTF-8: read as windows-1252, or bytes read as U+FFFD): ${named}${this.more.length > MAX_FILE_NOTES ? ', …' : ''}`);
  }
}

/** A file's text, decoded as a corpus file is, or why it is binary (what it is, where known). Decoding notes name the file. */
function decodeDocument(bytes: Uint8Array, where: string, key: string, notes: FileNotes): string | { binary: string } {
  let detected;
  try {
    detected = detectEncoding(bytes, where, true);
  } catch {
    const kind = binaryKind(bytes);
    return { binary: kind === null ? 'a binary file (a NUL byte), not text' : `${kind.what}, not text: ${kind.todo}` };
  }
  const decoder = new ChunkDecoder(detected.encoding, detected.bomLength);
  const text = decoder.decode(bytes.subarray(detected.bomLength), true);
  if (detected.note !== null) notes.add(key, detected.note);
  for (const note of decoder.notes) notes.add(key, note);
  return text;
}

/** The note that says how the folder was read, once it has been. */
function readCountNote(documents: number, skipped: number, inflated: number): string {
  const files = (n: number): string => `${groupedInteger(n)} file${n === 1 ? '' : 's'}`;
  const read = `${files(documents)} read as one document each${inflated > 0 ? ` (${groupedInteger(inflated)} of them inflated from gzip)` : ''}`;
  return skipped > 0 ? `${read}; ${files(skipped)} skipped (the reasons below)` : read;
}

/** RFC 1952's two magic bytes. */
function isGzip(bytes: Uint8Array): boolean {
  return bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b;
}

/**
 * A document larger than this once inflated is skipped: a JavaScript string holds at most ~512M
 * UTF-16 units, and a "document" that large is more likely an archive or a compression bomb.
 */
const MAX_INFLATED_DOCUMENT = 256 * 1024 * 1024;

const gunzipAsync = promisify(gunzip);

/** A gzip file's inflated bytes (RFC 1952, through node:zlib), or why it cannot be read. */
async function inflateDocument(bytes: Uint8Array): Promise<{ bytes: Uint8Array } | { unreadable: string }> {
  try {
    return { bytes: await gunzipAsync(bytes, { maxOutputLength: MAX_INFLATED_DOCUMENT }) };
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ERR_BUFFER_TOO_LARGE') return { unreadable: `gzip-compressed, and more than ${MAX_INFLATED_DOCUMENT / 1024 / 1024} MB once inflated: too large for one document` };
    return { unreadable: `gzip-compressed, but it cannot be inflated (${(e as Error).message})` };
  }
}

/** A file's first subfolder under the corpus folder, or null for a file at the top. */
function folderOf(key: string): string | null {
  const slash = key.indexOf('/');
  return slash < 0 ? null : key.slice(0, slash);
}
