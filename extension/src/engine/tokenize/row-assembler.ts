import { existsSync } from 'node:fs';
import { Worker, type MessagePort } from 'node:worker_threads';
import { matrixPassThreads, PASS_THREAD_WAIT_MS } from '../threads/matrix-pass-threads';
import { PendingReplies } from '../threads/pending-replies';
import type { CountedPart } from './rows-in-rank-order';
import type { AssembleReply, AssembleRequest } from './tokenize-messages';
import type { EffectiveSettings } from '../../protocol';

/**
 * How the threads weigh each row right after they have written it (matrix/weigh.ts, weighRow): the
 * matrix's idf, tf and norm. The caller knows the idf before the rows are written when pruning
 * keeps every column (build-count-matrix.ts).
 */
export interface RowWeighing {
  idf: Float64Array;
  tf: EffectiveSettings['weighting']['tf'];
  norm: EffectiveSettings['weighting']['norm'];
}

/** The matrix's columns (ranks[stream][id]: the column of a coder's term id) and where each part goes. */
export interface AssembleJob {
  ranks: Uint32Array[];
  /** How many columns the matrix has. */
  columns: number;
  /** The matrix's row pointers (rows + 1), for the passes the threads make over it afterwards. */
  indptr: Uint32Array;
  /** On SharedArrayBuffers, so that every thread writes into the one matrix. */
  indices: Uint32Array;
  data: Float64Array;
  parts: CountedPart[];
  starts: number[];
  /** null: `data` gets the raw counts; else their weights, each row weighed as it is written. */
  weigh: RowWeighing | null;
}

/** Threads that write the finished count matrix's rows, each a run of consecutive parts. */
export interface RowAssembler {
  /**
   * Writes every part; the parts' arrays are handed over (transferred), not copied. The threads
   * that wrote then wait a while for passes over the matrix (engine/threads/matrix-pass-threads.ts).
   */
  assemble(job: AssembleJob): Promise<void>;
  /** Stops the threads that are not waiting for passes. */
  close(): Promise<void>;
}

/**
 * `threads` threads running `script` (dist/assemble-worker.js), or null when the script is not
 * there (tests run from source), so the caller writes the rows itself. Started while the last
 * batches are tokenised, so that they are ready when the vocabulary is complete.
 */
export function startRowAssembler(threads: number, script: string): RowAssembler | null {
  if (threads < 1 || !existsSync(script)) return null;
  const pool: Worker[] = [];
  // A request's number is its thread's index: each thread writes one run of parts per job.
  const pending = new PendingReplies<null>();
  // Threads handed to matrixPassThreads once they have written: they leave on their own.
  const kept = new Set<Worker>();
  for (let w = 0; w < threads; w++) {
    const worker = new Worker(script);
    worker.on('message', (reply: AssembleReply) => {
      if (reply.error === null) pending.resolve(reply.seq, null);
      else pending.reject(reply.seq, new Error(`assemble worker: ${reply.error}`));
    });
    worker.on('error', (e) => pending.fail(e));
    worker.on('exit', (code) => pending.fail(new Error(`assemble worker exited with code ${code}`)));
    pool.push(worker);
  }
  return {
    async assemble(job) {
      // Consecutive runs of parts of about equal non-zeros, one run per thread.
      let total = 0;
      for (const p of job.parts) total += p.cols.length;
      const shares: number[][] = pool.map(() => []);
      let done = 0;
      for (let k = 0; k < job.parts.length; k++) {
        shares[Math.min(pool.length - 1, Math.floor((done * pool.length) / Math.max(1, total)))]!.push(k);
        done += job.parts[k]!.cols.length;
      }
      const tag = { indptr: job.indptr, indices: job.indices, data: job.data };
      await Promise.all(
        shares.map(async (share, w) => {
          if (share.length === 0) return;
          const parts = share.map((k) => job.parts[k]!);
          const link = matrixPassThreads.prepare(PASS_THREAD_WAIT_MS);
          const transfer: Array<ArrayBuffer | MessagePort> = [link.link.port];
          for (const p of parts) transfer.push(p.rowEnds.buffer as ArrayBuffer, p.cols.buffer as ArrayBuffer, p.counts.buffer as ArrayBuffer);
          const request: AssembleRequest = { type: 'assemble', seq: w, ranks: job.ranks, columns: job.columns, indptr: job.indptr, indices: job.indices, data: job.data, parts, starts: share.map((k) => job.starts[k]!), weigh: job.weigh, link: link.link };
          try {
            await pending.request(() => pool[w]!.postMessage(request, transfer), w);
          } catch (e) {
            link.cancel();
            throw e;
          }
          // Written: the thread now waits for passes over this matrix.
          kept.add(pool[w]!);
          link.keep(pool[w]!, job.indices.buffer, tag);
        }),
      );
    },
    async close() {
      pending.fail(new Error('assemble pool closed'));
      await Promise.all(pool.filter((w) => !kept.has(w)).map((w) => w.terminate()));
    },
  };
}
