import { mergeNeighborLists, type NeighborLists } from '../measures/corpus-neighbors';
import { labelPrecision, type LabelChance } from '../measures/label-precision';
import { isLabel, sampleLabelChance, searchedQueries, spreadToSample, type CorpusSearch, type CorpusSearcher } from '../terms/corpus-precision';
import { maskColumns, neighborRequestId, type NeighborRequest } from './partials';

/** A neighbour search's answer over the whole corpus: the lists and each listed document's label. */
export interface LabelledNeighbors {
  lists: NeighborLists;
  labels: (string | null)[];
}

/**
 * The verdict's corpus search in a review in shards: each shard seeks the sampled documents'
 * neighbours among its own documents in a sums round (sum-shard.ts), and the lists are merged
 * (SumsTotals). A search no round ran yet is noted in `missing` and answered with no neighbours;
 * the caller then runs another round for it and reviews again, as for the sums (ShardedLab).
 */
export class ShardedSearch implements CorpusSearcher {
  readonly missing = new Map<string, NeighborRequest>();
  /** The chance a missing neighbour counts, from the sample's labels (measures/label-precision.ts). */
  private readonly chance: LabelChance<string>;

  constructor(
    private readonly known: ReadonlyMap<string, LabelledNeighbors>,
    /** The label of each sampled document, in sample order. */
    private readonly sampleLabels: readonly (string | null)[],
    private readonly k: number,
  ) {
    this.chance = sampleLabelChance(sampleLabels);
  }

  precision(removed: Uint8Array, search: CorpusSearch): Float64Array {
    const columns = maskColumns(removed);
    const id = neighborRequestId(columns, search, this.k);
    const found = this.known.get(id);
    const k = this.k;
    const m = this.sampleLabels.length;
    if (found === undefined) {
      this.missing.set(id, { id, columns, documents: search.documents, among: search.among, queries: search.queries, seed: search.seed, k });
      return new Float64Array(m).fill(Number.NaN);
    }
    // The lists are the searched positions' (searchedQueries), in order.
    const positions = searchedQueries(search, m);
    const labelOf = (q: number): string | null => this.sampleLabels[positions[q]!] ?? null;
    const precision = labelPrecision(found.lists.docs, found.lists.sims, k, (q) => isLabel(labelOf(q)), (q, r) => found.labels[q * k + r] === labelOf(q), (q) => this.chance(labelOf(q)!));
    return spreadToSample(precision, positions, m);
  }
}

/** The shards' lists for one request, in document order (shard order), merged with their labels. */
export function mergeShardNeighbors(parts: ReadonlyArray<{ lists: NeighborLists; labels: (string | null)[] }>, m: number, k: number): LabelledNeighbors {
  const lists = mergeNeighborLists(parts.map((p) => p.lists), m, k);
  const labelOf = new Map<number, string | null>();
  for (const p of parts) p.lists.docs.forEach((d, i) => labelOf.set(d, p.labels[i] ?? null));
  return { lists, labels: Array.from(lists.docs, (d) => labelOf.get(d) ?? null) };
}
