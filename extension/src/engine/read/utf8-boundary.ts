import { isUtf8 } from 'node:buffer';

/**
 * Length of the longest prefix that does not end inside a multi-byte UTF-8 sequence, so a chunk
 * can be decoded now and its last 1–3 bytes carried to the next chunk. Lead-byte ranges per
 * RFC 3629 §3.
 */
export function completeUtf8Length(bytes: Uint8Array): number {
  const n = bytes.length;
  for (let back = 1; back <= 4 && back <= n; back++) {
    const b = bytes[n - back] as number;
    if ((b & 0xc0) === 0x80) continue; // continuation byte: keep looking for the lead
    const need = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
    return need > back ? n - back : n;
  }
  return n;
}

/** Well-formed multi-byte UTF-8 sequences and bytes that belong to none (RFC 3629 §4). */
export function utf8Census(b: Uint8Array): { validMultiByte: number; invalid: number; firstInvalid: number } {
  let validMultiByte = 0;
  let invalid = 0;
  let firstInvalid = -1;
  for (let i = 0; i < b.length; ) {
    const c = b[i]!;
    if (c < 0x80) {
      i++;
      continue;
    }
    const need = c >= 0xc2 && c <= 0xdf ? 1 : c >= 0xe0 && c <= 0xef ? 2 : c >= 0xf0 && c <= 0xf4 ? 3 : -1;
    if (need > 0 && i + need < b.length && isUtf8(b.subarray(i, i + need + 1))) {
      validMultiByte++;
      i += need + 1;
    } else {
      if (firstInvalid < 0) firstInvalid = i;
      invalid++;
      i++;
    }
  }
  return { validMultiByte, invalid, firstInvalid: Math.max(0, firstInvalid) };
}
