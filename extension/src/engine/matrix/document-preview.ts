/** Longest preview kept per document (UTF-16 units; never ends inside a surrogate pair). */
export const PREVIEW_LENGTH = 120;

/**
 * The first PREVIEW_LENGTH characters of `text` with runs of whitespace collapsed to one
 * space and the ends trimmed. Reads only as far as it needs, so a huge document costs no more
 * than a short one.
 */
export function documentPreview(text: string): string {
  let out = '';
  let pendingSpace = false;
  for (let i = 0; i < text.length && out.length < PREVIEW_LENGTH; i++) {
    const c = text.charCodeAt(i);
    if (isSpace(c)) {
      pendingSpace = out.length > 0;
      continue;
    }
    if (pendingSpace) {
      out += ' ';
      pendingSpace = false;
      if (out.length >= PREVIEW_LENGTH) break;
    }
    out += text[i];
  }
  if (out.length > PREVIEW_LENGTH) out = out.slice(0, PREVIEW_LENGTH);
  if (out.length > 0) {
    const last = out.charCodeAt(out.length - 1);
    if (last >= 0xd800 && last <= 0xdbff) out = out.slice(0, -1);
  }
  return out.trimEnd();
}

function isSpace(c: number): boolean {
  return c === 0x20 || (c >= 0x09 && c <= 0x0d) || c === 0xa0 || c === 0x1680 || (c >= 0x2000 && c <= 0x200a) ||
    c === 0x2028 || c === 0x2029 || c === 0x202f || c === 0x205f || c === 0x3000 || c === 0xfeff;
}
