import { strict as assert } from 'node:assert';
import * as path from 'node:path';
import { configCandidates, editorOverrides, expectedStopListPath, isInsideFolder } from '../extension/src/host/pure/config-location';

// Paths are built with path.resolve so the expectations hold on any platform; the rules are
// the project's own (README.md "Configuration"); common practice, no source.
const root = path.resolve('/ws/project');
const p = (...parts: string[]): string => path.join(root, ...parts);

describe('configCandidates', () => {
  it('configCandidates walks from the corpus folder up to the workspace root, nearest first', () => {
    assert.deepEqual(configCandidates(p('data', 'raw', 'a.csv'), root), [
      p('data', 'raw', 'loudword.json'),
      p('data', 'loudword.json'),
      p('loudword.json'),
    ]);
  });

  it('configCandidates looks only beside the corpus without a workspace or outside it', () => {
    assert.deepEqual(configCandidates(p('a.csv'), null), [p('loudword.json')]);
    const outside = path.resolve('/elsewhere/b.csv');
    assert.deepEqual(configCandidates(outside, root), [path.resolve('/elsewhere/loudword.json')]);
  });
});

describe('isInsideFolder', () => {
  it('isInsideFolder accepts the folder and its descendants and refuses .. escapes and siblings', () => {
    assert.equal(isInsideFolder(root, root), true);
    assert.equal(isInsideFolder(root, p('x', 'y.txt')), true);
    assert.equal(isInsideFolder(root, p('..', 'other', 'y.txt')), false);
    assert.equal(isInsideFolder(root, `${root}-sibling/y.txt`), false);
  });
});

describe('editorOverrides', () => {
  const editor = { sampleSize: 500, neighbors: 7, stopListFile: 'lists/stop.txt' };

  it('editorOverrides passes every editor default when loudword.json says nothing', () => {
    assert.deepEqual(editorOverrides(editor, {}, root), { sample: { documents: 500, k: 7 }, stopList: p('lists', 'stop.txt') });
  });

  it('editorOverrides lets loudword.json win key by key', () => {
    assert.deepEqual(editorOverrides(editor, { sample: { k: 5 }, stopList: null }, root), { sample: { documents: 500 } });
    assert.deepEqual(editorOverrides(editor, { sample: { documents: 10, k: 5 }, stopList: 'x.txt' }, root), {});
  });

  it('editorOverrides treats a config that is not an object as empty', () => {
    assert.deepEqual(editorOverrides({ ...editor, stopListFile: '  ' }, [1, 2], root), { sample: { documents: 500, k: 7 } });
  });
});

describe('expectedStopListPath', () => {
  it('expectedStopListPath resolves the config stopList against the config folder', () => {
    assert.equal(expectedStopListPath(p('sub', 'loudword.json'), { stopList: '../stop.txt' }, {}), p('stop.txt'));
  });

  it('expectedStopListPath is null when the config turns the stop list off, else the override', () => {
    assert.equal(expectedStopListPath(p('loudword.json'), { stopList: null }, { stopList: p('s.txt') }), null);
    assert.equal(expectedStopListPath(p('loudword.json'), {}, { stopList: p('s.txt') }), p('s.txt'));
    assert.equal(expectedStopListPath(null, {}, {}), null);
  });
});
