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
