// The panel's incremental what-if must give what a full recompute gives. The reference here is
// the full path itself — maskedTermSums, maskTerms + sampleSimilarities, measureDistances with
// nothing carried over — which test/measures-masked-term-sums.test.ts and
// test/weighting-sklearn.test.ts tie to scikit-learn's TfidfVectorizer without those terms
// (docs/methods.md §1, §3). Tolerance 1e-12 (relative above 1): the order of additions differs.
import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { maskTerms } from '../extension/src/engine/matrix/mask-terms';
import { maskedTermSums } from '../extension/src/engine/measures/masked-term-sums';
import { measureDistances } from '../extension/src/engine/measures/measure-distances';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';
import { selectRows } from '../extension/src/engine/matrix/select-rows';
import { DistanceLab } from '../extension/src/engine/what-if/distance-lab';
import { IncrementalGram } from '../extension/src/engine/what-if/incremental-gram';
import { IncrementalTermSums } from '../extension/src/engine/what-if/incremental-term-sums';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { textLikeRows } from './support/text-like-rows';

const TOLERANCE = 1e-12;

/** The engine's seeded generator, so failures replay. */
const generator = mulberry32;

/**
 * The intrinsic-dimension estimates take ratios of neighbour distances, and a distance
 * √(2 − 2·cos) turns a last-bit difference of a cosine near 1 into a relative error of
 * ε/(1 − cos) (conditioning of the square root, textbook numerics): near-duplicate documents make
 * those two estimates differ by more than 1e-12 between any two orders of summation, the full
 * recompute and scikit-learn included. They are compared to this looser bound.
 */
const RATIO_TOLERANCE = 1e-8;

function close(a: number, b: number, tolerance = TOLERANCE): boolean {
  if (Number.isNaN(a) || Number.isNaN(b)) return Number.isNaN(a) && Number.isNaN(b);
  return Math.abs(a - b) <= tolerance * Math.max(1, Math.abs(a), Math.abs(b));
}

/** Deep comparison: numbers to TOLERANCE, everything else equal; the path names the mismatch. */
function assertClose(got: unknown, want: unknown, path: string): void {
  if (typeof want === 'number') {
    assert.equal(typeof got, 'number', path);
    const tolerance = path.includes('intrinsicDimension') ? RATIO_TOLERANCE : TOLERANCE;
    if (!close(got as number, want, tolerance)) assert.fail(`${path}: ${String(got)} vs ${want}`);
  } else if (ArrayBuffer.isView(want) || Array.isArray(want)) {
    const w = want as ArrayLike<unknown>;
    const g = got as ArrayLike<unknown>;
    assert.equal(g.length, w.length, `${path}.length`);
    for (let i = 0; i < w.length; i++) assertClose(g[i], w[i], `${path}[${i}]`);
  } else if (want !== null && typeof want === 'object') {
    for (const key of Object.keys(want)) assertClose((got as Record<string, unknown>)[key], (want as Record<string, unknown>)[key], `${path}.${key}`);
  } else {
    assert.equal(got, want, path);
  }
}

/** The incremental sums against maskedTermSums of the same mask. */
function assertSumsMatch(got: ReturnType<IncrementalTermSums['at']>, X: Csr, mask: Uint8Array): void {
  const want = maskedTermSums(X, mask, false);
  assert.equal(got.rowsWithWeight, want.rowsWithWeight);
  assert.deepEqual([...got.sums.df], [...want.sums.df]);
  assertClose(got.sums.s1, want.sums.s1, 's1');
  assertClose(got.sums.s2, want.sums.s2, 's2');
}

/** A toggle sequence a user or the suggestion search might make: mostly single flips of common terms. */
function toggleSequence(cols: number, steps: number, random: () => number): Uint8Array[] {
  const masks: Uint8Array[] = [];
  const mask = new Uint8Array(cols);
  for (let s = 0; s < steps; s++) {
    const roll = random();
    const flips = roll < 0.7 ? 1 : roll < 0.9 ? 2 + Math.floor(random() * 4) : Math.floor(cols / 3);
    for (let f = 0; f < flips; f++) {
      const u = random();
      const t = Math.min(cols - 1, Math.floor(cols * u * u));
      mask[t] = mask[t] === 0 ? 1 : 0;
    }
    masks.push(mask.slice());
  }
  return masks;
}

