/**
 * Requests sent to a thread that wait for their replies by number. A failure of the thread
 * (an error, an exit, a close) rejects every waiting request and every later one, so no caller
 * waits forever on a thread that is gone.
 */
export class PendingReplies<T> {
  private nextId = 1;
  private readonly waiting = new Map<number, { resolve(value: T): void; reject(error: Error): void }>();
  private firstFailure: Error | null = null;

  /** The first failure, or null while the thread works. */
  get failure(): Error | null {
    return this.firstFailure;
  }

  /** Requests still waiting for their reply. */
  get size(): number {
    return this.waiting.size;
  }

  /**
   * Registers a request under `id` (by default the next number) and returns the promise of its
   * reply; after a failure the promise is rejected with it at once.
   */
  expect(id: number = this.nextId++): { id: number; reply: Promise<T> } {
    if (this.firstFailure !== null) return { id, reply: Promise.reject(this.firstFailure) };
    const reply = new Promise<T>((resolve, reject) => this.waiting.set(id, { resolve, reject }));
    return { id, reply };
  }

  /** Settles request `id` with its reply; false when no such request waits (it already failed). */
  resolve(id: number, value: T): boolean {
    const p = this.take(id);
    p?.resolve(value);
    return p !== undefined;
  }

  /** Rejects request `id` alone (the thread answered it with an error and goes on). */
  reject(id: number, error: Error): boolean {
    const p = this.take(id);
    p?.reject(error);
    return p !== undefined;
  }

  /** The thread is gone: every waiting request, and every later one, is rejected. */
  fail(error: Error): void {
    this.firstFailure ??= error;
    const all = [...this.waiting.values()];
    this.waiting.clear();
    for (const p of all) p.reject(this.firstFailure);
  }

  private take(id: number): { resolve(value: T): void; reject(error: Error): void } | undefined {
    const p = this.waiting.get(id);
    this.waiting.delete(id);
    return p;
  }
}
