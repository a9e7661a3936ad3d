// The panel's prefetch on a hover (ParallelWhatIf.speculate) must leave the what-if exactly as
// if it had never run: every click answers what the same clicks answer without prefetches, bit
// for bit, whether or not a prefetch was for that click. A click that a prefetch foresaw adopts
// the prefetch's state instead of computing, so its answer must be the prefetch's and equal to
// a plain click's. The plain clicks are held to the one-thread DistanceLab.whatIf here, that to
// a full recompute in test/what-if-incremental.test.ts, and that to scikit-learn's
// TfidfVectorizer through test/measures-masked-term-sums.test.ts (docs/methods.md §1, §3).
import { strict as assert } from 'node:assert';
import { joinMeasures } from '../extension/src/engine/measures/measure-distances';
import { ParallelWhatIf } from '../extension/src/engine/what-if/parallel-what-if';
import { SampleSide } from '../extension/src/engine/what-if/sample-side';
import { SpeculationStopped, stopOnClick } from '../extension/src/engine/what-if/speculation-stopped';
import { twoLabs } from './support/two-labs';

function setUp(seed: number, clickCount: number) {
  const { X, lab, reference, baseline, opening, random } = twoLabs(seed);
  // Mostly the common low columns (the heavy toggles that bring the drift resets due).
  const column = () => Math.floor(X.cols * random() ** 2);
  const clicks: number[] = [];
  for (let i = 0; i < clickCount; i++) clicks.push(column());
  return { X, lab, reference, baseline, opening, clicks, random, column };
}

function flipped(mask: Uint8Array, t: number): Uint8Array<ArrayBuffer> {
  const next = mask.slice();
  next[t] = next[t] === 0 ? 1 : 0;
  return next;
}

describe('speculative what-if (the prefetch on a hover)', function () {
  this.timeout(120000);

  it('with prefetches before the clicks (some for the click that follows, some not, some settled between), every click answers what plain clicks answer, bit for bit, and a foreseen click answers the prefetch', async () => {
    for (const seed of [21, 22]) {
      const { lab, reference, baseline, opening, clicks, random, column } = setUp(seed, 60);
      const parallel = ParallelWhatIf.open(lab, baseline.neighbors, opening);
      assert.ok(parallel !== null, 'the thread entry (sample-thread.ts under tsx) was not found');
      try {
        await parallel.opened;
        let mask: Uint8Array<ArrayBuffer> = opening.slice();
        let foreseen = 0;
        for (const [i, t] of clicks.entries()) {
          const next = flipped(mask, t);
          // 0–2 hovers elsewhere, then (two clicks in three) a hover on the term clicked.
          const hovers: Uint8Array[] = [];
          for (let h = Math.floor(random() * 3); h > 0; h--) hovers.push(flipped(mask, column()));
          const foresee = i % 3 !== 2;
          if (foresee) hovers.push(next);
          let held = null;
          for (const hover of hovers) {
            const answer = await parallel.speculate(hover);
            assert.ok(answer !== null, 'a thread that works speculates');
            held = answer;
          }
          // Idle time between the hover and the click: the drift resets that came due.
          if (random() < 0.5) lab.settle();
          const got = await parallel.whatIf(next);
          const want = reference.whatIf(next, baseline.neighbors);
          assert.deepStrictEqual(got, want, `seed ${seed}, click ${i} (term ${t})`);
          if (foresee) {
            assert.deepStrictEqual(held, got, `seed ${seed}, click ${i}: the prefetch for the clicked term answers as the click`);
            foreseen++;
          }
          mask = next;
        }
        assert.equal(parallel.threadAnswers, clicks.length);
        assert.ok(foreseen >= clicks.length / 2);
      } finally {
        await parallel.close();
      }
    }
  });

  it('a foreseen click adopts the prefetch (no second computation on either half), an unforeseen one computes', () => {
    const { lab, reference, baseline, opening } = setUp(23, 0);
    const side = new SampleSide({ rows: lab.sampleRows, k: lab.k, seed: lab.seed, labels: lab.sampleLabels, baselineNeighbors: baseline.neighbors });
    side.measures(opening, false);
    const stopA = flipped(opening, 1);
    const stopB = flipped(opening, 2);
    // Foreseen: the speculation's objects come back as the click's answer (nothing recomputed).
    const exactA = lab.speculateExact(stopA);
    const sampledA = side.speculate(stopA);
    assert.equal(lab.whatIfExact(stopA), exactA);
    assert.equal(side.measures(stopA), sampledA);
    // Not foreseen (the hover was on another term): computed, and equal to plain clicks'.
    lab.speculateExact(flipped(stopA, 5));
    side.speculate(flipped(stopA, 5));
    const exactB = lab.whatIfExact(stopB);
    const sampledB = side.measures(stopB);
    reference.whatIf(stopA, baseline.neighbors);
    const want = reference.whatIf(stopB, baseline.neighbors);
    assert.deepStrictEqual(joinMeasures(sampledB, exactB), want);
    // A prefetch overtaken by a click for another selection is not adopted later.
    const stale = side.speculate(stopA);
    side.measures(opening);
    assert.notEqual(side.measures(stopA), stale);
  });
});

describe('speculative what-if stopped part way (a click came)', function () {
  this.timeout(120000);

  it('a prefetch interrupted on either half at any of its first checks leaves every later click and prefetch as without it, bit for bit', () => {
    const { lab, reference, baseline, opening, clicks } = setUp(24, 12);
    const side = new SampleSide({ rows: lab.sampleRows, k: lab.k, seed: lab.seed, labels: lab.sampleLabels, baselineNeighbors: baseline.neighbors });
    side.measures(opening, false);
    // Throws on its n-th call: the first check is at the start of an update, then every few rows.
    const stopAt = (n: number) => {
      let calls = 0;
      return () => {
        if (++calls >= n) throw new SpeculationStopped();
      };
    };
    let mask = opening.slice();
    let stopped = 0;
    for (const [i, t] of clicks.entries()) {
      const next = flipped(mask, t);
      for (const n of [1, 2, 3]) {
        try {
          lab.speculateExact(next, stopAt(n));
        } catch (e) {
          assert.ok(e instanceof SpeculationStopped, String(e));
          stopped++;
        }
        try {
          side.speculate(next, stopAt(n));
        } catch (e) {
          assert.ok(e instanceof SpeculationStopped, String(e));
          stopped++;
        }
      }
      // Every other click is foreseen by a prefetch that runs to the end after the stopped ones.
      const foreseen = i % 2 === 0 ? joinMeasures(side.speculate(next), lab.speculateExact(next)) : null;
      const got = joinMeasures(side.measures(next), lab.whatIfExact(next));
      assert.deepStrictEqual(got, reference.whatIf(next, baseline.neighbors), `click ${i} (term ${t})`);
      if (foreseen !== null) assert.deepStrictEqual(foreseen, got, `click ${i}: the prefetch after the stopped ones`);
      mask = next;
    }
    // Each half is stopped at its first check at least (the start of the update or the sweep).
    assert.ok(stopped >= 2 * clicks.length, `only ${stopped} stops`);
  });

  it('stopOnClick throws once the shared count of clicks moves, not before', () => {
    const counter = new Int32Array(new SharedArrayBuffer(4));
    const interrupt = stopOnClick(counter);
    interrupt();
    Atomics.add(counter, 0, 1);
    assert.throws(interrupt, SpeculationStopped);
    stopOnClick(counter)();
  });
});
