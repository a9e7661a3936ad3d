/**
 * Code point order (as Python's sorted() orders str), through UTF-8 bytes, whose byte order is
 * code point order; for the few strings (file keys, tie-breaks) sorted below the matrix layer.
 */
export function compareUtf8(a: string, b: string): number {
  return a === b ? 0 : Buffer.compare(Buffer.from(a, 'utf8'), Buffer.from(b, 'utf8'));
}
