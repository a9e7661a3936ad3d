import type { MaskedTermSums } from '../measures/masked-term-sums';
import type { TermCountStats } from '../terms/term-count-stats';
import { UserError } from '../user-error';
import type { NeighborLists } from '../measures/corpus-neighbors';
import { mergeShardNeighbors, type LabelledNeighbors } from './sharded-search';
import { decodeDuplicateSketch, decodeFloat64, decodeUint32, settingsKey, type EncodedCountStats, type EncodedSums, type PlanPartial, type SumsPartial } from './partials';
import type { EffectiveSettings } from '../../protocol';
import { mergeSketches, type DuplicateSketch } from '../matrix/duplicate-sketch';

interface Running {
  sums: MaskedTermSums;
  /** Shard key → the partial file it came from, to refuse a second one. */
  from: Map<string, string>;
}

/**
 * The shards' sums partials added up as they are read, one at a time, so the finish holds
 * O(vocabulary × masks) whatever the number of shards: per mask (and unmasked) the exact term
 * sums, the raw-count statistics, and the previews the opinion check reads.
 */
export class SumsTotals {
  private readonly masks = new Map<string, Running>();
  private readonly full: Running;
  private readonly counts: TermCountStats;
  private readonly countsFrom = new Map<string, string>();
  private readonly previews: string[] = [];
  private readonly duplicateParts: DuplicateSketch[] = [];
  /** Per neighbour request, each shard's lists as they came (merged in shard order by neighborLists). */
  private readonly neighbors = new Map<string, Map<string, { lists: NeighborLists; labels: (string | null)[] }>>();
  private readonly key: string;

  constructor(
    private readonly plan: PlanPartial,
    settings: EffectiveSettings,
  ) {
    this.key = settingsKey(settings);
    if (plan.settingsKey !== this.key) throw new UserError('the plan was made with other settings: every shard step must use the same loudword.json and options');
    const cols = plan.terms.length;
    this.full = running(cols);
    this.counts = { documents: 0, totalTokens: 0, sumLengthSq: 0, df: new Float64Array(cols), cf: new Float64Array(cols), sumCountSq: new Float64Array(cols), sumCountLength: new Float64Array(cols), opens: new Float64Array(cols) };
    this.previews.length = plan.documents;
  }

  add(partial: SumsPartial, file: string): void {
    if (partial.settingsKey !== this.key) {
      throw new UserError(`computed with other settings (key ${partial.settingsKey}, expected ${this.key}): every shard step must use the same loudword.json and options`, file, null);
    }
    if (partial.planId !== this.plan.planId) throw new UserError(`computed for another plan (${partial.planId}, this one is ${this.plan.planId})`, file, null);
    const shard = partial.shard.key;
    if (!this.plan.shards.some((s) => s.key === shard)) throw new UserError(`shard "${shard}" is not in the plan`, file, null);
    for (const m of partial.masks) {
      let total = this.masks.get(m.id);
      if (total === undefined) this.masks.set(m.id, (total = running(this.plan.terms.length)));
      addSums(total, m, shard, file);
    }
    if (partial.full !== null) addSums(this.full, partial.full, shard, file);
    if (partial.counts !== null) {
      const earlier = this.countsFrom.get(shard);
      if (earlier !== undefined) throw new UserError(`two first-round sums partials for shard "${shard}" (${earlier} and this one)`, file, null);
      this.countsFrom.set(shard, file);
      addCounts(this.counts, partial.counts);
      if (partial.duplicates === null) throw new UserError(`a first-round sums partial without the duplicates sketch (shard "${shard}")`, file, null);
      this.duplicateParts.push(decodeDuplicateSketch(partial.duplicates));
    }
    for (const p of partial.previews) this.previews[p.doc] = p.preview;
    for (const n of partial.neighbors ?? []) {
      let byShard = this.neighbors.get(n.id);
      if (byShard === undefined) this.neighbors.set(n.id, (byShard = new Map()));
      if (byShard.has(shard)) throw new UserError(`two answers to neighbour request ${n.id} for shard "${shard}"`, file, null);
      byShard.set(shard, { lists: { docs: decodeUint32(n.docs), sims: decodeFloat64(n.sims) }, labels: n.labels });
    }
  }

