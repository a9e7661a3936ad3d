// worker_threads entry (bundled to dist/what-if-thread.js): the sample's half of the panel's
// what-if (SampleSide), so that it runs beside the exact sums on the review's thread
// (ParallelWhatIf). Requests are answered one at a time, in the order they were sent; between
// them the thread resets the dot products' rounding drift when due (SampleSide.settle).
import { parentPort, workerData } from 'node:worker_threads';
import { afterIdleDelay } from './idle-delay';
import { SampleSide } from './sample-side';
import { SharedColumnGather } from './shared-column-gather';
import { stopOnClick } from './speculation-stopped';
import type { SampleReply, SampleRequest, SampleThreadData } from './sample-thread-messages';

const port = parentPort;
if (port === null) throw new Error('sample-thread must run as a worker thread');
const data = workerData as SampleThreadData;
const side = new SampleSide(data);
const gather = data.gather === undefined ? null : SharedColumnGather.from(data.gather);

port.on('message', (request: SampleRequest) => {
  let reply: SampleReply;
  try {
    const interrupt = request.clicks === undefined ? undefined : stopOnClick(request.clicks.counter, request.clicks.seen);
    const measures = request.speculative === true ? side.speculate(request.removed, interrupt, request.ticket) : side.measures(request.removed, !request.full, request.ticket);
    reply = { seq: request.seq, measures, error: null };
  } catch (e) {
    reply = { seq: request.seq, measures: null, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
  }
  port.postMessage(reply);
  // The click's exact sums may still be gathering on the review's thread: take blocks of them.
  // It always opens or passes over the gather once its sums are done, so the wait is bounded by
  // the click itself; the limit is only for a review's thread that went away.
  if (gather !== null && request.gather === true && request.ticket !== undefined) gather.help(request.ticket, GATHER_WAIT_MS);
  // The answer is on its way: a rebuild that has come due is done once it has been drawn,
  // rather than on the next request's path (which does it first if it comes sooner).
  afterIdleDelay(() => {
    try {
      side.settle();
    } catch {
      // The next request does it (and reports what goes wrong).
    }
  });
});

/** The longest the thread waits for a click's gather to be opened or passed over (ms). */
const GATHER_WAIT_MS = 2000;
