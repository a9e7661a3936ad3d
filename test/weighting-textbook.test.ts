import { strict as assert } from 'node:assert';
import type { CountMatrix, Csr } from '../extension/src/engine/matrix/csr';
import { weigh, weighInPlace } from '../extension/src/engine/matrix/weigh';
import { countMatrix } from './matrix-fixtures';

function denseRow(m: Csr, r: number): number[] {
  const out = new Array<number>(m.cols).fill(0);
  for (let k = m.indptr[r]!; k < m.indptr[r + 1]!; k++) out[m.indices[k]!] = m.data[k]!;
  return out;
}

function assertClose(actual: number[], expected: number[], tolerance: number, what: string): void {
  assert.equal(actual.length, expected.length, what);
  actual.forEach((a, i) => assert.ok(Math.abs(a - expected[i]!) <= tolerance, `${what}[${i}]: ${a} vs ${expected[i]}`));
}

describe('weighting against published examples', () => {
  // Source: scikit-learn user guide, "Tf–idf term weighting", TfidfTransformer example
  // (docs/methods.md §1; values recomputed there with scikit-learn 1.2.1, printed to 8 decimals).
  const guideCounts = countMatrix([[3, 0, 1], [2, 0, 0], [3, 0, 0], [4, 0, 0], [3, 2, 0], [3, 0, 2]]);

  it('weigh raw/plainPlusOne/l2 gives the user guide\'s smooth_idf=False rows', () => {
    const { weights } = weigh(guideCounts, { tf: 'raw', idf: 'plainPlusOne', norm: 'l2' });
    assertClose(denseRow(weights, 0), [0.81940995, 0, 0.57320793], 5e-9, 'row 1');
    assertClose(denseRow(weights, 4), [0.47330339, 0.88089948, 0], 5e-9, 'row 5');
  });

  it('weighInPlace gives weigh\'s weights bit for bit, written over the counts\' data, for every tf kind', () => {
    // The reference is weigh, checked against the user guide and IIR in this file.
    for (const tf of ['raw', 'sublinear', 'binary'] as const) {
      const counts = countMatrix([[3, 0, 1], [2, 0, 0], [0, 0, 0], [4, 7, 0], [3, 2, 0], [3, 0, 2]]);
      const want = weigh(counts, { tf, idf: 'smooth', norm: 'l2' });
      const got = weighInPlace(counts, { tf, idf: 'smooth', norm: 'l2' });
      assert.equal(got.weights.data, counts.data, 'the counts\' own array');
      assert.deepEqual([...got.weights.data], [...want.weights.data], tf);
      assert.deepEqual([...got.idf], [...want.idf], tf);
      // With the df given (as prepare-weights passes the raw-count statistics' df): the same idf.
      const again = countMatrix([[3, 0, 1], [2, 0, 0], [0, 0, 0], [4, 7, 0], [3, 2, 0], [3, 0, 2]]);
      assert.deepEqual([...weighInPlace(again, { tf, idf: 'smooth', norm: 'l2' }, [5, 2, 2]).weights.data], [...want.weights.data], `${tf}, df given`);
    }
  });

  it('weigh raw/smooth/l2 gives the user guide\'s smooth_idf=True rows', () => {
    const { weights } = weigh(guideCounts, { tf: 'raw', idf: 'smooth', norm: 'l2' });
    assertClose(denseRow(weights, 0), [0.85151335, 0, 0.52433293], 5e-9, 'row 1');
    assertClose(denseRow(weights, 5), [0.63035731, 0, 0.77630514], 5e-9, 'row 6');
  });

  it('weigh sublinear/none/l2 reproduces IIR §6.3\'s three novels (log-frequency, cosine-normalised)', () => {
    // Source: Manning, Raghavan & Schütze (2008), Introduction to Information Retrieval, §6.3,
    // counts of affection, jealous, gossip, wuthering in SaS, PaP, WH; weight 1 + log10 tf.
    // Our sublinear tf is 1 + ln c; feeding c' = c^(1/ln 10) makes 1 + ln c' = 1 + log10 c, so
    // the book's base-10 weighting runs through our own code path unchanged.
    const novels = [[115, 10, 2, 0], [58, 7, 0, 0], [20, 11, 6, 38]];
    const converted = countMatrix(novels.map((row) => row.map((c) => (c === 0 ? 0 : Math.pow(c, 1 / Math.LN10)))));
    const { weights } = weigh(converted, { tf: 'sublinear', idf: 'none', norm: 'l2' });
    const [a, b, c] = [denseRow(weights, 0), denseRow(weights, 1), denseRow(weights, 2)];
    // The book prints 3 decimals.
    assertClose(a, [0.789, 0.515, 0.335, 0], 5e-4, 'SaS');
    assertClose(b, [0.832, 0.555, 0, 0], 5e-4, 'PaP');
    assertClose(c, [0.524, 0.465, 0.405, 0.588], 5e-4, 'WH');
    const dot = (x: number[], y: number[]): number => x.reduce((s, v, i) => s + v * y[i]!, 0);
    // The book prints 2 decimals: cos(SaS,PaP) ≈ 0.94, cos(SaS,WH) ≈ 0.79, cos(PaP,WH) ≈ 0.69.
    assert.ok(Math.abs(dot(a, b) - 0.94) <= 0.005);
    assert.ok(Math.abs(dot(a, c) - 0.79) <= 0.005);
    assert.ok(Math.abs(dot(b, c) - 0.69) <= 0.005);
  });

  it('weigh plain idf, divided by ln 10, gives IIR §6.2.1\'s idf table', () => {
    // Source: IIR §6.2.1, Reuters-RCV1, N = 806,791: df(car) 18,165 → idf 1.65; auto 6,723 → 2.08;
    // insurance 19,241 → 1.62; best 25,235 → 1.5 (idf = log10 N/df, printed to 2 decimals).
    const n = 806791;
    const dfs = [18165, 6723, 19241, 25235];
    const expected = [1.65, 2.08, 1.62, 1.5];
    // Term j occurs once in each of the first dfs[j] documents.
    const indptr = new Uint32Array(n + 1);
    const indices: number[] = [];
    for (let r = 0; r < n; r++) {
      for (let j = 0; j < dfs.length; j++) if (r < dfs[j]!) indices.push(j);
      indptr[r + 1] = indices.length;
    }
    const counts: CountMatrix = {
      rows: n,
      cols: dfs.length,
      indptr,
      indices: Uint32Array.from(indices),
      data: new Float64Array(indices.length).fill(1),
      terms: ['car', 'auto', 'insurance', 'best'],
      tokensPerDoc: new Uint32Array(n),
      firstTerms: Int32Array.from({ length: n }, (_, r) => dfs.findIndex((df) => r < df)),
    };
    const { idf } = weigh(counts, { tf: 'raw', idf: 'plain', norm: 'none' });
    assertClose([...idf].map((v) => v / Math.LN10), expected, 0.005, 'idf');
  });

  it('weigh leaves empty rows empty and all-zero rows zero', () => {
    // A term in every document has plain idf ln(n/n) = 0 (Salton & Buckley 1988): its rows are 0.
    const counts = countMatrix([[1, 0], [0, 0], [2, 1]]);
    const { weights } = weigh({ ...counts }, { tf: 'raw', idf: 'plain', norm: 'l2' });
    assert.deepEqual(denseRow(weights, 1), [0, 0]);
    const everywhere = countMatrix([[1], [3]]);
    const w2 = weigh(everywhere, { tf: 'raw', idf: 'plain', norm: 'l2' }).weights;
    assert.deepEqual([...w2.data], [0, 0]);
  });
});
