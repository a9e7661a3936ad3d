// The bytes 0x80–0x9F are where windows-1252 differs from ISO-8859-1; everything else maps
// byte = code point. Source: WHATWG Encoding Standard, index-windows-1252 (from memory; the test
// checks a few against Python's cp1252 codec). The five unassigned bytes keep their C1 code point,
// as the WHATWG decoder does.
const HIGH_CONTROL_MAP: readonly number[] = [
  0x20ac, 0x0081, 0x201a, 0x0192, 0x201e, 0x2026, 0x2020, 0x2021, 0x02c6, 0x2030, 0x0160, 0x2039, 0x0152, 0x008d, 0x017d, 0x008f,
  0x0090, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x02dc, 0x2122, 0x0161, 0x203a, 0x0153, 0x009d, 0x017e, 0x0178,
];

const C1_RANGE = /[\u0080-\u009f]/g;

/**
 * Decodes windows-1252 ("Latin-1" as Windows writes it). Node's TextDecoder('windows-1252')
 * decodes as ISO-8859-1 instead, which turns curly quotes and the euro sign into C1 controls.
 */
export function decodeWindows1252(bytes: Uint8Array): string {
  const latin1 = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('latin1');
  return latin1.replace(C1_RANGE, (c) => String.fromCharCode(HIGH_CONTROL_MAP[c.charCodeAt(0) - 0x80] as number));
}
