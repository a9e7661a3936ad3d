import { existsSync } from 'node:fs';
import { Worker } from 'node:worker_threads';
import { PendingReplies } from '../threads/pending-replies';
import type { CountedPart } from './rows-in-rank-order';
import type { AssembleReply, AssembleRequest } from './tokenize-messages';

/** The matrix's columns (ranks[stream][id]: the column of a coder's term id) and where each part goes. */
export interface AssembleJob {
  ranks: Uint32Array[];
  /** How many columns the matrix has. */
  columns: number;
  /** On SharedArrayBuffers, so that every thread writes into the one matrix. */
  indices: Uint32Array;
  data: Float64Array;
  parts: CountedPart[];
  starts: number[];
}

/** Threads that write the finished count matrix's rows, each a run of consecutive parts. */
export interface RowAssembler {
  /** Writes every part; the parts' arrays are handed over (transferred), not copied. */
  assemble(job: AssembleJob): Promise<void>;
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
      await Promise.all(
        shares.map((share, w) => {
          if (share.length === 0) return Promise.resolve(null);
          const parts = share.map((k) => job.parts[k]!);
          const transfer: ArrayBuffer[] = [];
          for (const p of parts) transfer.push(p.rowEnds.buffer as ArrayBuffer, p.cols.buffer as ArrayBuffer, p.counts.buffer as ArrayBuffer);
          const request: AssembleRequest = { type: 'assemble', seq: w, ranks: job.ranks, columns: job.columns, indices: job.indices, data: job.data, parts, starts: share.map((k) => job.starts[k]!) };
          return pending.request(() => pool[w]!.postMessage(request, transfer), w);
        }),
      );
    },
    async close() {
      pending.fail(new Error('assemble pool closed'));
      await Promise.all(pool.map((w) => w.terminate()));
    },
  };
}
