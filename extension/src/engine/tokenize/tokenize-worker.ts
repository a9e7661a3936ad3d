// worker_threads entry (bundled to dist/tokenize-worker.js): tokenises batches for
// buildCountMatrix so both cores work while the main thread reads and counts, then writes its
// share of the finished matrix's rows.
import { parentPort, workerData } from 'node:worker_threads';
import { createTermCoder, type TokenSettings } from './create-tokenizer';
import { batchEncoding } from './encode-batch';
import { RowWriter } from './rows-in-rank-order';
import type { AssembleRequest, TokenizeReply, TokenizeRequest } from './tokenize-messages';

const port = parentPort;
if (port === null) throw new Error('tokenize-worker must run as a worker thread');
const encodeBatch = batchEncoding(createTermCoder((workerData as { tokens: TokenSettings }).tokens));

port.on('message', (request: TokenizeRequest | AssembleRequest) => {
  let reply: TokenizeReply;
  try {
    if (request.type === 'assemble') {
      const writer = new RowWriter(request.ranks, request.columns, request.indices, request.data);
      const { parts, starts } = request;
      for (let k = 0; k < parts.length; k++) {
        writer.write(parts[k]!, starts[k]!);
        parts[k] = EMPTY_PART; // let each part go as soon as it is written
      }
      reply = { seq: request.seq, batch: null, error: null };
    } else {
      reply = { seq: request.seq, batch: encodeBatch(request.texts), error: null };
    }
  } catch (e) {
    reply = { seq: request.seq, batch: null, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
  }
  const b = reply.batch;
  const transfer = b === null ? [] : [b.rowEnds.buffer, b.cols.buffer, b.counts.buffer, b.tokens.buffer];
  port.postMessage(reply, transfer as ArrayBuffer[]);
});

const EMPTY_PART = { stream: 0, rowEnds: new Uint32Array(0), cols: new Uint32Array(0), counts: new Uint32Array(0) };
