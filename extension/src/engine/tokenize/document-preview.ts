/** Longest preview kept per document (UTF-16 units; never ends inside a surrogate pair). */
export const PREVIEW_LENGTH = 120;

/**
 * The first PREVIEW_LENGTH characters of `text` with runs of whitespace collapsed to one
 * space and the ends trimmed. Reads only as far as it needs, so a huge document costs no more
 * than a short one. The preview is made from its code units in one step: one flat string that
 * holds nothing of `text` (built with `+=` it was a rope of ~100 pieces, a few KB per document
 * kept for the whole review: gigabytes at a million documents).
 */
export function documentPreview(text: string): string {
  let n = 0;
  let pendingSpace = false;
  for (let i = 0; i < text.length && n < PREVIEW_LENGTH; i++) {
    const c = text.charCodeAt(i);
    if (isSpace(c)) {
      pendingSpace = n > 0;
      continue;
    }
    if (pendingSpace) {
      units[n++] = 0x20;
      pendingSpace = false;
      if (n >= PREVIEW_LENGTH) break;
    }
    units[n++] = c;
  }
  // Never end inside a surrogate pair, nor on the space that stood for a cut run.
  if (n > 0 && units[n - 1]! >= 0xd800 && units[n - 1]! <= 0xdbff) n--;
  while (n > 0 && units[n - 1] === 0x20) n--;
  return String.fromCharCode.apply(null, units.subarray(0, n) as unknown as number[]);
}

const units = new Uint16Array(PREVIEW_LENGTH);

function isSpace(c: number): boolean {
  return c === 0x20 || (c >= 0x09 && c <= 0x0d) || c === 0xa0 || c === 0x1680 || (c >= 0x2000 && c <= 0x200a) ||
    c === 0x2028 || c === 0x2029 || c === 0x202f || c === 0x205f || c === 0x3000 || c === 0xfeff;
}
