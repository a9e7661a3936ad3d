// The word characters of the token pattern scan (extension/src/engine/tokenize/word-run-coder.ts)
// worked out once here, at build time, as ranges of UTF-16 code units, and handed to the bundles
// through esbuild's `define` (scripts/build.mjs): each tokenising thread used to test 65,536
// one-character strings against a regular expression as it started (~25 ms of CPU a thread,
// before its first batch). The test is the one word-run-coder.ts makes when running from source,
// so the table is the same as long as the build's Node knows the same Unicode version as the
// one running it (the Node this repository builds and tests with).

/** Python's `\w` on str patterns, as word-run-coder.ts writes it. */
const WORD_POINT = /^[\p{L}\p{N}_]$/u;

/**
 * The BMP code units outside the surrogates that are word characters alone, as [start, end)
 * pairs, flattened and ascending.
 */
export function wordRanges() {
  const ranges = [];
  let start = -1;
  for (let c = 0; c <= 0x10000; c++) {
    const word = c < 0x10000 && !(c >= 0xd800 && c <= 0xdfff) && WORD_POINT.test(String.fromCharCode(c));
    if (word && start < 0) start = c;
    else if (!word && start >= 0) {
      ranges.push(start, c);
      start = -1;
    }
  }
  return ranges;
}
