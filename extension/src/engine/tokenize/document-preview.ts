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
  return plainPreview(text) ?? collapsedPreview(text);
}

/**
 * The preview of a text whose first PREVIEW_LENGTH code units are printable ASCII with single
 * spaces between words, as most documents' are: those units with trailing spaces trimmed, which
 * is what collapsedPreview makes of them; null for any other text. Copied as bytes and decoded
 * natively, it costs about half of collapsedPreview's per-unit work and call (~80 against ~165 ms
 * of CPU for 50k bench documents, ~10% of a pattern tokenising thread's time), and is as flat.
 */
function plainPreview(text: string): string | null {
  const n = Math.min(text.length, PREVIEW_LENGTH);
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if ((c > 0x20 && c < 0x7f) || (c === 0x20 && i > 0 && bytes[i - 1] !== 0x20)) bytes[i] = c;
    else return null;
  }
  let end = n;
  while (end > 0 && bytes[end - 1] === 0x20) end--;
  return ascii.decode(bytes.subarray(0, end));
}

const bytes = new Uint8Array(PREVIEW_LENGTH);
// Only bytes 0x20-0x7e are ever decoded, where this decoder (windows-1252) is ASCII.
const ascii = new TextDecoder('latin1');

/** The preview of any text, unit by unit. */
function collapsedPreview(text: string): string {
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
