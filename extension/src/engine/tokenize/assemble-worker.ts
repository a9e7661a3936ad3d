// worker_threads entry (bundled to dist/assemble-worker.js): writes a share of the finished
// count matrix's rows (rows-in-rank-order.ts). A thread of its own, not a tokenising one: the
// tokenising threads end before the matrix is allocated, so their heaps (wink's grown lexicon,
// the chunk tables: hundreds of MB each at a million documents) are gone by then; this bundle
// holds no wink, so it starts in milliseconds.
import { parentPort } from 'node:worker_threads';
import { RowWriter } from './rows-in-rank-order';
import type { AssembleReply, AssembleRequest } from './tokenize-messages';

const port = parentPort;
if (port === null) throw new Error('assemble-worker must run as a worker thread');

port.on('message', (request: AssembleRequest) => {
  let reply: AssembleReply;
  try {
    const writer = new RowWriter(request.ranks, request.columns, request.indices, request.data);
    const { parts, starts } = request;
    for (let k = 0; k < parts.length; k++) {
      writer.write(parts[k]!, starts[k]!);
      parts[k] = EMPTY_PART; // let each part go as soon as it is written
    }
    reply = { type: 'assembled', seq: request.seq, error: null };
  } catch (e) {
    reply = { type: 'assembled', seq: request.seq, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
  }
  port.postMessage(reply);
});

const EMPTY_PART = { stream: 0, rowEnds: new Uint32Array(0), cols: new Uint32Array(0), counts: new Uint32Array(0) };
