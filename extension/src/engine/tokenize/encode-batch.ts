/**
 * A batch of tokenised documents in a form that crosses a thread boundary cheaply: each distinct
 * term once, and the documents as runs of batch-local term ids. Document d's ids are
 * ids[docEnds[d-1] .. docEnds[d]) (docEnds[-1] = 0).
 */
export interface EncodedBatch {
  terms: string[];
  docEnds: Uint32Array;
  ids: Uint32Array;
  /** Batch-local indices of the documents that had an over-long run cut (long-runs.ts). */
  longRunDocs: number[];
  /** How many runs were cut in the batch. */
  longRuns: number;
}

/** Tokenises `texts` and encodes them; the same code runs in-process and in the worker. */
export function encodeBatch(tokenize: ((text: string) => string[]) & { readonly longRunsCut?: number }, texts: readonly string[]): EncodedBatch {
  const idOf = new Map<string, number>();
  const terms: string[] = [];
  const docEnds = new Uint32Array(texts.length);
  let ids = new Uint32Array(Math.max(64, texts.length * 16));
  let used = 0;
  const longRunDocs: number[] = [];
  const runsBefore = tokenize.longRunsCut ?? 0;
  let runsSeen = runsBefore;
  for (let d = 0; d < texts.length; d++) {
    const tokens = tokenize(texts[d]);
    if ((tokenize.longRunsCut ?? 0) !== runsSeen) {
      runsSeen = tokenize.longRunsCut ?? 0;
      longRunDocs.push(d);
    }
    if (used + tokens.length > ids.length) {
      const grown = new Uint32Array(Math.max(ids.length * 2, used + tokens.length));
      grown.set(ids.subarray(0, used));
      ids = grown;
    }
    for (const t of tokens) {
      let id = idOf.get(t);
      if (id === undefined) {
        id = terms.length;
        idOf.set(t, id);
        terms.push(t);
      }
      ids[used++] = id;
    }
    docEnds[d] = used;
  }
  return { terms, docEnds, ids: ids.slice(0, used), longRunDocs, longRuns: runsSeen - runsBefore };
}
