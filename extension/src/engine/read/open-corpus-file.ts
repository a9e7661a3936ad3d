import type { CorpusSource, ReadOptions } from './corpus-source';
import { openGzipCorpus } from './gzip-corpus';
import { openCorpus } from './open-corpus';
import { openParquetCorpus } from './parquet-corpus';

/** Opens one corpus file by its name: Parquet, gzip-compressed text formats, or plain text formats. */
export async function openCorpusFile(file: string, options: ReadOptions = {}): Promise<CorpusSource> {
  if (/\.parquet$/i.test(file) || options.format === 'parquet') return openParquetCorpus(file, options);
  if (/\.gz$/i.test(file)) return openGzipCorpus(file, options);
  return openCorpus(file, options);
}
