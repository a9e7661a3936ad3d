import { existsSync } from 'node:fs';
import { Worker } from 'node:worker_threads';
import { createTermCoder, type TokenSettings } from './create-tokenizer';
import { batchEncoding, type EncodedBatch } from './encode-batch';
import type { TermCoder } from './term-coder';
import type { CountedPart } from './rows-in-rank-order';
import type { AssembleRequest, TokenizeReply, TokenizeRequest } from './tokenize-messages';

/** Tokenises batches of texts, in this thread or in a pool of worker threads. */
export interface BatchEncoder {
  /** How many batches may usefully be in flight at once. */
  readonly parallelism: number;
  encode(texts: string[]): Promise<EncodedBatch>;
  /**
   * Present on a pool of threads: writes the counted parts into `indices` and `data` (both on
   * SharedArrayBuffers) on the pool's threads, part k's first row at starts[k]
   * (rows-in-rank-order.ts). The parts' arrays are handed over (transferred), not copied.
   */
  assemble?(job: AssembleJob): Promise<void>;
  close(): Promise<void>;
}

/** The matrix's columns (ranks[stream][id]: the column of a coder's term id) and where each part goes. */
export interface AssembleJob {
  ranks: Uint32Array[];
  /** How many columns the matrix has. */
  columns: number;
  indices: Uint32Array;
  data: Float64Array;
  parts: CountedPart[];
  starts: number[];
}

export function inProcessEncoder(tokens: TokenSettings): BatchEncoder {
  return coderEncoder(createTermCoder(tokens));
}

/** Batches encoded in this thread by `coder`, one after another (stream 0). */
export function coderEncoder(coder: TermCoder): BatchEncoder {
  const encodeBatch = batchEncoding(coder);
  return {
    parallelism: 1,
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
  if (workers < 1 || !existsSync(script)) return null;
  const pending = new Map<number, { settle(reply: TokenizeReply): void; reject(e: Error): void; worker: number }>();
  const pool: Worker[] = [];
  let seq = 0;
  // Batches go round-robin by their own count, so which thread tokenises which batch never
  // depends on timing (each thread's wink instance carries state from batch to batch).
  let batches = 0;
  let failure: Error | null = null;

  const failAll = (worker: number, e: Error): void => {
    failure ??= e;
    for (const [s, p] of pending) {
      if (p.worker !== worker) continue;
      pending.delete(s);
      p.reject(e);
    }
  };

  for (let w = 0; w < workers; w++) {
    const worker = new Worker(script, { workerData: { tokens } });
    worker.on('message', (reply: TokenizeReply) => {
      const p = pending.get(reply.seq);
      if (p === undefined) return;
      pending.delete(reply.seq);
      if (reply.error !== null) p.reject(new Error(`tokenize worker: ${reply.error}`));
      else p.settle(reply);
    });
    worker.on('error', (e) => failAll(w, e));
    worker.on('exit', (code) => failAll(w, new Error(`tokenize worker exited with code ${code}`)));
    pool.push(worker);
  }

  const ask = <T>(w: number, request: TokenizeRequest | AssembleRequest, answer: (reply: TokenizeReply) => T, transfer: ArrayBuffer[] = []): Promise<T> => {
    if (failure !== null) return Promise.reject(failure);
    return new Promise<T>((resolve, reject) => {
      pending.set(request.seq, { settle: (reply) => resolve(answer(reply)), reject, worker: w });
      pool[w]!.postMessage(request, transfer);
    });
  };

  return {
    parallelism: workers * 2,
    encode(texts) {
      const w = batches++ % pool.length;
      return ask(w, { type: 'tokenize', seq: seq++, texts }, (reply) => {
        if (reply.batch === null) throw new Error('tokenize worker: no batch in its reply');
        return { ...reply.batch, stream: w };
      });
    },
    async assemble(job) {
      // Consecutive runs of parts of about equal non-zeros, one run per thread.
      let total = 0;
      for (const p of job.parts) total += p.cols.length;
      const shares: number[][] = pool.map(() => []);
      let done = 0;
      for (let k = 0; k < job.parts.length; k++) {
        const w = Math.min(pool.length - 1, Math.floor((done * pool.length) / Math.max(1, total)));
        shares[w]!.push(k);
        done += job.parts[k]!.cols.length;
      }
      await Promise.all(
        shares.map((share, w) => {
          if (share.length === 0) return Promise.resolve();
          const parts = share.map((k) => job.parts[k]!);
          const transfer: ArrayBuffer[] = [];
          for (const p of parts) transfer.push(p.rowEnds.buffer as ArrayBuffer, p.cols.buffer as ArrayBuffer, p.counts.buffer as ArrayBuffer);
          const request: AssembleRequest = { type: 'assemble', seq: seq++, ranks: job.ranks, columns: job.columns, indices: job.indices, data: job.data, parts, starts: share.map((k) => job.starts[k]!) };
          return ask(w, request, () => undefined, transfer);
        }),
      );
    },
    async close() {
      failure ??= new Error('tokenize pool closed');
      await Promise.all(pool.map((w) => w.terminate()));
    },
  };
}
