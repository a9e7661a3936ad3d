import type { CorpusRow, CorpusSource } from '../../extension/src/engine/read/corpus-source';

/** Every row an opened corpus gives, in order (batches of `batchSize` rows when given). */
export async function readAllRows(source: CorpusSource, batchSize?: number): Promise<CorpusRow[]> {
  const rows: CorpusRow[] = [];
  for await (const batch of source.batches(batchSize)) rows.push(...batch);
  return rows;
}
