// worker_threads entry (bundled to dist/tokenize-worker.js): tokenises batches for
// buildCountMatrix so both cores work while the main thread reads and counts.
import { parentPort } from 'node:worker_threads';
import { createTermCoder, type TokenSettings } from './create-tokenizer';
import { batchEncoding, type EncodedBatch } from './encode-batch';
import { freshTermCoder } from './fresh-term-coder';
import type { TokenizeReply, TokenizeRequest, TokenizeSetup } from './tokenize-messages';

const port = parentPort;
if (port === null) throw new Error('tokenize-worker must run as a worker thread');

// Each reply hands its typed arrays over (transfer), which detaches their buffers here. The first
// detached buffer in a thread tells V8 that buffers can be detached at all, and every function
// it had optimised on the promise that none would be (all those that read a typed array: the
// scan, the table, the batch's counting) was thrown away at once and compiled again after the
// first reply ("code dependencies" in --trace-deopt, 100k pattern review). Detaching one buffer
// now, before anything is hot, makes the first compile of each function the last.
const spare = new ArrayBuffer(8);
structuredClone(spare, { transfer: [spare] });
// The settings come in the first message, so that a thread can be started (and load the
// bundle) before they are known (batch-encoder.ts, startTokenizingThreads).
let encodeBatch: ((texts: string[]) => EncodedBatch) | null = null;
let setupError: unknown = null;
const setUp = (tokens: TokenSettings, fresh: boolean): void => {
  try {
    encodeBatch = batchEncoding(fresh ? freshTermCoder(tokens) : createTermCoder(tokens));
    setupError = null;
  } catch (e) {
    setupError = e;
  }
};

port.on('message', (request: TokenizeRequest | TokenizeSetup) => {
  if (request.type === 'settings') {
    setUp(request.tokens, request.fresh === true);
    return;
  }
  let reply: TokenizeReply;
  try {
    if (encodeBatch === null) throw setupError ?? new Error('tokenize worker: no token settings');
    const batch = encodeBatch(request.texts);
    reply = { seq: request.seq, batch, error: null };
  } catch (e) {
    reply = { seq: request.seq, batch: null, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
  }
  const b = reply.batch;
  const transfer = b === null ? [] : [b.rowEnds.buffer, b.cols.buffer, b.counts.buffer, b.tokens.buffer];
  port.postMessage(reply, transfer as ArrayBuffer[]);
});
