import { existsSync } from 'node:fs';
import { Worker } from 'node:worker_threads';
import { createTermCoder, type TokenSettings } from './create-tokenizer';
import { batchEncoding, type EncodedBatch } from './encode-batch';
import type { TermCoder } from './term-coder';
import { PendingReplies } from '../threads/pending-replies';
import { takeEarlyThreads } from './early-threads';
import type { TokenizeReply, TokenizeRequest, TokenizeSetup } from './tokenize-messages';

/** Tokenises batches of texts, in this thread or in a pool of worker threads. */
export interface BatchEncoder {
  /** How many batches may usefully be in flight at once. */
  readonly parallelism: number;
  /**
   * Threads tokenising, and so the row writers buildCountMatrix starts beside them (0: this
   * thread tokenises, or a file lane does, and the rows are written in this thread).
   */
  readonly threads: number;
  encode(texts: string[]): Promise<EncodedBatch>;
  close(): Promise<void>;
}

export function inProcessEncoder(tokens: TokenSettings): BatchEncoder {
  return coderEncoder(createTermCoder(tokens));
}

/** Batches encoded in this thread by `coder`, one after another (stream 0). */
export function coderEncoder(coder: TermCoder): BatchEncoder {
  const encodeBatch = batchEncoding(coder);
  return {
    parallelism: 1,
    threads: 0,
    encode: (texts) => Promise.resolve().then(() => encodeBatch(texts)),
    close: () => Promise.resolve(),
  };
}

/**
 * A pool of `workers` threads running `script` (dist/tokenize-worker.js), or null when the
 * script is not there (e.g. tests run from source under tsx) so the caller falls back to
 * in-process. Batches go round-robin; each worker answers in the order it was asked, and its
 * term ids are its own (the batch's `stream` is the worker's number).
 */
export function workerEncoder(tokens: TokenSettings, workers: number, script: string): BatchEncoder | null {
  return startTokenizingThreads(workers, script)?.encoder(tokens) ?? null;
}

/** Tokenising threads started before their settings are known (see startTokenizingThreads). */
export interface TokenizingThreads {
  readonly threads: number;
  /** Sends the settings to every thread and returns the pool as an encoder (once). */
  encoder(tokens: TokenSettings): BatchEncoder;
  close(): Promise<void>;
}

/**
 * A tokenising thread's young generation, capped at 12 MB (semi-spaces of 4 MB; V8's default
 * lets them grow to 16 MB each). The thread makes short-lived strings all along (the texts as
 * they arrive, their lowercase copies, wink's tokens): in the small young generation they die
 * in memory already touched and still in cache, where the grown one kept taking fresh pages
 * (~12 µs of CPU each here). Alternating runs of the 100k reviews: CPU −3 to −5% with either
 * tokenizer, ~10k fewer page faults; 6 MB gave the pattern review as much and the wink review
 * 2% more CPU than 12, 24 MB the pattern review 2% more (docs/performance.md, "Wink's model
 * reads and the tokenising threads' young generation"). The results do not depend on it.
 */
const TOKENIZING_HEAP = { maxYoungGenerationSizeMb: 12 }; // bin/loudword.js starts early threads with the same

/**
 * Starts `workers` tokenising threads without settings: each loads the bundle (~0.1-0.3 s)
 * while the caller reads and checks the settings, and makes its coder (for wink, loading the
 * model) when `encoder(tokens)` sends them. Null when the script is not there or `workers` < 1.
 */
export function startTokenizingThreads(workers: number, script: string): TokenizingThreads | null {
  if (workers < 1 || !existsSync(script)) return null;
  const pool: Worker[] = [];
  // One set of waiting requests per thread: a thread that dies rejects its own; the first failure
  // also refuses every later batch, whichever thread it would go to.
  const replies: PendingReplies<EncodedBatch>[] = [];
  let seq = 0;
  let failure: Error | null = null;
  let configured = false;

  // Threads the launcher started before the CLI's bundle was loaded (early-threads.ts), if they are these.
  const early = takeEarlyThreads(script, workers, TOKENIZING_HEAP.maxYoungGenerationSizeMb);
  for (let w = 0; w < workers; w++) {
    const worker = early?.[w] ?? new Worker(script, { resourceLimits: TOKENIZING_HEAP });
    pool.push(worker);
    replies.push(repliesOf(worker, w, (e) => (failure ??= e)));
  }

  const close = async (): Promise<void> => {
    failure ??= new Error('tokenize pool closed');
    await Promise.all(pool.map((w) => w.terminate()));
  };

  return {
    threads: workers,
    encoder(tokens) {
      if (configured) throw new Error('tokenize pool: settings already sent');
      configured = true;
      const setup: TokenizeSetup = { type: 'settings', tokens };
      for (const worker of pool) worker.postMessage(setup);
      return {
        parallelism: workers * 2,
        threads: workers,
        encode(texts) {
          if (failure !== null) return Promise.reject(failure);
          const s = seq++;
          const w = s % pool.length;
          return postTexts(pool[w]!, replies[w]!, texts, s);
        },
        close,
      };
    },
    close,
  };
}

