// Asks the host for what-if measures at most once per pause in the reader's clicking, and
// remembers which request is the latest so a slow answer to an old request is ignored.

import type { WhatIfRequestMessage } from '../../extension/src/protocol';

export class WhatIfRequester {
  private latestId = 0;
  private answeredId = 0;
  private timer: ReturnType<typeof setTimeout> | undefined;

  constructor(
    private readonly post: (message: WhatIfRequestMessage) => void,
    private readonly delayMs = 150,
  ) {}

  /** Sends `removed` after `delayMs` unless another call comes first. */
  schedule(removed: readonly string[]): void {
    clearTimeout(this.timer);
    const requestId = ++this.latestId;
    this.timer = setTimeout(() => this.post({ type: 'whatIf', removed: [...removed], requestId }), this.delayMs);
  }

  /** Drops any pending request; answers to earlier requests will be ignored. */
  cancel(): void {
    clearTimeout(this.timer);
    this.latestId += 1;
    this.answeredId = this.latestId;
  }

  /** True when `requestId` answers the latest request (and marks it answered). */
  accept(requestId: number): boolean {
    if (requestId !== this.latestId) return false;
    this.answeredId = requestId;
    return true;
  }

  get pending(): boolean {
    return this.answeredId !== this.latestId;
  }
}
