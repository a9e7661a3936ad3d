import { LastingThreads } from './lasting-thread';

/** The matrix a pass thread reads: a pass goes to it only for the same arrays. */
export interface MatrixTag {
  indptr: Uint32Array;
  indices: Uint32Array;
  data: Float64Array;
}

/**
 * Threads waiting to make maskedTermSums passes (measures/make-passes.ts) over a matrix whose
 * indices and data are on SharedArrayBuffers, by its indices' buffer: the threads that wrote the
 * count matrix's rows (tokenize/row-assembler.ts), which the weighted matrix keeps (it is weighed
 * in place), and the pass threads (measures/start-masked-term-sums.ts).
 */
export const matrixPassThreads = new LastingThreads<MatrixTag>();

/** How long such a thread waits for another pass once its work is done. */
export const PASS_THREAD_WAIT_MS = 3000;

/** Whether `tag` is the matrix of these arrays. */
export function sameMatrix(tag: MatrixTag, m: MatrixTag): boolean {
  return tag.indptr === m.indptr && tag.indices === m.indices && tag.data === m.data;
}
