import { strict as assert } from 'node:assert';
import { sortByCodePoint } from '../extension/src/engine/matrix/compare-code-points';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { TermIndex } from '../extension/src/engine/what-if/term-index';

// TermIndex finds a term's column by binary search over the vocabulary, which is in code point
// order (the matrix's columns, as scikit-learn's vocabulary_). Checked against a map of the same
// vocabulary, with astral characters and U+E000-U+FFFF units, where UTF-16 order would differ.

describe('what-if/term-index', () => {
  const random = mulberry32(7);
  const alphabet = ['a', 'b', 'z', 'é', '\ue000', '\uffff', '😀', '𝒳', '中', "'"];
  const word = (): string => Array.from({ length: 1 + Math.floor(random() * 5) }, () => alphabet[Math.floor(random() * alphabet.length)]).join('');
  const terms = sortByCodePoint([...new Set(Array.from({ length: 5000 }, word))]);

  it('finds every term at its column and no other string, as a map would', () => {
    const index = new TermIndex(terms);
    const columnOf = new Map(terms.map((t, j) => [t, j]));
    const asked = [...terms, ...Array.from({ length: 5000 }, word), '', 'constructor', '__proto__'];
    for (const t of asked) assert.equal(index.column(t), columnOf.get(t), t);
    const some = [terms[3]!, 'no such term', terms[terms.length - 1]!];
    assert.deepEqual(index.columnsOf(some), [3, terms.length - 1]);
    const mask = index.mask(some);
    assert.deepEqual([...mask.keys()].filter((j) => mask[j] === 1), [3, terms.length - 1]);
  });

  it('refuses a vocabulary out of code point order', () => {
    assert.throws(() => new TermIndex(['b', 'a']), /not in code point order/);
    assert.throws(() => new TermIndex(['\uffff', '😀', 'a']), /not in code point order/);
    assert.doesNotThrow(() => new TermIndex(['a', '\uffff', '😀']));
    assert.throws(() => new TermIndex(['a', 'a']), /not in code point order/);
  });
});
