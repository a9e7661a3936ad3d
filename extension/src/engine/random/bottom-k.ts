import { compareUtf8 } from './compare-utf8';

/** A candidate for a bottom-k sample: its key, and its place to break (astronomically rare) ties. */
export interface Ranked {
  key: number;
  file: string;
  line: number;
}

/** Orders by key, then by place; a total order, so every reader keeps the same k. */
export function compareRanked(a: Ranked, b: Ranked): number {
  return a.key - b.key || compareUtf8(a.file, b.file) || a.line - b.line;
}

/**
 * Keeps the k smallest items seen (Cohen & Kaplan's bottom-k, PODC 2007) in a max-heap: O(log k)
 * per item, memory for k items only, the same k items whatever order they arrive in.
 */
export class BottomK<T extends Ranked> {
  private readonly heap: T[] = [];

  constructor(readonly k: number) {
    if (!Number.isInteger(k) || k < 0) throw new RangeError(`BottomK: k must be a non-negative integer, got ${k}`);
  }

  get size(): number {
    return this.heap.length;
  }

  /** Would an item with this rank be kept? (Lets a caller skip building items that would not be.) */
  admits(item: Ranked): boolean {
    return this.heap.length < this.k || compareRanked(item, this.heap[0]!) < 0;
  }

  push(item: T): void {
    const h = this.heap;
    if (h.length < this.k) {
      h.push(item);
      let i = h.length - 1;
      while (i > 0) {
        const parent = (i - 1) >> 1;
        if (compareRanked(h[parent]!, h[i]!) >= 0) break;
        [h[parent], h[i]] = [h[i]!, h[parent]!];
        i = parent;
      }
      return;
    }
    if (this.k === 0 || compareRanked(item, h[0]!) >= 0) return;
    h[0] = item;
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let top = i;
      if (l < h.length && compareRanked(h[l]!, h[top]!) > 0) top = l;
      if (r < h.length && compareRanked(h[r]!, h[top]!) > 0) top = r;
      if (top === i) break;
      [h[top], h[i]] = [h[i]!, h[top]!];
      i = top;
    }
  }

  /** The kept items, smallest first. */
  items(): T[] {
    return [...this.heap].sort(compareRanked);
  }
}