/** The rows with column 0 added to every one (renormalised): a term in every document, like "the". */
function everywhere(X: Csr): Csr {
  const indptr = new Uint32Array(X.rows + 1);
  const indices: number[] = [];
  const data: number[] = [];
  for (let r = 0; r < X.rows; r++) {
    const entries = new Map<number, number>([[0, 0.3]]);
    for (let p = X.indptr[r]!; p < X.indptr[r + 1]!; p++) entries.set(X.indices[p]!, (entries.get(X.indices[p]!) ?? 0) + X.data[p]!);
    const sorted = [...entries.entries()].sort((a, b) => a[0] - b[0]);
    const norm = Math.hypot(...sorted.map((e) => e[1]));
    for (const [t, w] of sorted) {
      indices.push(t);
      data.push(w / norm);
    }
    indptr[r + 1] = indices.length;
  }
  return { rows: X.rows, cols: X.cols, indptr, indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}

/** X with one more column, held (weight 0.2 before renormalising) by `holders` only. */
function withTermIn(X: Csr, holders: readonly number[]): Csr {
  const extra = X.cols;
  const indptr = new Uint32Array(X.rows + 1);
  const indices: number[] = [];
  const data: number[] = [];
  for (let r = 0; r < X.rows; r++) {
    const row: Array<[number, number]> = [];
    for (let p = X.indptr[r]!; p < X.indptr[r + 1]!; p++) row.push([X.indices[p]!, X.data[p]!]);
    if (holders.includes(r)) row.push([extra, 0.2]);
    const norm = Math.hypot(...row.map((e) => e[1]));
    for (const [t, w] of row) {
      indices.push(t);
      data.push(w / norm);
    }
    indptr[r + 1] = indices.length;
  }
  return { rows: X.rows, cols: X.cols + 1, indptr, indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}

/** Columns to flip one at a time: the term in every row often, and each pick repeated now and then (on, then straight back off). */
function singleToggles(cols: number, steps: number, random: () => number): number[] {
  const out: number[] = [];
  while (out.length < steps) {
    const u = random();
    const t = u < 0.25 ? 0 : Math.min(cols - 1, Math.floor(cols * u * u));
    out.push(t);
    if (random() < 0.3) out.push(t);
  }
  return out;
}

describe('incremental what-if', () => {
  it('IncrementalTermSums.at equals maskedTermSums after every step of random toggle sequences', () => {
    for (let seed = 1; seed <= 6; seed++) {
      const random = generator(seed);
      const X = textLikeRows(400, 60, random);
      const sums = new IncrementalTermSums(X);
      let incremental = 0;
      for (const mask of toggleSequence(X.cols, 80, random)) {
        assertSumsMatch(sums.at(mask), X, mask);
        if (sums.lastStep.kind === 'incremental') incremental++;
      }
      // Otherwise the test would only exercise the full pass.
      assert.ok(incremental > 20, `only ${incremental} incremental steps`);
    }
  });

  it('IncrementalGram.scaled: dots·scale·scale equals sampleSimilarities of the masked, renormalised rows, zeros exactly', () => {
    for (let seed = 1; seed <= 6; seed++) {
      const random = generator(100 + seed);
      const rows = textLikeRows(150, 40, random);
      const gram = new IncrementalGram(rows);
      const all = Uint32Array.from({ length: rows.rows }, (_, i) => i);
      let incremental = 0;
      for (const mask of toggleSequence(rows.cols, 60, random)) {
        const { dots, scale } = gram.scaled(mask);
        const m = rows.rows;
        const got = dots.map((d, p) => d * scale[Math.floor(p / m)]! * scale[p % m]!);
        if (gram.lastStep.kind === 'incremental') incremental++;
        const want = sampleSimilarities(maskTerms(rows, mask, 'l2'), all);
        for (let p = 0; p < want.length; p++) {
          // Exact zeros stay exact: a pair with no kept term in common is orthogonal, not 1e-17.
          // The messages are built only on a failure: 4 million passing entries make them the test's cost.
          if (want[p] === 0 ? got[p] !== 0 : !close(got[p]!, want[p]!)) assert.fail(`entry ${p}: ${got[p]} vs ${want[p]}${want[p] === 0 ? ' (should be exactly 0)' : ''}`);
        }
      }
      assert.ok(incremental > 20, `only ${incremental} incremental steps`);
    }
  });

  it('IncrementalGram: a full build is restored bit for bit after the state (or its twin) moved on, though it is copied out only then', () => {
    // The checkpoints are kept by reference until the arrays that hold them change (keepCheckpoint);
    // restoring must give the full build's bits whether it was copied out or is read from its
    // owner's arrays (a twin restoring its sibling's latest build). Reference: a fresh state's full
    // build at the same mask (the Report's figure; common practice, no source).
    const bits = (g: IncrementalGram, mask: Uint8Array): Float64Array => g.scaled(mask, false).dots.slice();
    for (let seed = 1; seed <= 3; seed++) {
      const random = generator(900 + seed);
      const rows = textLikeRows(120, 40, random);
      const [first, second, third] = toggleSequence(rows.cols, 3, random);
      const want = (mask: Uint8Array): Float64Array => bits(new IncrementalGram(rows), mask);
      const gram = new IncrementalGram(rows);
      bits(gram, first!);
      bits(gram, second!); // the first build is copied out here; the second is held by reference
      const twin = gram.twin();
      twin.copyFrom(gram);
      // The twin restores the second build from the live arrays of `gram`, which still hold it.
      twin.scaled(third!, true);
      assert.deepEqual(bits(twin, second!), want(second!));
      assert.equal(twin.lastStep.kind, 'restored');
      // `gram` moves on by toggles: the second build is copied out before its arrays change.
      for (const mask of toggleSequence(rows.cols, 8, random)) gram.scaled(mask, true);
      assert.deepEqual(bits(gram, second!), want(second!));
      assert.equal(gram.lastStep.kind, 'restored');
      assert.deepEqual(bits(gram, first!), want(first!));
      assert.equal(gram.lastStep.kind, 'restored');
      assert.deepEqual(bits(twin, first!), want(first!));
      assert.equal(twin.lastStep.kind, 'restored');
    }
  });

  it('IncrementalGram not for what-ifs (a review asked none) gives the same bits, building a mask met again instead of restoring it and counting shared terms only when an update needs them', () => {
    // Reference: the same sequence on a state that keeps its checkpoints (common practice, no source).
    for (let seed = 1; seed <= 3; seed++) {
      const random = generator(950 + seed);
      const rows = textLikeRows(120, 40, random);
      const [first, second] = toggleSequence(rows.cols, 2, random);
      const keeping = new IncrementalGram(rows);
      const lean = new IncrementalGram(rows, undefined, false);
      const steps: Array<[Uint8Array, boolean]> = [[first!, false], [second!, false], ...toggleSequence(rows.cols, 6, random).map((mask): [Uint8Array, boolean] => [mask, true]), [first!, false], [second!, false]];
      let updates = 0;
      for (const [mask, incremental] of steps) {
        assert.deepEqual(lean.scaled(mask, incremental).dots.slice(), keeping.scaled(mask, incremental).dots.slice());
        if (lean.lastStep.kind === 'incremental') updates++;
      }
      // The updates after a lean build need the shared counts it left out (exact zeros depend on them).
      assert.ok(updates >= 3, `only ${updates} updates`);
      assert.equal(keeping.lastStep.kind, 'restored');
      assert.equal(lean.lastStep.kind, 'full');
    }
  });

  it('IncrementalTermSums.at: one term toggled at a time (a panel click), the same term twice, a term in every row', () => {
    for (let seed = 1; seed <= 4; seed++) {
      const random = generator(500 + seed);
      const X = everywhere(textLikeRows(400, 60, random));
      const sums = new IncrementalTermSums(X);
      const mask = new Uint8Array(X.cols);
      sums.at(mask, false);
      let incremental = 0;
      for (const t of singleToggles(X.cols, 60, random)) {
        mask[t] = mask[t] === 0 ? 1 : 0;
        assertSumsMatch(sums.at(mask), X, mask);
        if (sums.lastStep.kind === 'incremental') incremental++;
      }
      assert.ok(incremental > 20, `only ${incremental} incremental steps`);
    }
  });

  it('IncrementalTermSums: a click summed term by term (the gather) and row by row (the scatter) leaves the same bits, also without weights in the column copy (a large corpus)', () => {
    // The two ways add the same products in the same order (see updateOne), so they must agree
    // exactly, not only to 1e-12: a prefetch and a click, or two runs, may take different ways.
    for (let seed = 1; seed <= 3; seed++) {
      const random = generator(700 + seed);
      const X = everywhere(textLikeRows(400, 60, random));
      const gathering = new IncrementalTermSums(X, Infinity);
      const scattering = new IncrementalTermSums(X, 0);
      // Above its non-zero bound the column copy has no weights: it scatters whatever the ratio.
      const lean = new IncrementalTermSums(X, Infinity, 0);
      const mask = new Uint8Array(X.cols);
      // Some columns stopped from the start, as the suggested list stops the function words.
      for (let t = 1; t < X.cols; t += 7) mask[t] = 1;
      gathering.at(mask, false);
      scattering.at(mask, false);
      lean.at(mask, false);
      let gathered = 0;
      for (const t of singleToggles(X.cols, 60, random)) {
        mask[t] = mask[t] === 0 ? 1 : 0;
        const a = gathering.at(mask);
        const b = scattering.at(mask);
        const c = lean.at(mask);
        assert.equal(lean.lastStep.gathered ?? false, false);
        if (gathering.lastStep.gathered === true) gathered++;
        assert.equal(scattering.lastStep.gathered ?? false, false);
        for (const other of [b, c]) {
          assert.equal(a.rowsWithWeight, other.rowsWithWeight, `term ${t}`);
          for (const key of ['s1', 's2', 'df'] as const) {
            const x = a.sums[key];
            const y = other.sums[key];
            for (let u = 0; u < x.length; u++) if (!Object.is(x[u], y[u])) assert.fail(`term ${t}: ${key}[${u}] ${x[u]} vs ${y[u]}`);
          }
        }
        assertSumsMatch(a, X, mask);
      }
      assert.ok(gathered > 20, `only ${gathered} gathered steps`);
    }
  });

  it("IncrementalTermSums: a click's entries and its choice between gather and scatter, from counts it keeps, are those counted afresh after restores, full passes, several terms at once and a twin's state", () => {
    // Each click weighs the entries of the toggled term's rows against those of the other kept
    // columns (GATHER_BELOW = 2); the state keeps the latter across single toggles instead of
    // counting them on every click, so after any other move of the mask it must count them again.
    for (let seed = 1; seed <= 3; seed++) {
      const random = generator(900 + seed);
      const X = textLikeRows(400, 60, random);
      const columnLength = new Uint32Array(X.cols);
      const rowsOf: number[][] = Array.from({ length: X.cols }, () => []);
      for (let r = 0; r < X.rows; r++) {
        for (let p = X.indptr[r]!; p < X.indptr[r + 1]!; p++) {
          columnLength[X.indices[p]!]++;
          rowsOf[X.indices[p]!]!.push(r);
        }
      }
      const sums = new IncrementalTermSums(X);
      const twin = sums.twin();
      const opening = new Uint8Array(X.cols);
      for (let t = 3; t < X.cols; t += 11) opening[t] = 1;
      sums.at(opening, false);
      let mask = opening.slice();
      let state = mask.slice();
      let checked = 0;
      let gathered = 0;
      for (let step = 0; step < 120; step++) {
        const u = random();
        const next = mask.slice();
        if (u < 0.08) {
          sums.at(opening);
          state = opening.slice();
          mask = opening.slice();
          continue;
        }
        if (u < 0.14) {
          for (let n = 0; n < 3; n++) next[Math.floor(random() * X.cols)] ^= 1;
        } else if (u < 0.2) {
          next[Math.floor(random() * X.cols)] ^= 1;
          sums.at(next, false);
          state = next.slice();
          mask = next;
          continue;
        } else if (u < 0.26) {
          twin.copyFrom(sums);
          next[Math.floor(random() * X.cols)] ^= 1;
          twin.at(next);
          sums.copyFrom(twin);
          state = next.slice();
          mask = next;
          continue;
        } else {
          const t = Math.min(X.cols - 1, Math.floor(X.cols * random() * random()));
          next[t] ^= 1;
          let kept = 0;
          for (let c = 0; c < X.cols; c++) if (state[c] === 0 && c !== t) kept += columnLength[c]!;
          let entries = 0;
          for (const r of rowsOf[t]!) entries += X.indptr[r + 1]! - X.indptr[r]!;
          sums.at(next);
          if (sums.lastStep.kind === 'incremental') {
            assert.equal(sums.lastStep.entries, entries, `step ${step}, term ${t}`);
            assert.equal(sums.lastStep.gathered, kept < 2 * entries, `step ${step}, term ${t}: ${kept} kept entries against ${entries}`);
            checked++;
            if (sums.lastStep.gathered === true) gathered++;
          }
          state = next.slice();
          mask = next;
          continue;
        }
        sums.at(next);
        state = next.slice();
        mask = next;
      }
      assert.ok(checked > 40 && gathered > 5 && checked - gathered > 5, `${checked} single toggles, ${gathered} gathered`);
    }
  });

  it('settle() between clicks (idle time) gives the answers a click that does the due reset itself gives, bit for bit', () => {
    for (let seed = 1; seed <= 2; seed++) {
      const random = generator(3000 + seed);
      const X = textLikeRows(300, 30, random);
      const sample = Uint32Array.from({ length: 100 }, (_, i) => i * 3);
      const idle = new DistanceLab(X, sample, 5, seed, null);
      const busy = new DistanceLab(X, sample, 5, seed, null);
      const mask = new Uint8Array(X.cols);
      const baseline = idle.measure(mask, null);
      busy.measure(mask, null);
      const idleSums = new IncrementalTermSums(X);
      const busySums = new IncrementalTermSums(X);
      idleSums.at(mask, false);
      busySums.at(mask, false);
      let settled = 0;
      let summed = 0;
      for (const t of singleToggles(X.cols, 200, random)) {
        mask[t] = mask[t] === 0 ? 1 : 0;
        assert.deepStrictEqual(idle.whatIf(mask, baseline.neighbors), busy.whatIf(mask, baseline.neighbors), `term ${t}`);
        assert.deepStrictEqual(idleSums.at(mask), busySums.at(mask), `sums, term ${t}`);
        idle.settle();
        if (idleSums.settle()) summed++;
        // The lab's settle did a reset whenever the state it leaves is a full pass's.
        if ((idle as unknown as { gram: IncrementalGram }).gram.lastStep.kind === 'full') settled++;
      }
      // Otherwise the idle resets never happened and the check proves nothing.
      assert.ok(settled > 2 && summed > 2, `${settled} rebuilds and ${summed} full passes in idle time`);
    }
  });

  it('DistanceLab.whatIf (a panel toggle) equals the full measures along single toggles, repeats, a term in every row and one in no sampled row', () => {
    for (let seed = 1; seed <= 3; seed++) {
      const random = generator(2000 + seed);
      const sample = Uint32Array.from({ length: 100 }, (_, i) => i * 5);
      // Rows 1, 7 and 13 are not sampled (the sample is every 5th row).
      const X = withTermIn(everywhere(textLikeRows(500, 40, random)), [1, 7, 13]);
      const labels = Int32Array.from(sample, () => Math.floor(random() * 3));
      const k = 5;
      const lab = new DistanceLab(X, sample, k, seed, labels);
      const reference = new DistanceLab(X, sample, k, seed, labels);
      const mask = new Uint8Array(X.cols);
      const baseline = lab.measure(mask, null);
      // A term some documents hold but no sampled one: only the exact sums move.
      const inSample = new Set<number>();
      for (const r of sample) for (let p = X.indptr[r]!; p < X.indptr[r + 1]!; p++) inSample.add(X.indices[p]!);
      const absent = [...new Set(X.indices)].find((t) => !inSample.has(t));
      assert.ok(absent !== undefined, 'every term is in a sampled row');
      for (const t of [absent, ...singleToggles(X.cols, 30, random), absent]) {
        mask[t] = mask[t] === 0 ? 1 : 0;
        const got = lab.whatIf(mask, baseline.neighbors);
        const want = reference.measure(mask, baseline.neighbors).measures;
        assertClose(got, want, 'measures');
      }
    }
  });

  it('DistanceLab.measure along random toggle sequences equals a fresh full recompute', () => {
    for (let seed = 1; seed <= 4; seed++) {
      const random = generator(1000 + seed);
      const X = textLikeRows(600, 50, random);
      const sample = Uint32Array.from({ length: 120 }, (_, i) => i * 5);
      const labels = Int32Array.from(sample, () => (random() < 0.1 ? -1 : Math.floor(random() * 3)));
      const k = 5;
      const lab = new DistanceLab(X, sample, k, seed, labels);
      const base = new Uint8Array(X.cols);
      const baseline = lab.measure(base, null);
      const positions = Uint32Array.from(sample, (_, i) => i);
      for (const mask of toggleSequence(X.cols, 25, random)) {
        const got = lab.measureIncrementally(mask, baseline.neighbors);
        const { sums, rowsWithWeight } = maskedTermSums(X, mask, false);
        const want = measureDistances(maskTerms(selectRows(X, sample), mask, 'l2'), {
          sample: positions,
          k,
          seed,
          labels,
          baselineNeighbors: baseline.neighbors,
          sums,
          rowsWithWeight,
        });
        assert.deepEqual([...got.neighbors], [...want.neighbors], 'neighbours');
        assertClose(got.measures, want.measures, 'measures');
        assertClose(got.termKnnMass, want.termKnnMass, 'termKnnMass');
        assertClose(got.pairMass, want.pairMass, 'pairMass');
      }
    }
  });
});