  /** Every neighbour request all shards have answered, merged over the corpus (in shard order, which is document order). */
  neighborLists(k: number): Map<string, LabelledNeighbors> {
    const out = new Map<string, LabelledNeighbors>();
    for (const [id, byShard] of this.neighbors) {
      if (byShard.size !== this.plan.shards.length) continue;
      const parts = this.plan.shards.map((s) => byShard.get(s.key)!);
      // Each list holds the searched sampled documents' neighbours (all of the sample, or a subset).
      out.set(id, mergeShardNeighbors(parts, parts[0]!.lists.docs.length / k, k));
    }
    return out;
  }

  /** Every mask whose sums all shards have sent. */
  maskSums(): Map<string, MaskedTermSums> {
    const out = new Map<string, MaskedTermSums>();
    for (const [id, total] of this.masks) {
      this.assertComplete(total, `mask ${id}`);
      out.set(id, total.sums);
    }
    return out;
  }

  fullSums(): MaskedTermSums {
    this.assertComplete(this.full, 'the unmasked sums');
    return this.full.sums;
  }

  countStats(): TermCountStats {
    for (const s of this.plan.shards) if (!this.countsFrom.has(s.key)) throw new UserError(`no first-round sums partial for shard "${s.key}": run the sums step on every shard`);
    return this.counts;
  }

  /** The duplicates sketch of the whole corpus: the shards' merged (exactly the one-process sketch). */
  duplicates(): DuplicateSketch {
    this.countStats(); // every shard's first-round partial is in
    return mergeSketches(this.duplicateParts);
  }

  /** An array as long as the corpus holding the previews of plan.previewDocs (what the opinion check reads). */
  documentPreviews(): string[] {
    for (const doc of this.plan.previewDocs) if (this.previews[doc] === undefined) throw new UserError(`no preview of document ${doc}: run the sums step on every shard`);
    return this.previews;
  }

  private assertComplete(total: Running, what: string): void {
    for (const s of this.plan.shards) if (!total.from.has(s.key)) throw new UserError(`no sums partial for shard "${s.key}" (${what}): run the sums step on every shard`);
  }
}

function running(cols: number): Running {
  return { sums: { sums: { s1: new Float64Array(cols), s2: new Float64Array(cols), df: new Uint32Array(cols), sxlogx: new Float64Array(cols) }, rowsWithWeight: 0 }, from: new Map() };
}

function addSums(total: Running, part: EncodedSums, shard: string, file: string): void {
  const earlier = total.from.get(shard);
  if (earlier !== undefined) throw new UserError(`two sums partials for shard "${shard}" (${earlier} and this one)`, file, null);
  total.from.set(shard, file);
  const { s1, s2, sxlogx, df } = total.sums.sums;
  const c = decodeUint32(part.cols);
  const a1 = decodeFloat64(part.s1);
  const a2 = decodeFloat64(part.s2);
  const ax = decodeFloat64(part.sxlogx);
  const ad = decodeUint32(part.df);
  for (let i = 0; i < c.length; i++) {
    const col = c[i]!;
    s1[col] += a1[i]!;
    s2[col] += a2[i]!;
    sxlogx[col] += ax[i]!;
    df[col] += ad[i]!;
  }
  total.sums.rowsWithWeight += part.rowsWithWeight;
}

/** Sums of whole numbers: exact in any order. */
function addCounts(total: TermCountStats, part: EncodedCountStats): void {
  total.documents += part.documents;
  total.totalTokens += part.totalTokens;
  total.sumLengthSq += part.sumLengthSq;
  const c = decodeUint32(part.cols);
  const fields = [
    [total.df, decodeFloat64(part.df)],
    [total.cf, decodeFloat64(part.cf)],
    [total.sumCountSq, decodeFloat64(part.sumCountSq)],
    [total.sumCountLength, decodeFloat64(part.sumCountLength)],
    [total.opens, decodeFloat64(part.opens)],
  ] as const;
  for (const [into, from] of fields) for (let i = 0; i < c.length; i++) into[c[i]!]! += from[i]!;
}
