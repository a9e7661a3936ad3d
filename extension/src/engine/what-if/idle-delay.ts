/**
 * How long the what-if's idle-time work (the rounding resets after an answer) waits before it
 * starts: by then the answer has crossed to the panel and been drawn (in the real editor the
 * panel ⇄ host messages took ~70–90 ms and the panel's own work ~30 ms, test/e2e), so that
 * work does not take the two cores from them. A click that comes sooner does the reset itself
 * first, as it would have without idle time, so the answers never depend on the timing.
 */
export const IDLE_DELAY_MS = 150;

/** Runs `work` after IDLE_DELAY_MS without keeping the process or thread alive for it. */
export function afterIdleDelay(work: () => void): void {
  setTimeout(work, IDLE_DELAY_MS).unref();
}
