import { MessageChannel, receiveMessageOnPort, type MessagePort, type Worker } from 'node:worker_threads';
import { startThread } from './thread-script';

/**
 * Threads that, once their job is done, wait a while for another job of the same kind over the
 * same data before they leave, so that a caller with a second job a moment later hands it to a
 * thread already started, with its code already compiled, instead of starting one: a thread's
 * own start is ~65 ms of CPU here and its hot code runs unoptimised until compiled again. The
 * jobs are one-shot jobs (one-shot-thread.ts: the results come back through shared memory and the
 * caller waits with Atomics.wait, never for a message), so a waiting thread blocks on its control
 * word and takes the job from its port with receiveMessageOnPort; neither side needs its event
 * loop to run.
 *
 * control[0] moves BUSY → IDLE (the thread, job done) → CLAIMED (a caller, by compare-exchange,
 * so one caller at most) → POSTED (the caller, once the job is on the port) → BUSY (the thread);
 * IDLE → GONE when the thread has waited long enough (by compare-exchange, so a thread is never
 * claimed as it leaves), or any → GONE when the caller stops it.
 */
export const BUSY = 0;
export const IDLE = 1;
export const CLAIMED = 2;
export const POSTED = 3;
export const GONE = 4;

/** What a lasting thread is started with, beside its first job (in its workerData). */
export interface LastingLink {
  /** control[0]: BUSY, IDLE, CLAIMED, POSTED or GONE, on a SharedArrayBuffer. */
  control: Int32Array;
  port: MessagePort;
  /** How long the thread waits for another job once its job is done. */
  waitMs: number;
}

/**
 * In the thread, once its job is done: the next job a caller hands it, or null when none came
 * within `link.waitMs` (or the caller stopped it): the thread then ends.
 */
export function nextJob<J>(link: LastingLink): J | null {
  const { control, port } = link;
  if (Atomics.compareExchange(control, 0, BUSY, IDLE) !== BUSY) return null;
  const deadline = performance.now() + link.waitMs;
  for (;;) {
    const state = Atomics.load(control, 0);
    if (state === POSTED) {
      // The caller posts the job before it sets POSTED, and a post is queued at once.
      const received = receiveMessageOnPort(port);
      Atomics.store(control, 0, BUSY);
      return received === undefined ? null : (received.message as J);
    }
    if (state === GONE) return null;
    if (state === IDLE) {
      const left = deadline - performance.now();
      if (left <= 0) {
        if (Atomics.compareExchange(control, 0, IDLE, GONE) === IDLE) return null;
        continue; // claimed just now
      }
      Atomics.wait(control, 0, IDLE, left);
    } else {
      Atomics.wait(control, 0, state, 1000); // CLAIMED: the job is being posted
    }
  }
}

/** A lasting thread as one-shot-thread.ts's `thread`: given back once its results are taken. */
export interface LastingHandle {
  worker: Worker;
  release(unfinishedDropped: boolean): void;
}

interface Waiting<Tag> {
  worker: Worker;
  control: Int32Array;
  port: MessagePort;
  tag: Tag;
}

/**
 * The lasting threads of one kind, by the data they were started on (`key`, held weakly: a
 * thread's data is let go with its key once the thread has left).
 */
export class LastingThreads<Tag> {
  private readonly byKey = new WeakMap<object, Array<Waiting<Tag>>>();

  /**
   * A thread of `key` whose tag `fits`, waiting, handed `job` (posted on its port); null when
   * none is waiting.
   */
  claim(key: object, fits: (tag: Tag) => boolean, job: unknown): LastingHandle | null {
    const list = this.byKey.get(key);
    if (list === undefined) return null;
    for (const t of list) {
      if (!fits(t.tag) || Atomics.compareExchange(t.control, 0, IDLE, CLAIMED) !== IDLE) continue;
      try {
        t.port.postMessage(job);
      } catch {
        Atomics.store(t.control, 0, IDLE);
        Atomics.notify(t.control, 0);
        return null;
      }
      Atomics.store(t.control, 0, POSTED);
      Atomics.notify(t.control, 0);
      return this.handle(key, t);
    }
    return null;
  }

  /**
   * Starts a thread on `script` whose workerData is `data(link)` (its first job and the link it
   * waits on), kept under `key` for later claims; null when it cannot start.
   */
  start(script: string, key: object, tag: Tag, waitMs: number, data: (link: LastingLink) => unknown): LastingHandle | null {
    const prepared = this.prepare(waitMs);
    let worker: Worker;
    try {
      worker = startThread(script, { workerData: data(prepared.link), transferList: [prepared.link.port] });
    } catch {
      prepared.cancel();
      return null;
    }
    worker.on('error', () => undefined);
    worker.unref();
    return prepared.keep(worker, key, tag);
  }

  /**
   * A link for a thread that is already running another kind of job (the threads that write the
   * count matrix's rows): hand `link` to it (its port in the message's transfer list), and once
   * it is waiting on it, `keep` it under `key` for later claims; `cancel` if it never will be.
   */
  prepare(waitMs: number): { link: LastingLink; keep(worker: Worker, key: object, tag: Tag): LastingHandle; cancel(): void } {
    const control = new Int32Array(new SharedArrayBuffer(4));
    const { port1, port2 } = new MessageChannel();
    port1.unref();
    return {
      link: { control, port: port2, waitMs },
      keep: (worker, key, tag) => {
        // A waiting thread never keeps the process alive: it is only there in case a job comes.
        worker.unref();
        const t: Waiting<Tag> = { worker, control, port: port1, tag };
        const list = this.byKey.get(key) ?? [];
        list.push(t);
        this.byKey.set(key, list);
        worker.on('exit', () => {
          Atomics.store(control, 0, GONE);
          this.forget(key, t);
        });
        return this.handle(key, t);
      },
      cancel: () => port1.close(),
    };
  }

  private handle(key: object, t: Waiting<Tag>): LastingHandle {
    return {
      worker: t.worker,
      release: (unfinishedDropped) => {
        // A result dropped before it was made may be in the making: stopped, as one-shot threads are.
        if (!unfinishedDropped) return;
        Atomics.store(t.control, 0, GONE);
        Atomics.notify(t.control, 0);
        this.forget(key, t);
        void t.worker.terminate();
      },
    };
  }

  private forget(key: object, t: Waiting<Tag>): void {
    const list = this.byKey.get(key);
    if (list === undefined) return;
    const at = list.indexOf(t);
    if (at < 0) return;
    list.splice(at, 1);
    if (list.length === 0) this.byKey.delete(key);
    t.port.close();
  }
}
