// The panel's what-if on two threads (ParallelWhatIf: the sample's half on a worker thread, the
// exact sums here) must answer what DistanceLab.whatIf answers in one thread, bit for bit: the
// thread walks the same masks in the same order. The one-thread answer is itself held to a full
// recompute in test/what-if-incremental.test.ts, and that to scikit-learn's TfidfVectorizer
// through test/measures-masked-term-sums.test.ts (docs/methods.md §1, §3).
import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ParallelWhatIf } from '../extension/src/engine/what-if/parallel-what-if';
import { twoLabs } from './support/two-labs';

/** Two labs as a review leaves them (support/two-labs.ts) and the clicks to walk. */
function setUp(seed: number) {
  const { X, lab, reference, baseline, opening, random } = twoLabs(seed);
  // Single clicks, mostly on the common low columns, some undone, some repeated.
  const clicks: number[] = [];
  for (let i = 0; i < 24; i++) clicks.push(Math.floor(X.cols * random() ** 2));
  clicks.push(clicks[clicks.length - 1]!, 0, 0);
  return { X, lab, reference, baseline, opening, clicks };
}

describe('what-if on two threads', function () {
  this.timeout(60000);

  it('ParallelWhatIf answers what DistanceLab.whatIf answers in one thread, bit for bit, along single clicks (its sample half on the thread)', async () => {
    for (const seed of [11, 12]) {
      const { lab, reference, baseline, opening, clicks } = setUp(seed);
      const parallel = ParallelWhatIf.open(lab, baseline.neighbors, opening);
      assert.ok(parallel !== null, 'the thread entry (sample-thread.ts under tsx) was not found');
      try {
        const mask = opening.slice();
        for (const t of clicks) {
          mask[t] = mask[t] === 0 ? 1 : 0;
          const got = await parallel.whatIf(mask.slice());
          const want = reference.whatIf(mask, baseline.neighbors);
          assert.deepStrictEqual(got, want, `seed ${seed}, term ${t}`);
        }
        assert.equal(parallel.threadAnswers, clicks.length, 'some answers did not come from the thread');
      } finally {
        await parallel.close();
      }
    }
  });

  it('a warm-up (toggles there and back before the first click) leaves every later answer bit for bit the same', async () => {
    const { lab, reference, baseline, opening, clicks } = setUp(15);
    const parallel = ParallelWhatIf.open(lab, baseline.neighbors, opening);
    assert.ok(parallel !== null);
    try {
      await parallel.warmUp(opening);
      // The warm-up ran on both halves (two rounds of a toggle and its undo).
      assert.equal(parallel.threadAnswers, 4);
      const mask = opening.slice();
      for (const t of clicks) {
        mask[t] = mask[t] === 0 ? 1 : 0;
        assert.deepStrictEqual(await parallel.whatIf(mask.slice()), reference.whatIf(mask, baseline.neighbors), `term ${t}`);
      }
    } finally {
      await parallel.close();
    }
  });

  it('clicks sent before the previous answer came back are answered in order, each for its own mask', async () => {
    const { lab, reference, baseline, opening, clicks } = setUp(13);
    const parallel = ParallelWhatIf.open(lab, baseline.neighbors, opening);
    assert.ok(parallel !== null);
    try {
      const masks: Uint8Array[] = [];
      const mask = opening.slice();
      for (const t of clicks.slice(0, 8)) {
        mask[t] = mask[t] === 0 ? 1 : 0;
        masks.push(mask.slice());
      }
      const answers = await Promise.all(masks.map((m) => parallel.whatIf(m)));
      for (let i = 0; i < masks.length; i++) assert.deepStrictEqual(answers[i], reference.whatIf(masks[i]!, baseline.neighbors), `click ${i}`);
    } finally {
      await parallel.close();
    }
  });

  it('a thread that fails to start leaves the answers to this thread, unchanged', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'loudword-what-if-thread-'));
    try {
      const script = join(dir, 'broken-thread.js');
      writeFileSync(script, "throw new Error('no thread today');\n");
      const { lab, reference, baseline, opening, clicks } = setUp(14);
      const parallel = ParallelWhatIf.open(lab, baseline.neighbors, opening, script);
      assert.ok(parallel !== null);
      const mask = opening.slice();
      for (const t of clicks.slice(0, 6)) {
        mask[t] = mask[t] === 0 ? 1 : 0;
        assert.deepStrictEqual(await parallel.whatIf(mask.slice()), reference.whatIf(mask, baseline.neighbors));
      }
      assert.equal(parallel.threadAnswers, 0);
      await parallel.close();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
