import type { CorpusSource, ReadOptions } from './corpus-source';
import { UserError } from '../user-error';
import { openGzipCorpus } from './gzip-corpus';
import { openCorpus } from './open-corpus';
import { openParquetCorpus } from './parquet-corpus';

/** Opens one corpus file by its name: Parquet, gzip-compressed text formats, or plain text formats. */
export async function openCorpusFile(file: string, options: ReadOptions = {}): Promise<CorpusSource> {
  if (options.format === 'files') {
    // A shard step or a single file with format "files": only a folder is read one document per file.
    throw new UserError('format "files" reads a folder, one document per file; this is a single file (or a shard of a review in shards, which must be a table or lines)', file, null);
  }
  if (/\.parquet$/i.test(file) || options.format === 'parquet') return openParquetCorpus(file, options);
  if (/\.gz$/i.test(file)) return openGzipCorpus(file, options);
  return openCorpus(file, options);
}
