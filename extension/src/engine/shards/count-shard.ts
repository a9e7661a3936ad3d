import type { EffectiveSettings } from '../../protocol';
import { countFile } from '../matrix/count-each-file';
import { BottomK, type Ranked } from '../random/bottom-k';
import { hashFileKey, placeKey } from '../random/place-hash';
import { openCorpusFile } from '../read/open-corpus-file';
import { unlabelledCount } from '../review/unlabelled-note';
import { header, type CountPartial, type SampleCandidate } from './partials';
import type { ShardCounts } from './shard-counts';

export interface ShardRef {
  /** Path to read. */
  file: string;
  /** The shard's place key (its path relative to the corpus root); see read/corpus-files.ts. */
  key: string;
}

/**
 * Candidates a shard keeps for the merged sample: twice the sample, because pruning (known only
 * after the merge) may empty some of them; the merge checks that the sample it draws is exact.
 */
export function candidateLimit(settings: EffectiveSettings): number {
  return 2 * settings.sample.documents;
}

/**
 * Round 1 of a distributed review, for one shard: reads and tokenises it, and returns its
 * terms with their document frequencies, its token count, and the documents with the smallest
 * place keys (the sample candidates) with their raw counts. Everything the merge adds up.
 */
export async function countShard(shard: ShardRef, settings: EffectiveSettings): Promise<CountPartial> {
  return (await countShardKeeping(shard, settings)).partial;
}

/** Round 1, also handing back the shard's counts, so the sums rounds need not tokenise it again (shard-counts.ts). */
export async function countShardKeeping(shard: ShardRef, settings: EffectiveSettings): Promise<{ partial: CountPartial; kept: ShardCounts }> {
  const source = await openCorpusFile(shard.file, {
    format: settings.format,
    textField: settings.text,
    labelField: settings.label,
    maxBytes: settings.limits.maxBytes,
  });
  const built = await countFile(source, settings.tokens);
  const { counts, lines, labels, previews } = built;
  const df = new Array<number>(counts.cols).fill(0);
  let tokens = 0;
  let nonEmpty = 0;
  const fileHash = hashFileKey(shard.key, settings.sample.seed);
  const kept = new BottomK<Ranked & { row: number }>(candidateLimit(settings));
  for (let r = 0; r < counts.rows; r++) {
    tokens += counts.tokensPerDoc[r]!;
    const start = counts.indptr[r]!;
    const end = counts.indptr[r + 1]!;
    for (let p = start; p < end; p++) if (counts.data[p] !== 0) df[counts.indices[p]!]!++;
    if (end === start) continue;
    nonEmpty++;
    const item = { key: placeKey(fileHash, lines[r]!), file: shard.key, line: lines[r]!, row: r };
    if (kept.admits(item)) kept.push(item);
  }
  const candidates: SampleCandidate[] = kept.items().map(({ key, line, row }) => {
    const start = counts.indptr[row]!;
    const end = counts.indptr[row + 1]!;
    return {
      key,
      line,
      row,
      label: labels === null ? null : (labels[row] ?? null),
      preview: previews[row] ?? '',
      terms: Array.from(counts.indices.subarray(start, end)),
      counts: Array.from(counts.data.subarray(start, end)),
    };
  });
  const partial: CountPartial = {
    ...header('count', settings),
    step: 'count',
    shard: { key: shard.key, file: shard.file },
    documents: counts.rows,
    tokens,
    nonEmptyDocuments: nonEmpty,
    input: {
      format: source.format,
      textField: source.textField,
      labelField: source.labelField,
      skipped: source.skipped.count,
      unlabelled: unlabelledCount(labels),
      skippedExamples: source.skipped.examples.map((e) => ({ line: e.line, reason: e.reason })),
      notes: [...(source.notes ?? [])],
      truncated: source.truncated,
    },
    tokenizerNotes: built.notes,
    repeatedLines: built.repeatedLines,
    terms: [...counts.terms],
    df,
    candidates,
    candidateLimit: candidateLimit(settings),
  };
  return { partial, kept: { counts, previews, labels } };
}
