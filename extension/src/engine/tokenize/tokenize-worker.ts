// worker_threads entry (bundled to dist/tokenize-worker.js): tokenises batches for
// buildCountMatrix so both cores work while the main thread reads and counts.
import { parentPort, workerData } from 'node:worker_threads';
import { createTokenizer, type TokenSettings } from './create-tokenizer';
import { encodeBatch } from './encode-batch';
import type { TokenizeReply, TokenizeRequest } from './tokenize-messages';

const port = parentPort;
if (port === null) throw new Error('tokenize-worker must run as a worker thread');
const tokenize = createTokenizer((workerData as { tokens: TokenSettings }).tokens);

port.on('message', (request: TokenizeRequest) => {
  let reply: TokenizeReply;
  try {
    const batch = encodeBatch(tokenize, request.texts);
    reply = { seq: request.seq, batch, error: null };
  } catch (e) {
    reply = { seq: request.seq, batch: null, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
  }
  const transfer = reply.batch === null ? [] : [reply.batch.docEnds.buffer, reply.batch.ids.buffer];
  port.postMessage(reply, transfer as ArrayBuffer[]);
});
