import type { Worker } from 'node:worker_threads';
import type { Measures } from '../../protocol';
import type { Csr } from '../matrix/csr';
import { joinMeasures, type ExactMeasures, type SampledFields } from '../measures/measure-distances';
import { SharedRowSweep } from '../measures/shared-row-sweep';
import { PendingReplies } from '../threads/pending-replies';
import { startThread, threadScript } from '../threads/thread-script';
import type { DistanceLab } from './distance-lab';
import { GramRowsUpdate } from './gram-rows-update';
import { IncrementalGram } from './incremental-gram';
import { WHAT_IF_BLOCK_ROWS } from './sample-side';
import { SharedColumnGather } from './shared-column-gather';
import { SpeculationStopped, stopOnClick } from './speculation-stopped';
import type { SampleReply, SampleRequest, SampleThreadData } from './sample-thread-messages';

/**
 * The panel's what-if on two threads: the sample's half (the kept dot products of the sampled
 * rows and every measure read off them, SampleSide) runs on a worker thread of its own
 * (sample-thread.ts) while this thread updates the exact sums of the whole corpus (DistanceLab).
 * The two halves share no input, so a toggle costs the longer of the two instead of their sum;
 * and the sample's half is the longer (its sweep over the m×m products), so once the exact sums
 * are done this thread takes blocks of that sweep's rows too (SharedRowSweep: the thread keeps
 * its products in shared memory and opens each sweep under the request's number; a click's
 * update of the products runs block by block in that sweep, each block's by the thread that
 * sweeps it, GramRowsUpdate). When the exact
 * half is the longer (a click on a term in most rows gathers ~5M non-zeros at 100k), the thread,
 * its answer sent, takes blocks of columns of that gather the same way (SharedColumnGather, under
 * the same number; a click that does not gather passes it over, so the thread stops waiting).
 * The answers are DistanceLab.whatIf's, bit for bit: the thread's SampleSide walks the same
 * masks in the same order as the lab's own dot products would, and the sweep sums in the same
 * blocks whichever thread swept them (test/what-if-parallel.test.ts).
 * If the thread fails, the lab answers in this thread from then on.
 */
export class ParallelWhatIf {
  private readonly replies = new PendingReplies<SampledFields>();
  /** Toggles answered with the thread's half (the rest fell back to this thread), for the tests and the benchmark. */
  threadAnswers = 0;
  /** Settles when the thread has built the opening state (or failed to). */
  opened: Promise<void> = Promise.resolve();

  /** Blocks of the sample's sweeps this thread swept, for the tests and the benchmark. */
  helpedBlocks = 0;

  /** Blocks of the exact sums' gathers the thread took, for the tests and the benchmark. */
  get gatherBlocksHelped(): number {
    return this.gather?.helped ?? 0;
  }

  private constructor(
    private readonly lab: DistanceLab,
    private readonly baselineNeighbors: Uint32Array | null,
    private readonly worker: Worker,
    private readonly sweep: SharedRowSweep,
    /** The exact sums' gather the thread helps with (null: the exact half stays here). */
    private readonly gather: SharedColumnGather | null,
    /** This thread's share of the dot products' update, run in the blocks it sweeps (null: the thread updates them whole first). */
    private readonly rowsUpdate: GramRowsUpdate | null,
  ) {
    worker.on('message', (reply: SampleReply) => {
      if (reply.measures !== null) this.replies.resolve(reply.seq, reply.measures);
      else this.replies.reject(reply.seq, new Error(`what-if thread: ${reply.error}`));
      if (this.replies.size === 0) worker.unref();
    });
    worker.on('error', (e) => this.fail(e));
    worker.on('exit', (code) => this.fail(new Error(`what-if thread exited with code ${code}`)));
    // An idle thread never keeps the process alive; one with a request in flight does.
    worker.unref();
  }

