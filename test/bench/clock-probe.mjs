// How fast the core runs right now, beside the load average the bench prints: the host's clock
// can move by a quarter between runs minutes apart (docs/performance.md, "What-if: two rows a
// pass"), and a slow run then says more about the machine than about the code.

/**
 * A fixed loop of one dependent xor a step (one cycle on the cores here: ~0.28 ns at ~3.5 GHz),
 * in a function of its own so that V8 optimises it. An add that can leave the 32-bit range would
 * be done in floating point and truncated, and time that instead.
 */
function spin(steps, x) {
  for (let i = 0; i < steps; i++) x ^= i;
  return x;
}

let sink = 0;

/**
 * Nanoseconds per step of `spin`, the fastest of five rounds after a warm-up (the fastest is the
 * one least disturbed by other work). Lower is a faster core; compare it between runs on the
 * same machine only.
 */
export function clockProbe() {
  const steps = 1_000_000;
  let x = sink;
  for (let warm = 0; warm < 50; warm++) x = spin(steps, x);
  let best = Infinity;
  for (let round = 0; round < 5; round++) {
    const started = process.hrtime.bigint();
    for (let call = 0; call < 20; call++) x = spin(steps, x);
    const ns = Number(process.hrtime.bigint() - started) / (20 * steps);
    if (ns < best) best = ns;
  }
  sink = x; // kept, so the loop is not optimised away
  return best;
}

/** The probe as the bench prints it. */
export function clockProbeText() {
  return `clock probe ${clockProbe().toFixed(3)} ns a step (lower: a faster core)`;
}
