// worker_threads entry (bundled to dist/assemble-worker.js): writes a share of the finished
// count matrix's rows (tokenize/rows-in-rank-order.ts), weighing each part's rows right after
// them when the job says how (their counts' weights, in place), then waits as a pass thread over
// that matrix (make-passes.ts), which the review's exact passes read: the
// first of them is begun a fraction of a second later, and a waiting thread takes it instead of a
// new one being started (~65 ms of CPU each, engine/threads/matrix-pass-threads.ts). A thread of
// its own, not a tokenising one: the tokenising threads end before the matrix is allocated, so
// their heaps (wink's grown lexicon, the chunk tables: hundreds of MB each at a million
// documents) are gone by then; this bundle holds no wink, so it starts in milliseconds.
import { parentPort } from 'node:worker_threads';
import { nextJob, type LastingLink } from '../threads/lasting-thread';
import { RowWriter, type CountedPart } from '../tokenize/rows-in-rank-order';
import type { RowWeighing } from '../tokenize/row-assembler';
import { weighRow } from '../matrix/weigh';
import type { AssembleReply, AssembleRequest } from '../tokenize/tokenize-messages';
import { makePasses } from './make-passes';
import type { MaskedTermSumsWork } from './start-masked-term-sums';

const port = parentPort;
if (port === null) throw new Error('assemble-worker must run as a worker thread');

port.on('message', (request: AssembleRequest) => {
  let reply: AssembleReply;
  // The written parts' buffers go back with the reply: this thread then waits blocked, with no
  // garbage collection to free them (at 100k documents they are 60 MB, the peak RSS was ~20 MB
  // higher with them held here), while the review's thread collects its young objects often.
  const spent: ArrayBuffer[] = [];
  try {
    const writer = new RowWriter(request.ranks, request.columns, request.indices, request.data);
    const { parts, starts } = request;
    for (let k = 0; k < parts.length; k++) {
      const part = parts[k]!;
      writer.write(part, starts[k]!);
      if (request.weigh !== null) weighPart(part, starts[k]!, request.data, request.indices, request.weigh);
      parts[k] = EMPTY_PART; // let each part go as soon as it is written
      spent.push(part.rowEnds.buffer as ArrayBuffer, part.cols.buffer as ArrayBuffer, part.counts.buffer as ArrayBuffer);
    }
    reply = { type: 'assembled', seq: request.seq, error: null, spent };
  } catch (e) {
    reply = { type: 'assembled', seq: request.seq, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e), spent: [] };
  }
  port.postMessage(reply, reply.spent);
  if (reply.error === null && request.link !== null) makePassesUntilIdle(request, request.link);
});

/**
 * Weighs the rows of a part just written (its entries from `start` on), over their counts, while
 * they are in cache: the review's thread then has no pass of its own over the whole matrix to
 * make (~0.1 s at 100k documents, with one core idle), and every row gets weighRow's arithmetic,
 * as weighWithIdf gives it there.
 */
function weighPart(part: CountedPart, start: number, data: Float64Array, indices: Uint32Array, { idf, tf, norm }: RowWeighing): void {
  const { rowEnds } = part;
  let from = start;
  for (let d = 0; d < rowEnds.length; d++) {
    const to = start + rowEnds[d]!;
    weighRow(data, indices, idf, tf, norm, data, from, to);
    from = to;
  }
}

/**
 * The passes callers hand this thread over the matrix it wrote, until none comes for a while;
 * then the thread ends. Blocks this thread's event loop: it takes no more messages.
 */
function makePassesUntilIdle(request: AssembleRequest, link: LastingLink): void {
  const X = { rows: request.indptr.length - 1, cols: request.columns, indptr: request.indptr, indices: request.indices, data: request.data };
  for (let work = nextJob<MaskedTermSumsWork>(link); work !== null; work = nextJob<MaskedTermSumsWork>(link)) makePasses(X, work);
  process.exit(0);
}

const EMPTY_PART = { stream: 0, rowEnds: new Uint32Array(0), cols: new Uint32Array(0), counts: new Uint32Array(0) };

try {
  warmUp();
} catch {
  // Only a matter of speed: the jobs run the same code either way.
}

/**
 * Runs the writer on small made-up parts until the engine has compiled it, while the last
 * batches are still being tokenised: a fresh thread runs `write` unoptimised at first, and at
 * 100k documents its first two real parts cost ~80-140 and ~35-100 ms against 5-10 ms each after
 * (the rows' writing is ~0.5 s, which everything after tokenising waits for); and the weighing
 * of the rows written. The same kinds of arrays as a real job (the matrix on SharedArrayBuffers).
 */
function warmUp(): void {
  const rows = 96;
  const perRow = 32;
  const columns = 4096; // over 2^11, so both radix passes run, as at any real vocabulary size
  const n = rows * perRow;
  const rowEnds = new Uint32Array(rows);
  const cols = new Uint32Array(n);
  const counts = new Uint32Array(n);
  let seed = 1;
  for (let d = 0; d < rows; d++) {
    rowEnds[d] = (d + 1) * perRow;
    for (let k = d * perRow; k < (d + 1) * perRow; k++) {
      seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
      cols[k] = (seed >>> 8) % columns;
      counts[k] = 1 + (seed & 3);
    }
  }
  const ranks = structuredClone([new Uint32Array(columns).map((_, i) => columns - 1 - i)]);
  const indices = new Uint32Array(new SharedArrayBuffer(4 * n));
  const data = new Float64Array(new SharedArrayBuffer(8 * n));
  const writer = new RowWriter(ranks, columns, indices, data);
  // Parts of growing size, so that the scratch arrays are grown again after the engine has begun
  // collecting type feedback (it does not on a function's first calls): with one size, the first
  // real part, larger, met code compiled without it, was thrown away and compiled again.
  // Each part as a message gives it (structured clone): objects built by hand have other shapes,
  // and compiled code that met only those was thrown away at the first real part too.
  // The rows are weighed as a job with the default weighting (raw tf, l2) weighs them.
  const weigh: RowWeighing = structuredClone({ idf: new Float64Array(columns).map((_, i) => 1 + (i % 7) / 8), tf: 'raw', norm: 'l2' });
  for (let r = 1; r <= rows; r++) {
    const part = structuredClone({ stream: 0, rowEnds: rowEnds.slice(0, r), cols: cols.slice(0, r * perRow), counts: counts.slice(0, r * perRow) });
    writer.write(part, 0);
    weighPart(part, 0, data, indices, weigh);
  }
}
