import type { EncodedBatch } from './encode-batch';
import type { CountedPart } from './rows-in-rank-order';

/** main → tokenize worker: one batch of document texts, numbered so replies can be reordered. */
export interface TokenizeRequest {
  type: 'tokenize';
  seq: number;
  texts: string[];
}

/**
 * main → tokenize worker, once every batch is counted: write these parts into the matrix's
 * shared `indices` and `data` (rows-in-rank-order.ts); part k's first row starts at starts[k].
 */
export interface AssembleRequest {
  type: 'assemble';
  seq: number;
  ranks: Uint32Array[];
  columns: number;
  indices: Uint32Array;
  data: Float64Array;
  parts: CountedPart[];
  starts: number[];
}

/** tokenize worker → main: the encoded batch (null after an assemble request), or the error text when it threw. */
export interface TokenizeReply {
  seq: number;
  batch: EncodedBatch | null;
  error: string | null;
}
