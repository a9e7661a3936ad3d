import { strict as assert } from 'node:assert';
import * as path from 'node:path';
import { editorSettingsLayer, isInsideFolder } from '../extension/src/host/pure/config-location';

// Paths are built with path.resolve so the expectations hold on any platform; the rules are
// the project's own (README.md "Configuration"); common practice, no source.
const root = path.resolve('/ws/project');
const p = (...parts: string[]): string => path.join(root, ...parts);

describe('isInsideFolder', () => {
  it('isInsideFolder accepts the folder and what lies below it, nothing beside or above', () => {
    assert.equal(isInsideFolder(root, p('a', 'b.csv')), true);
    assert.equal(isInsideFolder(root, root), true);
    assert.equal(isInsideFolder(root, p('..', 'project2', 'x')), false);
    assert.equal(isInsideFolder(root, p('..', 'x')), false);
    assert.equal(isInsideFolder(root, p('..data')), true); // a name starting with two dots is inside
  });
});

describe('editorSettingsLayer', () => {
  it('editorSettingsLayer passes only the editor settings the user set, named as the editor names them', () => {
    const layer = editorSettingsLayer({ sampleSize: 500, neighbors: 7, stopListFile: 'lists/stop.txt' }, root);
    assert.deepEqual(layer.values, { sample: { documents: 500, k: 7 }, stopList: p('lists', 'stop.txt') });
    assert.equal(layer.from, 'editor setting');
    assert.equal(layer.names?.['sample.k'], 'loudword.neighbors');
  });

  it('editorSettingsLayer leaves out settings at their default, so the engine’s own default rule applies', () => {
    assert.deepEqual(editorSettingsLayer({}, root).values, {});
    assert.deepEqual(editorSettingsLayer({ neighbors: 5, stopListFile: '  ' }, root).values, { sample: { k: 5 } });
  });
});
