/** A growing list of term ids (or counts) in one Uint32Array, reused between documents. */
export class IdList {
  private a: Uint32Array;
  length = 0;

  constructor(capacity = 1024) {
    this.a = new Uint32Array(Math.max(16, capacity));
  }

  push(id: number): void {
    if (this.length === this.a.length) this.grow(this.length + 1);
    this.a[this.length++] = id;
  }

  at(i: number): number {
    return this.a[i]!;
  }

  /** The backing array; valid up to `length` until the next push. */
  get array(): Uint32Array {
    return this.a;
  }

  /** Makes room for `n` more ids without growing again. */
  reserve(n: number): void {
    if (this.length + n > this.a.length) this.grow(this.length + n);
  }

  /** A copy of the ids from `start` (default 0) to the end, sized exactly. */
  slice(start = 0): Uint32Array {
    return this.a.slice(start, this.length);
  }

  private grow(needed: number): void {
    let size = this.a.length * 2;
    while (size < needed) size *= 2;
    const grown = new Uint32Array(size);
    grown.set(this.a.subarray(0, this.length));
    this.a = grown;
  }
}
