/**
 * A counted batch (encode-batch.ts): document d's distinct terms are cols[rowEnds[d-1] ..
 * rowEnds[d]) (rowEnds[-1] = 0), with their counts; the ids are those of the coder that made
 * it, whose ranks are ranks[stream].
 */
export interface CountedPart {
  stream: number;
  rowEnds: Uint32Array;
  cols: Uint32Array;
  counts: PartCounts;
}

/** A part's counts: 16-bit when every one fits (encode-batch.ts, packedCounts), else 32-bit. */
export type PartCounts = Uint16Array | Uint32Array;

/** Bits of the column rank sorted per radix pass (a 2,048-entry histogram). */
const RADIX_BITS = 11;
const RADIX_MASK = (1 << RADIX_BITS) - 1;

/**
 * Writes counted parts into a CSR matrix's `indices` and `data` with each row's columns
 * ascending: ranks[stream][id] is the final column of a coder's term id (code point order of
 * the terms). The threads that assemble the matrix (row-assembler.ts) run it on their own share
 * of the parts once the vocabulary is complete: each part writes only its own rows, so the
 * shares never overlap and the result does not depend on who wrote which part.
 *
 * Rows in column order by counting, not by sorting each row (an insertion sort per row cost
 * ~1.2 s of the main thread at 100k documents): a part's entries are sorted by rank with a
 * stable radix sort (11 bits a pass, part-sized arrays that stay in cache), carrying only each
 * entry's position in the part, and then dealt into their rows in that order, so every row
 * receives its columns ascending. Linear in the non-zeros.
 */
export class RowWriter {
  private readonly passes: number;
  private readonly histogram = new Uint32Array(1 << RADIX_BITS);
  private keyA = new Uint32Array(0);
  private keyB = new Uint32Array(0);
  private atA = new Uint32Array(0);
  private atB = new Uint32Array(0);
  private rowOf = new Uint32Array(0);
  private fill = new Uint32Array(0);

  /** `columns`: how many columns the matrix has (every rank is below it). */
  constructor(
    private readonly ranks: readonly Uint32Array[],
    columns: number,
    private readonly indices: Uint32Array,
    private readonly data: Float64Array,
  ) {
    this.passes = Math.max(1, Math.ceil(Math.log2(Math.max(2, columns)) / RADIX_BITS));
  }

  /** Writes `part`, whose first row starts at `start` in `indices`/`data`. */
  write(part: CountedPart, start: number): void {
    const { rowEnds, cols, counts } = part;
    const n = cols.length;
    const rows = rowEnds.length;
    if (this.keyA.length < n) {
      this.keyA = new Uint32Array(n);
      this.keyB = new Uint32Array(n);
      this.atA = new Uint32Array(n);
      this.atB = new Uint32Array(n);
      this.rowOf = new Uint32Array(n);
    }
    if (this.fill.length < rows) this.fill = new Uint32Array(rows);
    const rank = this.ranks[part.stream]!;
    const { histogram, rowOf, fill } = this;
    let key = this.keyA;
    let at = this.atA;
    let k = 0;
    for (let d = 0; d < rows; d++) {
      fill[d] = start + k;
      const end = rowEnds[d]!;
      for (; k < end; k++) {
        key[k] = rank[cols[k]!]!;
        at[k] = k;
        rowOf[k] = d;
      }
    }
    let key2 = this.keyB;
    let at2 = this.atB;
    for (let pass = 0; pass < this.passes; pass++) {
      const shift = pass * RADIX_BITS;
      histogram.fill(0);
      for (let i = 0; i < n; i++) histogram[(key[i]! >>> shift) & RADIX_MASK]++;
      let sum = 0;
      for (let h = 0; h < histogram.length; h++) {
        const c = histogram[h]!;
        histogram[h] = sum;
        sum += c;
      }
      for (let i = 0; i < n; i++) {
        const to = histogram[(key[i]! >>> shift) & RADIX_MASK]!++;
        key2[to] = key[i]!;
        at2[to] = at[i]!;
      }
      [key, key2] = [key2, key];
      [at, at2] = [at2, at];
    }
    const { indices, data } = this;
    for (let i = 0; i < n; i++) {
      const from = at[i]!;
      const to = fill[rowOf[from]!]!++;
      indices[to] = key[i]!;
      data[to] = counts[from]!;
    }
  }
}
