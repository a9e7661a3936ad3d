// Terminal output rules (issue 10 part 5): lines of at most 100 characters, counted nouns that
// agree with their number, one progress line that rewrites itself on a terminal. Common
// practice, no source (80–100 columns is the usual terminal convention).
import assert from 'node:assert/strict';
import { progressLine } from '../extension/src/cli/progress-line';
import { count, verb, wrapLines } from '../extension/src/cli/text-layout';
import { formatText } from '../extension/src/cli/format-text';
import { formatMarkdown } from '../extension/src/cli/format-markdown';
import type { Report } from '../extension/src/protocol';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';

describe('count and verb', () => {
  it('count() and verb() agree with the number (English: singular for exactly 1)', () => {
    assert.equal(count(1, 'term'), '1 term');
    assert.equal(count(0, 'term'), '0 terms');
    assert.equal(count(2, 'entry', 'entries'), '2 entries');
    assert.equal(`1 never ${verb(1, 'occurs', 'occur')}`, '1 never occurs');
    assert.equal(`3 never ${verb(3, 'occurs', 'occur')}`, '3 never occur');
  });
});

describe('wrapLines', () => {
  it('wrapLines leaves short lines alone and breaks long ones at spaces, continuing 4 deeper than the line’s indent', () => {
    assert.deepEqual(wrapLines(['short'], 10), ['short']);
    assert.deepEqual(wrapLines(['aaa bbb ccc ddd'], 10), ['aaa bbb', '    ccc', '    ddd']);
    assert.deepEqual(wrapLines(['  aa bb cc dd ee ff gg'], 14), ['  aa bb cc dd', '      ee ff gg']);
  });

  it('wrapLines cuts a word longer than the width (a URL) rather than overflow, and counts code points', () => {
    const out = wrapLines(['x https://example.org/a/very/long/path'], 12);
    for (const line of out) assert.ok([...line].length <= 12, line);
    assert.equal(out.join('').replace(/\s/g, ''), 'xhttps://example.org/a/very/long/path');
    assert.deepEqual(wrapLines(['×'.repeat(10)], 10), ['×'.repeat(10)]);
  });
});

describe('formatText layout', () => {
  const report = JSON.parse(readFileSync(path.join(__dirname, 'fixtures', 'report-small.json'), 'utf8')) as Report;

  it('formatText keeps every line within 100 characters and words counts in agreement', () => {
    const one: Report = { ...report, stopList: { ...report.stopList, unused: ['x'] }, input: { ...report.input, skipped: 1 } };
    const text = formatText(one);
    for (const line of text.split('\n')) assert.ok([...line].length <= 100, `${[...line].length}: ${line}`);
    assert.match(text, /1 never occurs: x\)/);
    // The Markdown names the stop list in force too, with the same words.
    assert.match(formatMarkdown(one), /\nStop list: stoplist\.txt \(12 terms, 1 never occurs: x\)\n/);
    assert.match(text, /; 1 row skipped/);
    assert.doesNotMatch(text, /\b1 (terms|rows|documents)\b/);
  });

  it('formatText and formatMarkdown say which config was read and where the settings came from', () => {
    const withProvenance: Report = {
      ...report,
      provenance: { config: { file: '/p/loudword.json', how: 'nearest' }, sources: { label: { from: 'loudword.json', where: '/p/loudword.json:3' }, 'sample.k': { from: 'command-line flag', where: '--k' } } },
    };
    assert.match(formatText(withProvenance), /^Config: \/p\/loudword\.json \(nearest to the corpus\): label; flags: --k$/m);
    assert.match(formatMarkdown(withProvenance), /^Config: \/p\/loudword\.json \(nearest to the corpus\): label; flags: --k$/m);
  });

  it('formatText and formatMarkdown both carry the input notes (an encoding read as windows-1252, duplicates)', () => {
    const withNotes: Report = { ...report, input: { ...report.input, notes: ['read as windows-1252 from byte offset 40', '12 documents (3%) repeat another document exactly'] } };
    assert.match(formatText(withNotes), /^Note: read as windows-1252 from byte offset 40$/m);
    assert.match(formatMarkdown(withNotes), /^> 12 documents \(3%\) repeat another document exactly$/m);
  });
});

describe('progressLine', () => {
  const sink = (isTTY: boolean) => {
    const written: string[] = [];
    return { written, stream: { isTTY, write: (s: string) => written.push(s) > 0 } };
  };

  it('progressLine on a terminal rewrites one line (carriage return + erase line, ECMA-48 EL) and wipes it at the end', () => {
    const { written, stream } = sink(true);
    let t = 0;
    const p = progressLine(stream, true, () => t);
    p.stage('reading');
    t = 3_000;
    p.stage('tokenizing');
    p.clear();
    p.clear();
    assert.deepEqual(written, ['\r\x1b[2Kloudword: reading…', '\r\x1b[2Kloudword: tokenizing… 3 s', '\r\x1b[2K']);
    assert.ok(written.every((w) => !w.includes('\n')));
  });

  it('progressLine writes nothing when standard error is not a terminal, or with --quiet', () => {
    for (const [tty, enabled] of [[false, true], [true, false]] as const) {
      const { written, stream } = sink(tty);
      const p = progressLine(stream, enabled);
      p.stage('reading');
      p.clear();
      assert.deepEqual(written, []);
    }
  });
});
