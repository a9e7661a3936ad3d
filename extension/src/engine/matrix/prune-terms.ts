import { UserError } from '../user-error';
import { renumberFirstTerms, type CountMatrix } from './csr';

export interface PruneOptions {
  /**
   * Keep terms in at least this many documents. Below 1: a proportion of the documents
   * (0.01 = 1%); 1 or more: a number of documents (so 1 = "in one document", which keeps all).
   */
  minDf: number;
  /**
   * Keep terms in at most this many documents. Up to 1: a proportion (1 = all documents, which
   * keeps all; 0.5 = half); above 1: a number of documents, which must then be whole.
   */
  maxDf: number;
  stopTerms: ReadonlySet<string>;
  /** Each column's document frequency when the caller has it already (one pass over the non-zeros fewer). */
  df?: ArrayLike<number>;
}

export interface PruneResult {
  counts: CountMatrix;
  /** Columns dropped by minDf/maxDf (among those the stop list left). */
  prunedByDf: number;
  /** Columns dropped because the stop list holds their term. */
  stopped: number;
  /** Stop terms that are no column of the input, in the stop list's order. */
  unusedStopTerms: string[];
}

/**
 * Drops stop-list terms and terms outside the document-frequency limits, keeping the other
 * columns in their order. The limits mean what scikit-learn's CountVectorizer min_df/max_df
 * mean (a float is a proportion of n, an int a count, the bounds inclusive: df ≥ minDf·n,
 * df ≤ maxDf·n), with one difference forced by JSON having one number type: the value itself
 * chooses the reading — minDf < 1 and maxDf ≤ 1 are proportions, the rest counts. So minDf 1
 * means scikit-learn's min_df=1 (int), and maxDf 1 means max_df=1.0 (float), the two defaults.
 * Rows whose every term is dropped stay, empty; tokensPerDoc is kept as it was, and a first term
 * that is dropped becomes −1.
 */
export function pruneTerms(counts: CountMatrix, options: PruneOptions): PruneResult {
  const n = counts.rows;
  const { minCount, maxCount } = dfBounds(options, n);
  const total = counts.indptr[counts.rows];
  let df: ArrayLike<number>;
  if (options.df !== undefined) {
    if (options.df.length !== counts.cols) throw new RangeError(`pruneTerms: df has ${options.df.length} entries for ${counts.cols} columns`);
    df = options.df;
  } else {
    const counted = new Uint32Array(counts.cols);
    for (let k = 0; k < total; k++) if (counts.data[k] !== 0) counted[counts.indices[k]]++;
    df = counted;
  }

  const newCol = new Int32Array(counts.cols);
  const terms: string[] = [];
  let stopped = 0;
  let prunedByDf = 0;
  const seen = new Set<string>();
  for (let j = 0; j < counts.cols; j++) {
    const term = counts.terms[j]!;
    if (options.stopTerms.has(term)) {
      seen.add(term);
      stopped++;
      newCol[j] = -1;
    } else if (df[j] < minCount || df[j] > maxCount) {
      prunedByDf++;
      newCol[j] = -1;
    } else {
      newCol[j] = terms.length;
      terms.push(term);
    }
  }

  const unusedStopTerms: string[] = [];
  for (const t of options.stopTerms) if (!seen.has(t)) unusedStopTerms.push(t);
  if (terms.length === counts.cols) {
    // Nothing dropped (the default bounds keep every term): the matrix as it is, not a copy.
    return { counts, prunedByDf, stopped, unusedStopTerms };
  }
  let kept = 0;
  for (let k = 0; k < total; k++) if (newCol[counts.indices[k]] >= 0) kept++;
  const indptr = new Uint32Array(n + 1);
  const indices = new Uint32Array(kept);
  const data = new Float64Array(kept);
  let at = 0;
  for (let r = 0; r < n; r++) {
    for (let k = counts.indptr[r]; k < counts.indptr[r + 1]; k++) {
      const c = newCol[counts.indices[k]];
      if (c < 0) continue;
      indices[at] = c;
      data[at++] = counts.data[k];
    }
    indptr[r + 1] = at;
  }
  return {
    counts: { rows: n, cols: terms.length, indptr, indices, data, terms, tokensPerDoc: counts.tokensPerDoc, firstTerms: renumberFirstTerms(counts.firstTerms, newCol) },
    prunedByDf,
    stopped,
    unusedStopTerms,
  };
}

/**
 * The document counts a term's df must lie between (inclusive) for `n` documents: the prune
 * settings read as documentCount reads them; a UserError when either is invalid or they leave no
 * room. One reading for every place that prunes (pruneTerms, a review in shards' plan, the rows
 * weighed as they are written).
 */
export function dfBounds(prune: { minDf: number; maxDf: number }, n: number): { minCount: number; maxCount: number } {
  const minCount = documentCount('prune.minDf', prune.minDf, n, false);
  const maxCount = documentCount('prune.maxDf', prune.maxDf, n, true);
  if (maxCount < minCount) throw new UserError(`prune.maxDf (${prune.maxDf}) allows fewer documents than prune.minDf (${prune.minDf}).`);
  return { minCount, maxCount };
}

/** The df bound a setting stands for, as scikit-learn computes it (proportion × n, unrounded). */
export function documentCount(name: string, value: number, n: number, isMax: boolean): number {
  if (!Number.isFinite(value) || value < 0) throw new UserError(`${name} must be a number ≥ 0, got ${value}.`);
  const proportion = isMax ? value <= 1 : value < 1;
  if (proportion) return value * n;
  if (!Number.isInteger(value)) {
    throw new UserError(`${name} above 1 counts documents and must be a whole number, got ${value}.`);
  }
  return value;
}

/**
 * Why a review has no terms, naming the text field it read and the other fields a user could name
 * instead: a field of URLs or ids tokenises to nothing the default kinds keep.
 */
export function noTermsLeftMessage(textField: string | null, fields: readonly string[], termsBefore: number): string {
  const others = fields.filter((f) => f !== textField);
  const field = textField === null ? '' : ` of the text field "${textField}"`;
  const before = termsBefore > 0
    ? `${termsBefore} term${termsBefore === 1 ? ' was' : 's were'} found, all pruned by document frequency`
    : 'no token of a kind the settings keep was found (URLs, e-mail addresses and punctuation are dropped by default)';
  const instead = textField !== null && others.length > 0 ? `; another field may hold the text (--text, "text" in loudword.json): ${others.join(', ')}` : '';
  return `no terms are left after tokenising and pruning${field}: ${before}${instead}; check the prune settings too`;
}