/** Tokenising threads that each count one file at a time, with a tokeniser fresh for each file. */
export interface FileLanes {
  readonly lanes: number;
  /**
   * An encoder on lane `lane` for its next file, whose tokeniser is made anew (fresh-term-coder.ts)
   * before the file's first batch: the lane's earlier files are forgotten. Ask for it once the
   * lane's previous file is counted. Its `threads` is 0: the file's rows are written in the
   * caller's thread (row writers started for each file would cost more than they save), and
   * closing it leaves the lane for the next file.
   */
  forFile(lane: number, tokens: TokenSettings): BatchEncoder;
  close(): Promise<void>;
}

/**
 * Batches a file lane may hold unanswered (each at most 1 MiB of text, build-count-matrix.ts). The
 * next file is read only once this one is read to its end, so with two batches in flight, as
 * for one corpus, this thread read each file at its lane's pace and the other lane had nothing
 * to do until the file's last batches; a backlog lets it read ahead and start the next file.
 */
const LANE_BACKLOG = 32;

/**
 * `lanes` threads running `script` (dist/tokenize-worker.js) for a corpus of many files
 * (matrix/count-each-file.ts), or null when the script is not there (tests from source) or
 * `lanes` < 1: the caller then counts the files in its own thread.
 */
export function startFileLanes(lanes: number, script: string): FileLanes | null {
  if (lanes < 1 || !existsSync(script)) return null;
  const pool: Worker[] = [];
  const replies: PendingReplies<EncodedBatch>[] = [];
  for (let w = 0; w < lanes; w++) {
    const worker = new Worker(script, { resourceLimits: TOKENIZING_HEAP });
    pool.push(worker);
    // Each file is counted on its own (its own CountAccumulator), so every batch is stream 0.
    replies.push(repliesOf(worker, 0));
  }
  return {
    lanes,
    forFile(lane, tokens) {
      const worker = pool[lane]!;
      const waiting = replies[lane]!;
      const setup: TokenizeSetup = { type: 'settings', tokens, fresh: true };
      worker.postMessage(setup);
      return {
        parallelism: LANE_BACKLOG,
        threads: 0,
        encode: (texts) => postTexts(worker, waiting, texts),
        close: () => Promise.resolve(),
      };
    },
    async close() {
      for (const waiting of replies) waiting.fail(new Error('tokenize lanes closed'));
      await Promise.all(pool.map((w) => w.terminate()));
    },
  };
}

/**
 * The requests waiting for `worker`'s batches, which are filed as stream `stream`. A failure of
 * the thread (an error, an exit) rejects them all and every later one; `onFailure` hears it first.
 */
function repliesOf(worker: Worker, stream: number, onFailure: (e: Error) => void = () => undefined): PendingReplies<EncodedBatch> {
  const waiting = new PendingReplies<EncodedBatch>();
  const fail = (e: Error): void => {
    onFailure(e);
    waiting.fail(e);
  };
  worker.on('message', (reply: TokenizeReply) => {
    if (reply.batch !== null) waiting.resolve(reply.seq, received(reply.batch, stream));
    else waiting.reject(reply.seq, new Error(`tokenize worker: ${reply.error ?? 'no reply'}`));
  });
  worker.on('error', fail);
  worker.on('exit', (code) => fail(new Error(`tokenize worker exited with code ${code}`)));
  return waiting;
}

/** Sends `texts` to `worker` to be tokenised, as request `id` (by default the next) of `waiting`. */
function postTexts(worker: Worker, waiting: PendingReplies<EncodedBatch>, texts: string[], id?: number): Promise<EncodedBatch> {
  return waiting.request((seq) => {
    const request: TokenizeRequest = { type: 'texts', seq, texts };
    worker.postMessage(request);
  }, id);
}

/**
 * A batch as it came from thread `stream`, rebuilt as one object literal. The objects the
 * structured clone makes take their maps from its own transitions, and `{ ...batch, stream }` kept
 * them: the main thread's CountAccumulator.add, compiled for one of those maps, was deoptimised
 * for a "wrong map" a dozen times at 100k documents (--trace-deopt), each time back to the
 * interpreter and then compiled again. Every batch read here has the literal's one map.
 */
function received(b: EncodedBatch, stream: number): EncodedBatch {
  return {
    stream,
    firstNewId: b.firstNewId,
    newTerms: b.newTerms,
    rowEnds: b.rowEnds,
    cols: b.cols,
    counts: b.counts,
    tokens: b.tokens,
    previews: b.previews,
    longRunDocs: b.longRunDocs,
    longRuns: b.longRuns,
  };
}
