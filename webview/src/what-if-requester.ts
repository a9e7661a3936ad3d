// Asks the host for what-if measures without waiting for a pause in the reader's clicking: a
// click is sent at once when nothing is being computed; clicks made while an answer is on its
// way are coalesced into one request for the latest selection, sent when that answer arrives
// (the last one wins). So a single click costs one round trip, and a burst costs at most two.

import type { WhatIfRequestMessage } from '../../extension/src/protocol';

export class WhatIfRequester {
  private latestId = 0;
  private answeredId = 0;
  /** The request the host is computing, if any. */
  private inFlight: number | null = null;
  /** The latest selection, not sent yet because another request was in flight. */
  private waiting: { requestId: number; removed: string[] } | null = null;

  constructor(private readonly post: (message: WhatIfRequestMessage) => void) {}

  /** Asks for `removed`: now when the host is free, else as soon as its current answer arrives. */
  schedule(removed: readonly string[]): void {
    const requestId = ++this.latestId;
    if (this.inFlight === null) this.send(requestId, [...removed]);
    else this.waiting = { requestId, removed: [...removed] };
  }

  /** Drops any waiting request; answers to earlier requests will be ignored. */
  cancel(): void {
    this.waiting = null;
    this.latestId += 1;
    this.answeredId = this.latestId;
  }

  /**
   * Called with every answer: frees the host for the waiting request, and returns true when
   * `requestId` answers the latest request (and marks it answered).
   */
  accept(requestId: number): boolean {
    if (requestId === this.inFlight) this.inFlight = null;
    this.sendWaiting();
    if (requestId !== this.latestId) return false;
    this.answeredId = requestId;
    return true;
  }

  /** The host reported an error instead of an answer: nothing is in flight any more. */
  failed(): void {
    this.inFlight = null;
    this.waiting = null;
    this.answeredId = this.latestId;
  }

  get pending(): boolean {
    return this.answeredId !== this.latestId;
  }

  private sendWaiting(): void {
    if (this.inFlight !== null || this.waiting === null) return;
    const { requestId, removed } = this.waiting;
    this.waiting = null;
    this.send(requestId, removed);
  }

  private send(requestId: number, removed: string[]): void {
    this.inFlight = requestId;
    this.post({ type: 'whatIf', removed, requestId });
  }
}