  /**
   * Starts the thread for `lab`'s sample, opening at `opening` (the panel's first state: a full
   * build there, while the reader looks at the Report), or null when there is no thread script
   * (`script` by default: the bundled dist/what-if-thread.js beside this bundle, or under tsx the
   * source entry beside this file).
   */
  static open(lab: DistanceLab, baselineNeighbors: Uint32Array | null, opening: Uint8Array, script: string | null = threadScript(__dirname, 'what-if-thread.js', 'sample-thread.ts')): ParallelWhatIf | null {
    if (script === null) return null;
    const { rows, cols, indptr, indices, data } = lab.sampleRows;
    // With room for the thread's states' updates beside their products (IncrementalGram.storageNeeds).
    const sweep = SharedRowSweep.create(rows, lab.k, WHAT_IF_BLOCK_ROWS, 2, IncrementalGram.storageNeeds(lab.sampleRows));
    const gather = lab.exactGather();
    // The update row by row in the sweep only where this thread can take its share of it too.
    const list = GramRowsUpdate.buffer();
    const rowsUpdate = GramRowsUpdate.open(sweep, list);
    const workerData: SampleThreadData = {
      rows: { rows, cols, indptr, indices, data },
      k: lab.k,
      seed: lab.seed,
      labels: lab.sampleLabels,
      baselineNeighbors,
      sweep: sweep.buffers,
      ...(rowsUpdate === null ? {} : { rowsUpdate: list }),
      ...(gather === null ? {} : { gather }),
    };
    const parallel = new ParallelWhatIf(lab, baselineNeighbors, startThread(script, { workerData }), sweep, gather === null ? null : SharedColumnGather.from(gather), rowsUpdate);
    // A failure shows again on the first toggle, which then falls back.
    parallel.opened = parallel.request(opening, true).reply.then(
      () => undefined,
      () => undefined,
    );
    return parallel;
  }

  /** Measures with the column mask `removed` stopped (DistanceLab.whatIf's, reached on two threads). */
  async whatIf(removed: Uint8Array): Promise<Measures> {
    if (this.replies.failure !== null) return this.lab.whatIf(removed, this.baselineNeighbors);
    // Posted first, so the thread works while this one sums, then helps it sweep; the thread
    // helps with this one's gather once its own half is done.
    const { reply: sampled, ticket } = this.request(removed, false, false, true, this.gather !== null);
    let exact: () => ExactMeasures;
    try {
      exact = this.lab.whatIfExactSums(removed, this.gather === null || ticket === 0 ? undefined : ticket);
    } finally {
      // A click that did not gather (or failed) lets the thread stop waiting for it.
      if (ticket !== 0) this.gather?.pass(ticket);
    }
    try {
      await this.help(ticket, sampled);
      // The exact half's measures once the sweep's blocks are taken: while the thread reads its
      // own off the sweep, rather than before this thread's share of the sweep.
      const exactHalf = exact();
      const measures = joinMeasures(await sampled, exactHalf);
      this.threadAnswers++;
      return measures;
    } catch {
      // The thread failed (or refused): answer here; the exact sums are already at `removed`.
      return this.lab.whatIf(removed, this.baselineNeighbors);
    }
  }

  /**
   * whatIf(removed)'s answer without moving the state the clicks walk (the panel's prefetch
   * while the pointer rests on a term): both halves compute in copies of their state
   * (DistanceLab.speculateExact, SampleSide.speculate), and a whatIf(removed) that comes next
   * adopts them, so it answers at once with the same bits and leaves the same state as if it
   * had computed (test/what-if-speculative.test.ts). Null once the thread has failed (the
   * one-thread fallback does not speculate), and null when `clicks` (the host's count of clicks
   * sent, in shared memory) moves while it computes: both halves then stop part way, so a click
   * never waits for a whole prefetch it did not ask for.
   */
  async speculate(removed: Uint8Array, clicks?: Int32Array): Promise<Measures | null> {
    if (this.replies.failure !== null) return null;
    const seen = clicks === undefined ? 0 : Atomics.load(clicks, 0);
    const { reply, ticket } = this.request(removed, false, clicks === undefined ? true : { counter: clicks, seen }, true);
    const sampled = reply.catch(() => null);
    try {
      const exact = this.lab.speculateExact(removed, clicks === undefined ? undefined : stopOnClick(clicks, seen));
      await this.help(ticket, sampled);
      const half = await sampled;
      return half === null ? null : joinMeasures(half, exact);
    } catch (e) {
      if (e instanceof SpeculationStopped) return null;
      throw e;
    }
  }

