import type { TokenSettings } from './create-tokenizer';
import type { EncodedBatch } from './encode-batch';
import type { LastingLink } from '../threads/lasting-thread';
import type { AssembleJob } from './row-assembler';

/**
 * main → tokenize worker, first of all: the token settings. A thread can be started before they
 * are known (it loads the bundle meanwhile); batches sent after this are tokenised with them.
 */
export interface TokenizeSetup {
  type: 'settings';
  tokens: TokenSettings;
  /**
   * A tokeniser that has seen nothing before (fresh-term-coder.ts): a file lane sends this before
   * each file of a corpus of many files (batch-encoder.ts, startFileLanes).
   */
  fresh?: boolean;
}

/** main → tokenize worker: one batch of document texts, numbered so replies can be reordered. */
export interface TokenizeRequest {
  type: 'texts';
  seq: number;
  texts: string[];
}

/** tokenize worker → main: the encoded batch, or the error text when tokenising threw. */
export interface TokenizeReply {
  seq: number;
  batch: EncodedBatch | null;
  error: string | null;
}

/**
 * main → assemble worker, once every batch is counted: write these parts into the matrix's
 * shared `indices` and `data` (rows-in-rank-order.ts); part k's first row starts at starts[k].
 */
export interface AssembleRequest extends AssembleJob {
  type: 'assemble';
  seq: number;
  /**
   * Where the thread then waits for passes over the matrix (engine/threads/matrix-pass-threads.ts),
   * its port in the message's transfer list; null: the thread waits for another request.
   */
  link: LastingLink | null;
}

/** assemble worker → main: the parts are written, or the error text. */
export interface AssembleReply {
  type: 'assembled';
  seq: number;
  error: string | null;
  /** The written parts' buffers, handed back (transferred) to be let go there. */
  spent: ArrayBuffer[];
}
