/**
 * Where two Reports differ: numbers beyond `tolerance` (relative to max(1, |a|)), anything else
 * that is not equal. `timings` (wall clock) is left out. Returns the differences (empty = same)
 * and the largest numeric difference seen, for the test to print.
 */
export function reportDifferences(a: unknown, b: unknown, tolerance = 1e-12): { differences: string[]; largest: number } {
  const differences: string[] = [];
  let largest = 0;
  const walk = (x: unknown, y: unknown, at: string): void => {
    if (at === '.timings') return;
    if (typeof x === 'number' && typeof y === 'number') {
      const d = Number.isNaN(x) && Number.isNaN(y) ? 0 : Math.abs(x - y) / Math.max(1, Math.abs(x));
      largest = Math.max(largest, d);
      if (!(d <= tolerance)) differences.push(`${at}: ${x} vs ${y}`);
      return;
    }
    if (x === null || y === null || typeof x !== 'object' || typeof y !== 'object') {
      if (x !== y) differences.push(`${at}: ${JSON.stringify(x)?.slice(0, 100)} vs ${JSON.stringify(y)?.slice(0, 100)}`);
      return;
    }
    if (Array.isArray(x) !== Array.isArray(y)) {
      differences.push(`${at}: array vs object`);
      return;
    }
    const keys = new Set([...Object.keys(x as object), ...Object.keys(y as object)]);
    for (const k of keys) walk((x as Record<string, unknown>)[k], (y as Record<string, unknown>)[k], `${at}.${k}`);
  };
  walk(a, b, '');
  return { differences, largest };
}