  /**
   * Toggles the column with the most sampled postings away from `opening` and back, `rounds`
   * times, the answers thrown away: V8 optimises a toggle's loops only once they have run, so
   * the reader's first three or four clicks used to be the slowest (100k bench, a process without
   * the warm-up: 316–356 ms each where later clicks took ~220).
   * For idle time once the Report is shown. Each undo puts both halves back at `opening`
   * exactly when `opening` was a full pass on both sides (the Report's suggested figures here,
   * the opening build on the thread): they restore those checkpoints, so the answers that
   * follow are bit for bit those without the warm-up (test/what-if-parallel.test.ts).
   */
  async warmUp(opening: Uint8Array, rounds = WARM_UP_ROUNDS): Promise<void> {
    const column = busiestColumn(this.lab.sampleRows);
    if (column < 0) return;
    const flipped = opening.slice();
    flipped[column] = flipped[column] === 0 ? 1 : 0;
    for (let r = 0; r < rounds; r++) {
      await this.whatIf(flipped);
      await this.whatIf(opening);
    }
  }

  async close(): Promise<void> {
    this.fail(new Error('what-if thread closed'));
    await this.worker.terminate();
  }

  /**
   * Posts a request; with `helped`, its sweep is opened to this thread under the request's
   * number (`ticket`, 0 when nothing was posted), for help().
   */
  private request(
    removed: Uint8Array,
    full: boolean,
    speculative: boolean | { counter: Int32Array; seen: number } = false,
    helped = false,
    gather = false,
  ): { reply: Promise<SampledFields>; ticket: number } {
    let ticket = 0;
    const reply = this.replies.request((seq) => {
      const request: SampleRequest =
        speculative === false ? { seq, removed, full } : speculative === true ? { seq, removed, full, speculative: true } : { seq, removed, full, speculative: true, clicks: speculative };
      if (helped) {
        request.ticket = seq;
        ticket = seq;
        if (gather) request.gather = true;
      }
      this.worker.postMessage(request);
      this.worker.ref();
    });
    return { reply, ticket };
  }

  /**
   * This thread's share of sweep `ticket`: waits (without blocking this thread) until the
   * thread opens it, then sweeps blocks of rows until none is left. Returns at once when the
   * sweep is already over, and as soon as `reply` settles (the thread answered or failed
   * without opening it: an error, a prefetch stopped before its sweep).
   */
  private async help(ticket: number, reply: Promise<unknown>): Promise<void> {
    if (ticket === 0) return;
    let settled = false;
    const over = reply.then(
      () => (settled = true),
      () => (settled = true),
    );
    const { array, index } = this.sweep.openedWord;
    for (;;) {
      const opened = Atomics.load(array, index);
      if (opened === ticket) {
        this.helpedBlocks += this.sweep.help(ticket, this.rowsUpdate?.rows);
        return;
      }
      if (opened > ticket || settled || this.replies.failure !== null) return;
      // Bounded, so that no wait outlives the request by much.
      const wait = waitAsync(array, index, opened, 50);
      if (wait.async) await Promise.race([wait.value, over]);
    }
  }

  private fail(e: Error): void {
    this.replies.fail(e);
    this.worker.unref();
  }
}

/** Atomics.waitAsync (ES2024; in Node since 16), typed here as the ES2022 library does not. */
function waitAsync(array: Int32Array, index: number, value: number, timeoutMs: number): { async: false; value: string } | { async: true; value: Promise<string> } {
  return (Atomics as unknown as { waitAsync: typeof waitAsync }).waitAsync(array, index, value, timeoutMs);
}

/** Toggle-and-undo pairs of the warm-up: the bench's clicks settle by about the fourth. */
const WARM_UP_ROUNDS = 2;

/** The column held by the most sampled rows (a function word: the heaviest toggle), or −1 if none. */
function busiestColumn(rows: Csr): number {
  const count = new Uint32Array(rows.cols);
  for (let p = 0, nnz = rows.indptr[rows.rows]!; p < nnz; p++) if (rows.data[p] !== 0) count[rows.indices[p]!]++;
  let best = -1;
  for (let t = 0; t < rows.cols; t++) if (count[t]! > 0 && (best < 0 || count[t]! > count[best]!)) best = t;
  return best;
}
