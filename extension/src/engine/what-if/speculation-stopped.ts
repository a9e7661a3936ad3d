/**
 * A what-if prefetch abandoned part way because a click came (the panel's clicks always win,
 * ReviewSession.speculate). Thrown by the `interrupt` callbacks the speculative paths call between
 * rows; the copy it was computed in is dropped, and the state the clicks walk was never touched.
 */
export class SpeculationStopped extends Error {
  constructor() {
    super('what-if prefetch stopped: a click came');
    this.name = 'SpeculationStopped';
  }
}

/**
 * The interrupt of a prefetch started while `counter[0]` (the clicks sent so far, counted by
 * the host in shared memory) was what it is now: it throws once a click has been sent since.
 */
export function stopOnClick(counter: Int32Array, seen = Atomics.load(counter, 0)): () => void {
  return () => {
    if (Atomics.load(counter, 0) !== seen) throw new SpeculationStopped();
  };
}
