import type { Csr } from '../../extension/src/engine/matrix/csr';

/**
 * Unit rows over `cols` terms shaped like text: a few terms in most rows (the loud ones a user
 * toggles), a long tail of rare ones, some exact duplicate rows, some rows of one or two terms
 * (they empty out when those terms are stopped), and tf-idf-like positive weights.
 */
export function textLikeRows(rows: number, cols: number, random: () => number): Csr {
  const indptr = new Uint32Array(rows + 1);
  const indices: number[] = [];
  const data: number[] = [];
  let previous: Array<[number, number]> = [];
  for (let r = 0; r < rows; r++) {
    let entries: Array<[number, number]>;
    if (r > 0 && random() < 0.05) entries = previous;
    else {
      const chosen = new Map<number, number>();
      const length = random() < 0.1 ? 1 + Math.floor(random() * 2) : 3 + Math.floor(random() * 12);
      for (let e = 0; e < length; e++) {
        // Zipf-like: the column is the floor of cols·u³, so low columns are common.
        const u = random();
        const t = Math.min(cols - 1, Math.floor(cols * u * u * u));
        chosen.set(t, (chosen.get(t) ?? 0) + 0.5 + random());
      }
      entries = [...chosen.entries()].sort((a, b) => a[0] - b[0]);
    }
    previous = entries;
    const norm = Math.hypot(...entries.map((e) => e[1]));
    for (const [t, w] of entries) {
      indices.push(t);
      data.push(w / norm);
    }
    indptr[r + 1] = indices.length;
  }
  return { rows, cols, indptr, indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}
