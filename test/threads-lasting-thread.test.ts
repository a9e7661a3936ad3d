// Lasting threads (engine/threads/lasting-thread.ts): a thread whose job is done waits a while
// for another job over the same data and takes it, instead of a new thread being started; it
// leaves once it has waited long enough, and a caller that drops a result it is still making
// stops it. The fixture thread answers value × factor and its threadId (its own rule; common
// practice, no source): what is checked is which thread answered, and when.
import { strict as assert } from 'node:assert';
import { join } from 'node:path';
import { LastingThreads, type LastingHandle } from '../extension/src/engine/threads/lasting-thread';
import { startOneShot } from '../extension/src/engine/threads/one-shot-thread';
import type { LastingFixtureData, LastingFixtureJob } from './support/lasting-fixture-thread';

const script = join(__dirname, 'support', 'lasting-fixture-thread.ts');
const sleep = (ms: number): Promise<void> => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * A claim retried for a while: a thread goes from its job to waiting just after it answers,
 * which on a loaded machine can take a moment.
 */
async function claimSoon<Tag>(threads: LastingThreads<Tag>, key: object, fits: (tag: Tag) => boolean, j: LastingFixtureJob): Promise<LastingHandle | null> {
  for (let tries = 0; tries < 250; tries++) {
    const claimed = threads.claim(key, fits, j);
    if (claimed !== null) return claimed;
    await sleep(20);
  }
  return null;
}

function job(value: number, delayMs = 0): LastingFixtureJob {
  return { value, out: new Float64Array(new SharedArrayBuffer(16)), status: new Int32Array(new SharedArrayBuffer(4)), delayMs };
}

/** The job's answer through startOneShot on `handle` (here: -1), and the thread that made it. */
function answer(j: LastingFixtureJob, handle: LastingHandle | null): { value: number; thread: number; fromThread: boolean } {
  const pending = startOneShot({ script: null, ...(handle !== null ? { thread: handle } : {}), workerData: null, status: j.status, patienceMs: 30_000, here: () => -1, read: () => j.out[0]! });
  const value = pending.take();
  return { value, thread: j.out[1]!, fromThread: pending.fromThread };
}

describe('LastingThreads', function () {
  this.timeout(60_000);

  it('a second job over the same data goes to the thread that is waiting, and a job over other data to a new one', async () => {
    const threads = new LastingThreads<string>();
    const key = {};
    const first = job(2);
    const started = threads.start(script, key, 'a', 5_000, (link): LastingFixtureData => ({ ...first, factor: 10, link }));
    assert.ok(started !== null);
    const a = answer(first, started);
    assert.deepEqual([a.value, a.fromThread], [20, true]);
    const second = job(3);
    const claimed = await claimSoon(threads, key, (tag) => tag === 'a', second);
    assert.ok(claimed !== null, 'the waiting thread was claimed');
    const b = answer(second, claimed);
    assert.deepEqual([b.value, b.thread, b.fromThread], [30, a.thread, true], 'the same thread, with the factor it was started with');
    await sleep(200);
    assert.equal(threads.claim(key, (tag) => tag === 'b', job(4)), null, 'a thread for other data is not claimed');
    assert.equal(threads.claim({}, () => true, job(4)), null, 'nor under another key');
    await started.worker.terminate();
  });

  it('a thread that has waited long enough leaves, and is not claimed after', async () => {
    const threads = new LastingThreads<null>();
    const key = {};
    const first = job(1);
    const started = threads.start(script, key, null, 150, (link): LastingFixtureData => ({ ...first, factor: 1, link }));
    assert.ok(started !== null);
    assert.equal(answer(first, started).value, 1);
    const exited = new Promise<number>((resolve) => started.worker.once('exit', resolve));
    assert.equal(await exited, 0, 'it ended on its own');
    assert.equal(threads.claim(key, () => true, job(2)), null);
  });

  it('a job dropped before it was made stops the thread; one dropped after it was made does not', async () => {
    const threads = new LastingThreads<null>();
    const key = {};
    const slow = job(1, 2_000);
    const started = threads.start(script, key, null, 5_000, (link): LastingFixtureData => ({ ...slow, factor: 1, link }));
    assert.ok(started !== null);
    const exited = new Promise<void>((resolve) => started.worker.once('exit', () => resolve()));
    const pending = startOneShot({ script: null, thread: started, workerData: null, status: slow.status, patienceMs: 30_000, here: () => -1, read: () => slow.out[0]! });
    await sleep(100);
    pending.drop();
    await exited;
    assert.equal(threads.claim(key, () => true, job(2)), null, 'a stopped thread is not claimed');

    const quick = job(5);
    const other = threads.start(script, key, null, 5_000, (link): LastingFixtureData => ({ ...quick, factor: 1, link }));
    assert.ok(other !== null);
    const done = startOneShot({ script: null, thread: other, workerData: null, status: quick.status, patienceMs: 30_000, here: () => -1, read: () => quick.out[0]! });
    while (Atomics.load(quick.status, 0) === 0) await sleep(10);
    done.drop();
    const again = job(6);
    const claimed = await claimSoon(threads, key, () => true, again);
    assert.ok(claimed !== null, 'still waiting after a drop of a result already made');
    assert.equal(answer(again, claimed).value, 6);
    await other.worker.terminate();
  });
});
