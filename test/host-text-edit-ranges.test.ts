import { strict as assert } from 'node:assert';
import { addTermsToStopList } from '../extension/src/engine/stoplist/add-terms-to-stop-list';
import { removeTermsFromStopList } from '../extension/src/engine/stoplist/remove-terms-from-stop-list';
import { checkLineEdits, lineLengths, type LineEdit, type Position0 } from '../extension/src/host/pure/text-edit-ranges';

/**
 * What the editor shows after applying checked edits (the host hands them to a WorkspaceEdit; this
 * stands in for the editor, so the engine's edits can be checked against the text it promises).
 */
function applyLineEdits(text: string, edits: readonly LineEdit[]): string {
  const sorted = checkLineEdits(edits, text);
  const starts: number[] = [0];
  for (const m of text.matchAll(/\r\n|\r|\n/g)) starts.push((m.index ?? 0) + m[0].length);
  const offset = (p: Position0): number => (starts[p.line] ?? 0) + p.character;
  let out = text;
  for (let i = sorted.length - 1; i >= 0; i--) {
    const e = sorted[i]!;
    out = out.slice(0, offset(e.start)) + e.newText + out.slice(offset(e.end));
  }
  return out;
}

// Expected texts are written out by hand from the stop-list file format in README.md "Configuration"
// (one term a line, # comments); common practice, no source.
describe('lineLengths', () => {
  it('lineLengths counts LF, CRLF and CR breaks as the editor does', () => {
    assert.deepEqual(lineLengths('ab\r\ncde\rf\n'), [2, 3, 1, 0]);
  });
});

describe('checkLineEdits', () => {
  const text = 'one\ntwo\n';
  it('checkLineEdits sorts edits by position', () => {
    const edits = [
      { start: { line: 1, character: 0 }, end: { line: 2, character: 0 }, newText: '' },
      { start: { line: 0, character: 0 }, end: { line: 0, character: 3 }, newText: 'uno' },
    ];
    assert.deepEqual(checkLineEdits(edits, text).map((e) => e.start.line), [0, 1]);
  });

  it('checkLineEdits throws RangeError outside the document, reversed or overlapping', () => {
    assert.throws(() => checkLineEdits([{ start: { line: 3, character: 0 }, end: { line: 3, character: 0 }, newText: 'x' }], text), RangeError);
    assert.throws(() => checkLineEdits([{ start: { line: 0, character: 4 }, end: { line: 0, character: 4 }, newText: 'x' }], text), RangeError);
    assert.throws(() => checkLineEdits([{ start: { line: 1, character: 0 }, end: { line: 0, character: 0 }, newText: '' }], text), RangeError);
    assert.throws(() => checkLineEdits([
      { start: { line: 0, character: 0 }, end: { line: 1, character: 1 }, newText: '' },
      { start: { line: 1, character: 0 }, end: { line: 1, character: 2 }, newText: '' },
    ], text), RangeError);
  });
});

describe('applyLineEdits with the engine stop-list edits', () => {
  const stopList = '# footer\nsubmitted\nvia\r\n# old\nattachmentid';

  it('applyLineEdits of addTermsToStopList keeps comments and order and adds no duplicate', () => {
    const r = addTermsToStopList(stopList, ['via', 'thanks', 'ref']);
    assert.deepEqual(r.added, ['thanks', 'ref']);
    assert.ok(r.edit !== null);
    assert.equal(applyLineEdits(stopList, [r.edit]), '# footer\nsubmitted\nvia\r\n# old\nattachmentid\nthanks\nref');
    assert.equal(applyLineEdits(stopList, [r.edit]), r.text);
  });

  it('applyLineEdits of removeTermsFromStopList drops just the entry lines', () => {
    const r = removeTermsFromStopList(stopList, ['via', 'attachmentid']);
    assert.equal(applyLineEdits(stopList, r.edits), '# footer\nsubmitted\n# old');
    assert.equal(applyLineEdits(stopList, r.edits), r.text);
  });

  it('applyLineEdits round trip: add then remove gives the original back', () => {
    const added = addTermsToStopList(stopList, ['thanks']);
    const removed = removeTermsFromStopList(added.text, ['thanks']);
    assert.equal(applyLineEdits(added.text, removed.edits), stopList);
  });
});
