// worker_threads entry (bundled to dist/tokenize-worker.js): tokenises batches for
// buildCountMatrix so both cores work while the main thread reads and counts.
import { parentPort, workerData } from 'node:worker_threads';
import { createTermCoder, type TokenSettings } from './create-tokenizer';
import { batchEncoding } from './encode-batch';
import type { TokenizeReply, TokenizeRequest } from './tokenize-messages';

const port = parentPort;
if (port === null) throw new Error('tokenize-worker must run as a worker thread');
const encodeBatch = batchEncoding(createTermCoder((workerData as { tokens: TokenSettings }).tokens));

port.on('message', (request: TokenizeRequest) => {
  let reply: TokenizeReply;
  try {
    const batch = encodeBatch(request.texts);
    reply = { seq: request.seq, batch, error: null };
  } catch (e) {
    reply = { seq: request.seq, batch: null, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
  }
  const b = reply.batch;
  const transfer = b === null ? [] : [b.rowEnds.buffer, b.cols.buffer, b.counts.buffer, b.tokens.buffer];
  port.postMessage(reply, transfer as ArrayBuffer[]);
});
