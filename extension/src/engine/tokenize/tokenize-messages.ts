import type { EncodedBatch } from './encode-batch';

/** main → tokenize worker: one batch of document texts, numbered so replies can be reordered. */
export interface TokenizeRequest {
  seq: number;
  texts: string[];
}

/** tokenize worker → main: the encoded batch, or the error text when tokenising threw. */
export interface TokenizeReply {
  seq: number;
  batch: EncodedBatch | null;
  error: string | null;
}
