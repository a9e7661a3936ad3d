// Issue 13: "a 560 MB single line" was an internal error with a stack (the line could not be
// joined into one string: V8 caps strings near 2^29 characters). A line past MAX_LINE_CHARS is now
// skipped with its line number and a reason, and the lines after it keep their numbers. The
// splitter is tested with a small bound; the real bound was checked by hand (see the commit).
// Source of the V8 limit: V8's String::kMaxLength (from memory).
import { strict as assert } from 'node:assert';
import { LineSplitter, MAX_LINE_CHARS } from '../../extension/src/engine/read/line-splitter';

function split(chunks: string[], max: number, dropPartial = false) {
  const lines: Array<[number, string]> = [];
  const tooLong: Array<[number, number]> = [];
  const s = new LineSplitter(max, (line, chars) => tooLong.push([line, chars]));
  for (const c of chunks) s.push(c, (t, l) => lines.push([l, t]));
  s.end((t, l) => lines.push([l, t]), dropPartial);
  return { lines, tooLong };
}

describe('bad input: a line too long to hold is skipped, not a crash', () => {
  it('a long line across many chunks is reported with its number and length; later lines keep theirs', () => {
    const r = split(['ok\nxxxx', 'xxxx', 'xxxx', 'x\nafter\n'], 10);
    assert.deepEqual(r.lines, [[1, 'ok'], [3, 'after']]);
    assert.deepEqual(r.tooLong, [[2, 13]]);
  });

  it('a long line inside one chunk, and one at the end without a line break', () => {
    const r = split(['a\n' + 'y'.repeat(20) + '\nb\n' + 'z'.repeat(11)], 10);
    assert.deepEqual(r.lines, [[1, 'a'], [3, 'b']]);
    assert.deepEqual(r.tooLong, [[2, 20], [4, 11]]);
  });

  it('a line of exactly the bound is kept; a cut (dropPartial) reports nothing', () => {
    assert.deepEqual(split(['12345', '67890\n'], 10).lines, [[1, '1234567890']]);
    assert.deepEqual(split(['1234567890', '1'], 10, true), { lines: [], tooLong: [] });
  });

  it('the default bound stays well below the V8 string limit (2^29 - 24 characters)', () => {
    assert.ok(MAX_LINE_CHARS <= 2 ** 28, String(MAX_LINE_CHARS));
  });
});
