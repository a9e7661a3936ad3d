/**
 * Standard normal draws from a uniform generator by the Box–Muller transform
 * (Box & Muller, "A note on the generation of random normal deviates", Ann. Math. Stat. 29, 1958).
 * Used to build reproducible synthetic point clouds for checks and benchmarks.
 */
export function standardNormal(random: () => number): number {
  // 1 − u keeps the logarithm's argument in (0, 1].
  const u = 1 - random();
  const v = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
