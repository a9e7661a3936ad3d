import type { CorpusRow, CorpusSource } from '../../extension/src/engine/read/corpus-source';

/** An in-memory CorpusSource for tests: rows given as an array, streamed in batches. */
export function arrayCorpusSource(rows: readonly CorpusRow[], labelField: string | null = null): CorpusSource {
  return {
    file: 'in-memory',
    format: 'text',
    textField: null,
    labelField,
    fields: [],
    skipped: { count: 0, examples: [] },
    truncated: null,
    async *batches(batchSize = 1000) {
      for (let i = 0; i < rows.length; i += batchSize) yield rows.slice(i, i + batchSize);
    },
  };
}
