// Speculative what-if answers: while the pointer rests on a term's toggle (or the keyboard focus
// is on it), or once a button goes down on it, the panel asks the host for the selection that clicking it would make, so that the
// click can show its answer at once instead of waiting for a round trip through the editor's
// webview messaging and the engine. The host computes a prefetch only when no click waits, and
// a click for the same selection adopts the engine's work (ReviewSession.speculate).
//
// Answers are kept for the current state only, keyed by the selection they answer: every state
// change (a toggle, a new Report, the stop list changing on disk) drops them, so the panel never
// shows an answer for a state it is not in. A prefetch still on its way when its own toggle is
// clicked is kept as the answer that click awaits.

import type { Measures, WhatIfPrefetchMessage, WhatIfPrefetchResultMessage } from '../../extension/src/protocol';

export interface PrefetchedAnswer {
  removed: string[];
  measures: Measures;
  engineMs?: number;
  hostMs?: number;
}

interface Asked {
  key: string;
  /** The state version the prefetch was asked in; a click on its toggle moves it to the next. */
  version: number;
  /** A click made this prefetch's selection the current one: its answer is the click's. */
  awaited: boolean;
}

export class WhatIfPrefetcher {
  private nextId = 1;
  private version = 0;
  private readonly held = new Map<string, PrefetchedAnswer>();
  private readonly asked = new Map<number, Asked>();

  constructor(private readonly post: (message: WhatIfPrefetchMessage) => void) {}

  /**
   * Asks for `removed` unless it is held, or is the latest prefetch asked and still on its way.
   * (An older one may have been dropped by the host for a newer one, so it is asked again.)
   */
  ask(removed: readonly string[]): void {
    const key = selectionKey(removed);
    if (this.held.has(key)) return;
    const latest = this.asked.get(this.nextId - 1);
    if (latest !== undefined && latest.key === key && latest.version === this.version) return;
    const requestId = this.nextId++;
    this.asked.set(requestId, { key, version: this.version, awaited: false });
    this.post({ type: 'whatIfPrefetch', removed: [...removed], requestId });
  }

  /**
   * The selection became `removed` (a toggle): returns the answer held for it, if any, or
   * 'awaited' when its prefetch is still on its way (see accept), else null. Everything else
   * held or asked belongs to the old state and is dropped.
   */
  selectionChanged(removed: readonly string[]): PrefetchedAnswer | 'awaited' | null {
    const key = selectionKey(removed);
    const held = this.held.get(key) ?? null;
    // The latest asked for this selection (an older one may have been dropped for a newer one).
    let awaited: Asked | null = null;
    if (held === null) for (const a of this.asked.values()) if (a.key === key && a.version === this.version) awaited = a;
    if (awaited !== null) {
      awaited.version = this.version + 1;
      awaited.awaited = true;
    }
    this.invalidate();
    return held ?? (awaited !== null ? 'awaited' : null);
  }

  /** A change that no held answer survives (a new Report, the stop list edited on disk). */
  invalidate(): void {
    this.version += 1;
    this.held.clear();
    this.forgetOld();
  }

  /** Prefetches asked in an earlier state: their answers will be dropped, so they are not tracked. */
  private forgetOld(): void {
    for (const [id, a] of this.asked) if (a.version !== this.version) this.asked.delete(id);
  }

  /**
   * Takes a prefetch's answer: returns it when a click awaits it (the caller shows it), keeps it
   * when it is for the current state, and drops it otherwise.
   */
  accept(message: WhatIfPrefetchResultMessage): PrefetchedAnswer | null {
    const asked = this.asked.get(message.requestId);
    this.asked.delete(message.requestId);
    if (asked === undefined || asked.version !== this.version || asked.key !== selectionKey(message.removed)) return null;
    const answer: PrefetchedAnswer = { removed: [...message.removed], measures: message.measures, engineMs: message.engineMs, hostMs: message.hostMs };
    if (asked.awaited) return answer;
    this.held.set(asked.key, answer);
    return null;
  }
}

/** The same for any order of the same terms. */
export function selectionKey(removed: readonly string[]): string {
  return [...removed].sort().join('\u0000');
}
