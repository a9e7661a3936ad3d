// worker_threads entry (bundled to dist/assemble-worker.js): writes a share of the finished
// count matrix's rows (rows-in-rank-order.ts). A thread of its own, not a tokenising one: the
// tokenising threads end before the matrix is allocated, so their heaps (wink's grown lexicon,
// the chunk tables: hundreds of MB each at a million documents) are gone by then; this bundle
// holds no wink, so it starts in milliseconds.
import { parentPort } from 'node:worker_threads';
import { RowCountAccumulator, type RowCountSums } from './row-count-sums';
import { RowWriter } from './rows-in-rank-order';
import type { AssembleReply, AssembleRequest } from './tokenize-messages';

const port = parentPort;
if (port === null) throw new Error('assemble-worker must run as a worker thread');

port.on('message', (request: AssembleRequest) => {
  let reply: AssembleReply;
  let transfer: ArrayBuffer[] = [];
  try {
    const writer = new RowWriter(request.ranks, request.columns, request.indices, request.data);
    const { parts, starts } = request;
    const accumulator = request.countSums ? new RowCountAccumulator(request.columns) : null;
    for (let k = 0; k < parts.length; k++) {
      writer.write(parts[k]!, starts[k]!, accumulator);
      parts[k] = EMPTY_PART; // let each part go as soon as it is written
    }
    const sums: RowCountSums | null = accumulator?.result() ?? null;
    reply = { type: 'assembled', seq: request.seq, error: null, sums };
    if (sums !== null) transfer = [sums.df.buffer, sums.cf.buffer, sums.sumCountSq.buffer, sums.sumCountLength.buffer] as ArrayBuffer[];
  } catch (e) {
    reply = { type: 'assembled', seq: request.seq, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e), sums: null };
  }
  port.postMessage(reply, transfer);
});

const EMPTY_PART = { stream: 0, rowEnds: new Uint32Array(0), cols: new Uint32Array(0), counts: new Uint32Array(0) };
