/** Term ⇄ column look-ups over a vocabulary, and column masks built from term lists. */
export class TermIndex {
  private readonly columns: Map<string, number>;

  constructor(readonly terms: readonly string[]) {
    this.columns = new Map();
    for (let j = 0; j < terms.length; j++) this.columns.set(terms[j]!, j);
  }

  column(term: string): number | undefined {
    return this.columns.get(term);
  }

  has(term: string): boolean {
    return this.columns.has(term);
  }

  /** Columns of the terms that are in the vocabulary; unknown terms are skipped. */
  columnsOf(terms: Iterable<string>): number[] {
    const out: number[] = [];
    for (const t of terms) {
      const j = this.columns.get(t);
      if (j !== undefined) out.push(j);
    }
    return out;
  }

  /** A column mask (1 = removed) with the given terms set. */
  mask(terms: Iterable<string>): Uint8Array {
    const mask = new Uint8Array(this.terms.length);
    for (const j of this.columnsOf(terms)) mask[j] = 1;
    return mask;
  }
}
