import assert from 'node:assert/strict';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { addTermsToStopList } from '../extension/src/engine/stoplist/add-terms-to-stop-list';
import { parseStopList } from '../extension/src/engine/stoplist/parse-stop-list';
import { readStopListFile } from '../extension/src/engine/stoplist/read-stop-list-file';
import { removeTermsFromStopList } from '../extension/src/engine/stoplist/remove-terms-from-stop-list';
import type { TextEdit } from '../extension/src/engine/stoplist/text-edit';
import { UserError } from '../extension/src/engine/user-error';
import { scratchFolder } from './support/scratch-folder';

/** Applies edits the way an editor does: positions are 0-based line/UTF-16 character, line breaks CRLF, CR or LF. */
function applyAsEditor(text: string, edits: readonly TextEdit[]): string {
  const starts = [0];
  for (const m of text.matchAll(/\r\n|\r|\n/g)) starts.push((m.index as number) + m[0].length);
  const at = (p: { line: number; character: number }): number => (starts[p.line] as number) + p.character;
  const sorted = [...edits].sort((a, b) => at(b.start) - at(a.start));
  let out = text;
  for (const e of sorted) out = out.slice(0, at(e.start)) + e.newText + out.slice(at(e.end));
  return out;
}

let badInputCases = 0;
let generatedCases = 0;

after(() => console.log(`      stop list bad-input cases run: ${badInputCases}`));

describe('parseStopList', () => {
  afterEach(() => badInputCases++);
  it('parseStopList reads terms, comments, blank lines, CRLF, duplicates and non-ASCII terms', () => {
    const text = '# project list\r\nthe\r\n\r\n  über  \r\n#ad\r\n# note\r\nthe\r\n日本\r\nThe';
    const parsed = parseStopList(text);
    assert.deepEqual(parsed.terms, ['the', 'über', '#ad', '日本', 'The']);
    assert.deepEqual(parsed.entries.map((e) => e.line), [2, 4, 5, 7, 8, 9]);
    assert.deepEqual(parsed.duplicates, [{ term: 'the', line: 7 }]);
  });

  it('parseStopList treats "#", "# x" and "#---" as comments but "#hashtag" as a term', () => {
    assert.deepEqual(parseStopList('#\n# x\n#---\n#tag\n').terms, ['#tag']);
  });

  it('parseStopList ignores a BOM and an empty text', () => {
    assert.deepEqual(parseStopList('\uFEFFand\n').terms, ['and']);
    assert.deepEqual(parseStopList('').entries, []);
  });
});

describe('addTermsToStopList / removeTermsFromStopList', () => {
  it('addTermsToStopList appends new terms in the file line endings, never duplicates', () => {
    const crlf = '# list\r\nthe\r\n';
    const r = addTermsToStopList(crlf, ['of', 'the', 'of', ' and ']);
    assert.deepEqual(r.added, ['of', 'and']);
    assert.equal(r.text, '# list\r\nthe\r\nof\r\nand\r\n');
    assert.deepEqual(r.edit, { start: { line: 2, character: 0 }, end: { line: 2, character: 0 }, newText: 'of\r\nand\r\n' });
    assert.equal(applyAsEditor(crlf, r.edit ? [r.edit] : []), r.text);
  });

  it('addTermsToStopList adds a line break before when the file has no final one', () => {
    const r = addTermsToStopList('the', ['of']);
    assert.equal(r.text, 'the\nof');
    assert.deepEqual(r.edit?.start, { line: 0, character: 3 });
  });

  it('addTermsToStopList returns no edit when nothing is new, and refuses terms that would not read back', () => {
    assert.deepEqual(addTermsToStopList('the\n', ['the']), { text: 'the\n', added: [], edit: null });
    assert.deepEqual(addTermsToStopList('', ['', '  ', 'a\nb', '# c']).added, []);
  });

  it('removeTermsFromStopList removes every entry line of the terms and nothing else', () => {
    const text = '# keep me\r\nthe\r\nof\r\n\r\nthe\r\nand';
    const r = removeTermsFromStopList(text, ['the', 'and', 'missing']);
    assert.deepEqual(r.removed, ['the', 'and']);
    // The last block has no final line break, so it takes the break before it: the blank line stays, as the last line.
    assert.equal(r.text, '# keep me\r\nof\r\n');
    assert.equal(applyAsEditor(text, r.edits), r.text);
  });

  it('property: addTermsToStopList is idempotent, keeps every original line, and remove gives the original back', () => {
    const lineText = fc.oneof(
      fc.constantFrom('', '# comment', '#', 'the', 'über', '日本', '  spaced  ', '#tag'),
      fc.string({ unit: fc.constantFrom('a', 'b', 'é', ' ', '#', 'ß', '😀'), maxLength: 6 }),
    );
    const file = fc.tuple(fc.array(lineText, { maxLength: 8 }), fc.constantFrom('\n', '\r\n', '\r'), fc.boolean()).map(([lines, eol, finalEol]) =>
      lines.length === 0 ? '' : lines.join(eol) + (finalEol ? eol : ''),
    );
    const terms = fc.array(fc.string({ unit: fc.constantFrom('x', 'y', 'z', 'é', '日', 'a', 'the'), minLength: 1, maxLength: 5 }), { maxLength: 6 });
    fc.assert(
      fc.property(file, terms, (text, toAdd) => {
        generatedCases++;
        const once = addTermsToStopList(text, toAdd);
        // Every original line is kept: the original is an unchanged prefix.
        assert.ok(once.text.startsWith(text));
        assert.equal(applyAsEditor(text, once.edit ? [once.edit] : []), once.text);
        const twice = addTermsToStopList(once.text, toAdd);
        assert.equal(twice.text, once.text);
        assert.deepEqual(twice.added, []);
        for (const t of once.added) assert.ok(parseStopList(once.text).terms.includes(t));
        const back = removeTermsFromStopList(once.text, once.added);
        assert.equal(back.text, text);
        assert.equal(applyAsEditor(once.text, back.edits), text);
      }),
      { numRuns: 1000, seed: 7 },
    );
  });

  after(() => console.log(`      stop list property cases generated: ${generatedCases}`));
});

describe('readStopListFile', () => {
  const dir = scratchFolder('loudword-stop-');

  it('readStopListFile gives empty text and exists=false for a missing file', async () => {
    assert.deepEqual(await readStopListFile(path.join(dir(), 'none.txt')), { text: '', exists: false });
    badInputCases++;
  });

  it('readStopListFile refuses a file with a NUL byte, naming file and line', async () => {
    const file = path.join(dir(), 'bin.txt');
    writeFileSync(file, Buffer.from('the\r\nof\n\0x'));
    await assert.rejects(readStopListFile(file), (e: unknown) => e instanceof UserError && e.file === file && e.line === 3 && /NUL/.test(e.message));
    badInputCases++;
  });

  it('readStopListFile drops a UTF-8 BOM and keeps CRLF', async () => {
    const file = path.join(dir(), 'bom.txt');
    // Source: Unicode standard — UTF-8 BOM is EF BB BF.
    writeFileSync(file, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('the\r\nöf\r\n')]));
    assert.deepEqual(await readStopListFile(file), { text: 'the\r\nöf\r\n', exists: true });
    badInputCases++;
  });
});
