import type { Csr } from '../matrix/csr';
import { DONE, DROPPED, FAILED } from '../threads/one-shot-thread';
import { maskedTermSums } from './masked-term-sums';
import type { MaskedTermSumsWork } from './start-masked-term-sums';

/**
 * In a pass thread (masked-term-sums-thread.ts, or a thread that wrote the count matrix's rows:
 * matrix-thread.ts): the passes of `work` over X, one after the other, each written into its
 * shared result arrays, then its status word set and notified (a one-shot job,
 * engine/threads/one-shot-thread.ts). A pass the caller dropped is not made; from a pass that
 * throws on, every pass is left FAILED for the caller to compute.
 */
export function makePasses(X: Csr, { passes, status }: MaskedTermSumsWork): void {
  for (let i = 0; i < passes.length; i++) {
    if (Atomics.load(status, i) === DROPPED) continue;
    const { removed, withSpread, out } = passes[i]!;
    try {
      // Added straight into the shared answer (fresh zeros, as maskedTermSums's own would be):
      // no second set of arrays, whose fresh pages cost ~900 page faults a pass at 100k documents,
      // and no copy.
      const { rowsWithWeight } = maskedTermSums(X, removed, withSpread, out.rowNorm2, out);
      out.rowsWithWeight[0] = rowsWithWeight;
      Atomics.store(status, i, DONE);
      Atomics.notify(status, i);
    } catch {
      for (let j = i; j < passes.length; j++) {
        Atomics.store(status, j, FAILED);
        Atomics.notify(status, j);
      }
      return;
    }
  }
}
