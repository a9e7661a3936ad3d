// Reads a number as the panel prints it ("0.0412", "41.2%", "1,234", "−0.31", "1.2e-4", "—")
// and says how far from it the true value may lie: half a unit in the last digit shown. This
// checks the panel against the CLI without reusing the panel's own formatter.

/** @returns {{ value: number, halfUnit: number } | null} null for the "no value" dash */
export function parseShown(text) {
  let t = text.trim().replace(/\u2212/g, '-').replace(/,/g, '').replace(/×$/, '');
  if (t === '—' || t === '') return null;
  let scale = 1;
  if (t.endsWith('%')) {
    scale = 0.01;
    t = t.slice(0, -1);
  }
  const m = /^(-?)(\d+)(?:\.(\d+))?(?:e([-+]?\d+))?$/i.exec(t);
  if (!m) throw new Error(`not a number as the panel prints one: "${text}"`);
  const decimals = m[3]?.length ?? 0;
  const exponent = m[4] ? Number(m[4]) : 0;
  const value = Number(t) * scale;
  const halfUnit = 0.5 * 10 ** (exponent - decimals) * scale;
  return { value, halfUnit };
}

/** Throws unless `expected` (null = no value) rounds to what the panel shows. */
export function assertShows(text, expected, what) {
  const shown = parseShown(text);
  if (expected === null || expected === undefined || !Number.isFinite(expected)) {
    if (shown !== null) throw new Error(`${what}: panel shows "${text}", expected no value (the engine gives ${expected})`);
    return;
  }
  if (shown === null) throw new Error(`${what}: panel shows no value, the engine gives ${expected}`);
  // A hair over half a unit: the engine's float and its printed rounding may differ in the last bit.
  if (Math.abs(shown.value - expected) > shown.halfUnit * 1.000001 + 1e-12) {
    throw new Error(`${what}: panel shows "${text}", the engine gives ${expected}`);
  }
}
