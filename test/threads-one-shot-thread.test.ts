// The one-shot thread mechanism (engine/threads/one-shot-thread.ts) that the review's side passes
// run on: each result comes from the thread when it is done and from `here` otherwise, and a
// thread whose results are all taken or dropped is stopped. Its expected values are the fixture
// thread's own rule (i² + 1; common practice, no source): what is checked is who computed them.
import { strict as assert } from 'node:assert';
import { join } from 'node:path';
import { DONE, DROPPED, PENDING, startOneShot, startOneShots } from '../extension/src/engine/threads/one-shot-thread';
import type { FixtureJob } from './support/one-shot-fixture-thread';

const script = join(__dirname, 'support', 'one-shot-fixture-thread.ts');

function fixture(results: number, delayMs: number, failAt = results, skipsDropped = true): FixtureJob {
  return { values: new Float64Array(new SharedArrayBuffer(8 * results)), status: new Int32Array(new SharedArrayBuffer(4 * results)), delayMs, failAt, skipsDropped };
}

const sleep = (ms: number): Promise<void> => new Promise((resolve) => setTimeout(resolve, ms));

describe('startOneShots', function () {
  this.timeout(60_000);

  it('reads each result from the thread, in any order, and falls back to here() for the ones it failed', () => {
    const job = fixture(4, 5, 3);
    const herePlus = 1000;
    const pending = startOneShots({ script, workerData: job, status: job.status, patienceMs: 30_000, here: (i) => i * i + 1 + herePlus, read: (i) => job.values[i]! });
    assert.equal(pending[2]!.take(), 5);
    assert.equal(pending[0]!.take(), 1);
    assert.equal(pending[3]!.take(), 9 + 1 + herePlus, 'the thread failed this one: computed here');
    assert.equal(pending[1]!.take(), 2);
    assert.deepEqual(pending.map((p) => p.fromThread), [true, true, true, false]);
  });

  it('without a script computes every result here, once however often it is taken', () => {
    const job = fixture(2, 0);
    let calls = 0;
    const pending = startOneShots({ script: null, workerData: job, status: job.status, patienceMs: 1000, here: (i) => (calls++, -i), read: () => Number.NaN });
    assert.deepEqual(pending.map((p) => p.take()), [-0, -1]);
    assert.deepEqual(pending.map((p) => p.take()), [-0, -1]);
    assert.equal(calls, 2);
    assert.ok(pending.every((p) => !p.fromThread));
  });

  it('stops the thread once every result is taken or dropped: the dropped ones are never made', async () => {
    const results = 6;
    // A thread that never skips a dropped result: only stopping it keeps the rest from being made.
    const job = fixture(results, 150, results, false);
    const pending = startOneShots({ script, workerData: job, status: job.status, patienceMs: 30_000, here: () => -1, read: (i) => job.values[i]! });
    assert.equal(pending[0]!.take(), 1);
    for (let i = 1; i < results; i++) pending[i]!.drop();
    // A thread left running would have made every result by now (5 × 150 ms after the first).
    await sleep(1500);
    for (let i = 1; i < results; i++) {
      const state = Atomics.load(job.status, i);
      assert.ok(state === PENDING || state === DROPPED, `result ${i} was made (status ${state}): the thread was not stopped`);
      assert.equal(job.values[i], 0);
    }
  });

  it('a thread with results still to be taken goes on past a dropped one, and skips it', () => {
    const job = fixture(3, 100);
    const pending = startOneShots({ script, workerData: job, status: job.status, patienceMs: 30_000, here: () => -1, read: (i) => job.values[i]! });
    pending[1]!.drop();
    assert.equal(pending[2]!.take(), 5);
    assert.equal(pending[0]!.take(), 1);
    assert.equal(Atomics.load(job.status, 1), DROPPED, 'the dropped result was skipped, not made');
    assert.equal(Atomics.load(job.status, 2), DONE);
  });
});

describe('startOneShot', function () {
  this.timeout(60_000);
  it('one result from the thread', () => {
    const job = fixture(1, 0);
    const pending = startOneShot({ script, workerData: job, status: job.status, patienceMs: 30_000, here: () => -1, read: () => job.values[0]! });
    assert.equal(pending.take(), 1);
    assert.ok(pending.fromThread);
  });
});
