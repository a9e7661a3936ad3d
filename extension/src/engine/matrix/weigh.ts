import type { EffectiveSettings } from '../../protocol';
import type { CountMatrix, Csr } from './csr';
import { normalizeRow } from './normalize-rows';

export type WeightingSettings = EffectiveSettings['weighting'];

export interface Weighted {
  /** tf·idf, each row normalised; shares indptr and indices with the counts (do not mutate). */
  weights: Csr;
  /** idf of each column (1 for idf 'none'). */
  idf: Float64Array;
}

/**
 * tf·idf weights, following Salton & Buckley (1988) and IIR ch. 6, with scikit-learn's
 * TfidfTransformer variants (docs/methods.md §1):
 *   tf:  raw c | sublinear 1 + ln c | binary [c > 0]
 *   idf: smooth ln((1+n)/(1+df)) + 1 | plain ln(n/df) | plainPlusOne ln(n/df) + 1 | none 1
 *   norm: l2 | l1 | none.
 * A column with df 0 gets idf 0 under plain/plainPlusOne (ln(n/0) is infinite, and no entry
 * uses it anyway). Rows with no terms, or whose weights are all 0, stay zero.
 */
export function weigh(counts: CountMatrix, weighting: WeightingSettings): Weighted {
  const idf = idfOfColumns(counts, weighting);
  return { weights: weighWithIdf(counts, idf, weighting), idf };
}

/**
 * `weigh` writing the weights over `counts.data`, for a caller that is done with the counts
 * (prepare-weights.ts): no second array as long as the non-zeros (~600 MB at a million
 * documents), the same numbers. The counts must not be used afterwards.
 */
export function weighInPlace(counts: CountMatrix, weighting: WeightingSettings, df?: ArrayLike<number>): Weighted {
  const idf = idfOfColumns(counts, weighting, df);
  return { weights: weighWithIdf(counts, idf, weighting, counts.data), idf };
}

/**
 * idf of every column from the counts' document frequencies (the non-zeros per column), or from
 * `df` when the caller has counted them already (one pass over the non-zeros fewer).
 */
function idfOfColumns(counts: Csr, weighting: WeightingSettings, known?: ArrayLike<number>): Float64Array {
  const { rows: n, cols } = counts;
  let df: ArrayLike<number>;
  if (known !== undefined) {
    if (known.length !== cols) throw new RangeError(`weigh: df has ${known.length} entries for ${cols} columns`);
    df = known;
  } else {
    const total = counts.indptr[n];
    const counted = new Uint32Array(cols);
    for (let k = 0; k < total; k++) if (counts.data[k] !== 0) counted[counts.indices[k]]++;
    df = counted;
  }
  return idfFromDf(weighting.idf, n, df);
}

/**
 * tf·idf with the idf given (a distributed review computes it once from the summed df), each
 * row normalised; the same arithmetic as `weigh`, so the rows are equal to the last bit.
 * `out` receives the weights (default: a new array; counts.data itself is allowed).
 */
export function weighWithIdf(counts: Csr, idf: Float64Array, weighting: WeightingSettings, out?: Float64Array): Csr {
  const n = counts.rows;
  const total = counts.indptr[n];
  const data = out ?? new Float64Array(total);
  const { indptr } = counts;
  // Row by row, each row normalised right after its weights are written, while it is in cache
  // (two passes over the whole matrix read every non-zero from memory twice); the same
  // arithmetic in the same order as weighing everything and then normalizeRows.
  for (let r = 0; r < n; r++) weighRow(counts.data, counts.indices, idf, weighting.tf, weighting.norm, data, indptr[r], indptr[r + 1]);
  return { rows: n, cols: counts.cols, indptr: counts.indptr, indices: counts.indices, data };
}

/**
 * The weights of one row, entries start..end: counts `c` times idf of their column (`tf` applied),
 * written to `data` (which may be `c` itself) and normalised. weighWithIdf's step, and that of the
 * threads that weigh the rows they have just written (matrix-thread.ts): the same arithmetic
 * wherever a row is weighed. One loop per tf kind, so the hot loop compares no strings per entry.
 */
export function weighRow(
  c: Float64Array,
  indices: Uint32Array,
  idf: Float64Array,
  tf: WeightingSettings['tf'],
  norm: WeightingSettings['norm'],
  data: Float64Array,
  start: number,
  end: number,
): void {
  if (tf === 'raw') {
    for (let k = start; k < end; k++) data[k] = c[k] * idf[indices[k]];
  } else if (tf === 'sublinear') {
    for (let k = start; k < end; k++) data[k] = (c[k] === 0 ? 0 : 1 + Math.log(c[k])) * idf[indices[k]];
  } else {
    for (let k = start; k < end; k++) data[k] = (c[k] === 0 ? 0 : 1) * idf[indices[k]];
  }
  normalizeRow(data, start, end, norm);
}

/**
 * The idf of every column from its document frequency, as `weigh` computes it, for `n` documents:
 * for a caller that has the df before the matrix is written (build-count-matrix.ts weighs the
 * rows as they are written, when pruning will keep every column).
 */
export function idfFromDf(kind: WeightingSettings['idf'], n: number, df: ArrayLike<number>): Float64Array {
  const idf = new Float64Array(df.length);
  for (let j = 0; j < df.length; j++) idf[j] = idfOf(kind, n, df[j]);
  return idf;
}

/** The idf of a term in `df` of `n` documents (see `weigh`). */
export function idfOf(kind: WeightingSettings['idf'], n: number, df: number): number {
  switch (kind) {
    case 'smooth':
      return Math.log((1 + n) / (1 + df)) + 1;
    case 'plain':
      return df === 0 ? 0 : Math.log(n / df);
    case 'plainPlusOne':
      return df === 0 ? 0 : Math.log(n / df) + 1;
    case 'none':
      return 1;
  }
}
