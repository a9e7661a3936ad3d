import { compareCodePoints } from '../matrix/compare-code-points';

/**
 * Term ⇄ column look-ups over a vocabulary in code point order (the matrix's columns), and column
 * masks built from term lists. A term is found by binary search: a review asks for a few
 * thousand terms at most (the stop list, the prior's words, a click's terms), and a `Map` of the
 * 115k terms of the 100k bench corpus took ~40-65 ms to build, on the review's thread, before
 * anything could be measured (docs/performance.md).
 */
export class TermIndex {
  constructor(readonly terms: readonly string[]) {
    for (let j = 1; j < terms.length; j++) {
      if (compareCodePoints(terms[j - 1]!, terms[j]!) >= 0) throw new Error(`TermIndex: the terms are not in code point order at ${j} ("${terms[j - 1]}", "${terms[j]}")`);
    }
  }

  column(term: string): number | undefined {
    const { terms } = this;
    let lo = 0;
    let hi = terms.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (compareCodePoints(terms[mid]!, term) < 0) lo = mid + 1;
      else hi = mid;
    }
    return lo < terms.length && terms[lo] === term ? lo : undefined;
  }

  has(term: string): boolean {
    return this.column(term) !== undefined;
  }

  /** Columns of the terms that are in the vocabulary; unknown terms are skipped. */
  columnsOf(terms: Iterable<string>): number[] {
    const out: number[] = [];
    for (const t of terms) {
      const j = this.column(t);
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
