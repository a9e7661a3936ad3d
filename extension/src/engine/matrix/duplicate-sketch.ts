import { fmix32 } from '../random/place-hash';
import type { Csr } from './csr';

/**
 * Distinct rows the sketch keeps: the bottom-k of their hashes, each with how many rows share it.
 * Up to this many distinct documents the count of duplicates is exact; beyond it, estimated
 * (duplicatesOf) with a relative error of about 1/√k (≈ 1.6%) of the distinct documents.
 */
export const DUPLICATE_SKETCH_SIZE = 4096;

/** One distinct row: its 53-bit hash and how many rows hold it. */
export interface SketchEntry {
  key: number;
  copies: number;
}

/**
 * Which documents repeat another exactly, as a bottom-k sketch of their rows' hashes (Cohen &
 * Kaplan, "Summarizing data using bottom-k sketches", PODC 2007, as the sample's places are
 * drawn): the k smallest distinct row hashes with their copies. Identical rows hash alike, so a
 * hash is in a part's sketch whenever it is in the whole's, and the sketches of shards merge into
 * exactly the sketch of their union: a review in shards counts what one process counts.
 */
export interface DuplicateSketch {
  /** The k smallest distinct row hashes, ascending, with their copies. */
  entries: SketchEntry[];
  /** More distinct rows were seen than the sketch keeps: the count is an estimate. */
  truncated: boolean;
}

/**
 * The sketch of a matrix's rows. A row's hash mixes every column and the bits of its value, so
 * two documents hash alike when their weighted rows are equal — the same terms in the same
 * proportions, at distance 0 from each other. Rows with no entry (nothing left to weigh) are left
 * out: they are no document's duplicate.
 */
export function sketchRows(m: Csr, k: number = DUPLICATE_SKETCH_SIZE): DuplicateSketch {
  const { rows, indptr, indices, data } = m;
  const bits = new Uint32Array(data.buffer, data.byteOffset, data.length * 2);
  const keys = new Float64Array(rows);
  let n = 0;
  for (let r = 0; r < rows; r++) {
    const start = indptr[r]!;
    const end = indptr[r + 1]!;
    if (start === end) continue;
    let a = 0x2545f491;
    let b = 0x9e3779b9;
    // MurmurHash3's body step per entry (multiply, rotate) in two lanes, its finaliser per row:
    // two multiplications an entry, where a finaliser per entry cost three times as much.
    for (let p = start; p < end; p++) {
      const col = indices[p]!;
      a = Math.imul(a ^ bits[2 * p]!, 0xcc9e2d51) + col;
      a = (a << 15) | (a >>> 17);
      b = Math.imul(b ^ bits[2 * p + 1]!, 0x1b873593) + col;
      b = (b << 13) | (b >>> 19);
    }
    a = fmix32((a ^ (end - start)) >>> 0);
    b = fmix32((b ^ a) >>> 0);
    keys[n++] = (a >>> 11) * 4294967296 + b;
  }
  const sorted = keys.subarray(0, n).sort();
  const entries: SketchEntry[] = [];
  let truncated = false;
  for (let i = 0; i < n; ) {
    let j = i + 1;
    while (j < n && sorted[j] === sorted[i]) j++;
    if (entries.length === k) {
      truncated = true;
      break;
    }
    entries.push({ key: sorted[i]!, copies: j - i });
    i = j;
  }
  return { entries, truncated };
}

/**
 * The sketch of the union of the parts' rows (each a sketch of the same size k). A hash among the
 * union's k smallest is among the k smallest of every part that holds it (fewer than k of that
 * part's hashes are smaller), so every part kept it with all its copies: the first k of the
 * merged hashes, with their summed copies, are exactly the sketch of the whole.
 */
export function mergeSketches(parts: readonly DuplicateSketch[], k: number = DUPLICATE_SKETCH_SIZE): DuplicateSketch {
  const copies = new Map<number, number>();
  let truncated = false;
  for (const part of parts) {
    truncated ||= part.truncated;
    for (const e of part.entries) copies.set(e.key, (copies.get(e.key) ?? 0) + e.copies);
  }
  const keys = Float64Array.from(copies.keys()).sort();
  if (keys.length > k) truncated = true;
  return { entries: Array.from(keys.subarray(0, k), (key) => ({ key, copies: copies.get(key)! })), truncated };
}

/**
 * Documents that repeat an earlier one (a group of c equal documents counts c − 1). Exact when the
 * sketch holds every distinct row; otherwise its entries are a uniform sample of the distinct
 * rows by hash, so their mean extra copies times the distinct rows estimated from the k-th
 * smallest hash (the KMV estimator: (k − 1) / that hash scaled to [0, 1); Bar-Yossef et al.,
 * "Counting distinct elements in a data stream", RANDOM 2002) estimates it.
 */
export function duplicatesOf(sketch: DuplicateSketch): { documents: number; exact: boolean } {
  let extra = 0;
  for (const e of sketch.entries) extra += e.copies - 1;
  const k = sketch.entries.length;
  if (!sketch.truncated || k < 2) return { documents: extra, exact: true };
  const largest = sketch.entries[k - 1]!.key / 9007199254740992;
  const distinct = (k - 1) / largest;
  return { documents: Math.round((distinct * extra) / k), exact: false };
}
