interface Settle<T> {
  resolve(value: T): void;
  reject(error: Error): void;
}

/**
 * Requests posted to a thread that wait for their replies by number. A failure of the thread
 * (an error, an exit, a close) rejects every waiting request and every later one, so no caller
 * waits forever on a thread that is gone.
 */
export class PendingReplies<T> {
  private nextId = 1;
  private readonly waiting = new Map<number, Settle<T>>();
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
   * Registers a request under `id` (by default the next number, from 1), posts it with
   * `post(id)` and returns the promise of its reply. After a failure nothing is posted and the
   * promise is rejected with it; a `post` that throws (a message that cannot be cloned) drops
   * the request and rejects it with that error, so it never waits for a reply that cannot come.
   */
  request(post: (id: number) => void, id: number = this.nextId++): Promise<T> {
    if (this.firstFailure !== null) return Promise.reject(this.firstFailure);
    // Two requests under one number would leave the first waiting forever.
    if (this.waiting.has(id)) return Promise.reject(new Error(`request ${id} is already waiting for its reply`));
    return new Promise<T>((resolve, reject) => {
      this.waiting.set(id, { resolve, reject });
      try {
        post(id);
      } catch (e) {
        this.waiting.delete(id);
        throw e;
      }
    });
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

  /** The thread is gone: every waiting request, and every later one, is rejected with the first failure. */
  fail(error: Error): void {
    this.firstFailure ??= error;
    const all = [...this.waiting.values()];
    this.waiting.clear();
    for (const p of all) p.reject(this.firstFailure);
  }

  private take(id: number): Settle<T> | undefined {
    const p = this.waiting.get(id);
    this.waiting.delete(id);
    return p;
  }
}
