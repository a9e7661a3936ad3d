import * as path from 'node:path';
import type { CorpusFormatName } from '../../protocol';
import { UserError } from '../user-error';
import { listCorpusFiles, type CorpusFile } from './corpus-files';
import type { CorpusRow, CorpusSource, ReadOptions, SkippedRow } from './corpus-source';
import { openCorpusFile } from './open-corpus-file';
import { openFilePerDocument } from './file-per-document-corpus';
import { DEFAULT_BATCH_SIZE } from './open-corpus';
import { MAX_SKIPPED_EXAMPLES } from './row-stream';

/**
 * Where each document of a pass came from: file keys in reading order and how many documents
 * each gave. Document d's place is (keys[f], line[d]) for the f whose range holds d.
 */
export interface DocumentPlaces {
  readonly keys: readonly string[];
  /** Documents per file, filled by the last pass. */
  readonly documents: readonly number[];
}

/** A corpus source that also says which file each document came from. */
export interface PlacedCorpusSource extends CorpusSource {
  readonly places: DocumentPlaces;
}

/**
 * Opens a corpus given as one file, a glob or a folder. Many files read as one corpus, in code
 * point order of their keys: the first file sets the format and fields (later files must have
 * the same text and label fields), rows keep their own file's line, and the skipped rows and
 * notes name their file.
 */
export async function openCorpusInput(input: string, options: ReadOptions = {}): Promise<PlacedCorpusSource> {
  if (options.format === 'files') return openFilePerDocument(input, options);
  const files = await listCorpusFiles(input);
  if (files.length === 1 && files[0]!.path === input) {
    const source = await openCorpusFile(input, options);
    return withPlaces(source, files[0]!.key);
  }
  const first = await openCorpusFile(files[0]!.path, options);
  return new ManyFilesCorpus(input, files, first, options);
}

/** Gives a one-file source its places (its key and, after a pass, its document count). */
export function withPlaces(source: CorpusSource, key: string): PlacedCorpusSource {
  const documents = [0];
  const places: DocumentPlaces = { keys: [key], documents };
  const counted: PlacedCorpusSource = Object.create(source, {
    places: { value: places, enumerable: true },
    batches: {
      value: async function* (batchSize?: number): AsyncGenerator<CorpusRow[]> {
        documents[0] = 0;
        for await (const rows of source.batches(batchSize)) {
          documents[0] += rows.length;
          yield rows;
        }
      },
    },
  });
  return counted;
}

/** A corpus of many files that can be read file by file. */
export interface FileByFileSource extends PlacedCorpusSource {
  eachFile(): AsyncIterable<{ key: string; source: PlacedCorpusSource }>;
}

export function isFileByFile(source: CorpusSource): source is FileByFileSource {
  return typeof (source as Partial<FileByFileSource>).eachFile === 'function';
}

class ManyFilesCorpus implements FileByFileSource {
  readonly format: CorpusFormatName;
  readonly textField: string | null;
  readonly labelField: string | null;
  readonly fields: readonly string[];
  readonly delimiter?: string;
  skipped: { count: number; examples: SkippedRow[] } = { count: 0, examples: [] };
  truncated: { bytesRead: number; limitBytes: number } | null = null;
  notes: string[] = [];
  readonly places: { keys: string[]; documents: number[] };

  constructor(
    readonly file: string,
    private readonly files: readonly CorpusFile[],
    private readonly first: CorpusSource,
    private readonly options: ReadOptions,
  ) {
    this.format = first.format;
    this.textField = first.textField;
    this.labelField = first.labelField;
    this.fields = first.fields;
    if (first.delimiter !== undefined) this.delimiter = first.delimiter;
    this.places = { keys: files.map((f) => f.key), documents: files.map(() => 0) };
    this.notes = [`${files.length} files read as one corpus`];
  }

  async *batches(batchSize = DEFAULT_BATCH_SIZE): AsyncGenerator<CorpusRow[]> {
    for await (const { source } of this.eachFile()) yield* source.batches(batchSize);
  }

  /**
   * The files one by one, each as its own source, for a reader that must treat each file
   * alike (a fresh tokeniser per file: matrix/count-each-file.ts). Read each one to its end
   * before asking for the next; the corpus's places, skipped rows and notes fill in as it goes.
   */
  async *eachFile(): AsyncGenerator<{ key: string; source: PlacedCorpusSource }> {
    const skipped = { count: 0, examples: [] as SkippedRow[] };
    this.skipped = skipped;
    this.truncated = null;
    const notes = [`${this.files.length} files read as one corpus`];
    this.notes = notes;
    const formats = new Set<CorpusFormatName>();
    for (let f = 0; f < this.files.length; f++) {
      const file = this.files[f]!;
      const opened = f === 0 ? this.first : await openCorpusFile(file.path, this.fileOptions());
      this.checkSameFields(file, opened);
      formats.add(opened.format);
      const source = withPlaces(opened, file.key);
      yield { key: file.key, source };
      this.places.documents[f] = source.places.documents[0]!;
      skipped.count += source.skipped.count;
      for (const example of source.skipped.examples) {
        if (skipped.examples.length >= MAX_SKIPPED_EXAMPLES) break;
        skipped.examples.push({ line: example.line, reason: `${file.key}: ${example.reason}` });
      }
      for (const note of source.notes ?? []) notes.push(`${file.key}: ${note}`);
      if (source.truncated !== null) this.truncated = source.truncated;
    }
    if (formats.size > 1) notes.push(`the files hold different formats (${[...formats].join(', ')}); each was read as its own`);
    if (formats.size === 1 && formats.has('text')) {
      notes.push('each line of these plain-text files is a document; for one document per file, use --input-format files (format "files")');
    }
  }

  /** Later files are read with the fields the first one settled on, so every row means the same. */
  private fileOptions(): ReadOptions {
    return { ...this.options, textField: this.textField, labelField: this.labelField };
  }

  private checkSameFields(file: CorpusFile, source: CorpusSource): void {
    if (source.textField !== this.textField || source.labelField !== this.labelField) {
      throw new UserError(
        `its text/label fields (${source.textField ?? 'none'}/${source.labelField ?? 'none'}) differ from the first file's ` +
          `(${this.textField ?? 'none'}/${this.labelField ?? 'none'}) in ${path.basename(this.file)}`,
        file.path,
        null,
      );
    }
  }
}
