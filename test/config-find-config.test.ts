// The one rule for finding loudword.json, shared by the CLI and the editor (README.md
// "Configuration"): nearest first from the corpus's folder up to the project root. The rule is
// the one .editorconfig and .gitignore users know (common practice, no source).
import { strict as assert } from 'node:assert';
import { mkdirSync, mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { configCandidates, findConfig } from '../extension/src/engine/config/find-config';

describe('configCandidates', () => {
  const root = path.resolve('/ws/project');
  const p = (...parts: string[]): string => path.join(root, ...parts);

  it('configCandidates walks from the corpus folder up to the workspace root, nearest first', () => {
    assert.deepEqual(configCandidates(p('data', 'raw', 'a.csv'), root), [p('data', 'raw', 'loudword.json'), p('data', 'loudword.json'), p('loudword.json')]);
    assert.deepEqual(configCandidates(p('a.csv'), root), [p('loudword.json')]);
  });

  it('configCandidates without a workspace (the CLI) stops at the folder holding .git, else at the filesystem root', () => {
    assert.deepEqual(configCandidates(p('data', 'a.csv'), null, (dir) => dir === root), [p('data', 'loudword.json'), p('loudword.json')]);
    const all = configCandidates(p('data', 'a.csv'), null, () => false);
    assert.equal(all.at(-1), path.join(path.parse(root).root, 'loudword.json'));
    assert.equal(all.length, 4);
  });

  it('configCandidates for a corpus outside the workspace uses the CLI rule', () => {
    assert.deepEqual(configCandidates(path.resolve('/elsewhere/x/a.csv'), root, (dir) => dir === path.resolve('/elsewhere')), [
      path.resolve('/elsewhere/x/loudword.json'),
      path.resolve('/elsewhere/loudword.json'),
    ]);
  });
});

describe('findConfig', () => {
  let dir: string;
  before(() => {
    dir = realpathSync(mkdtempSync(path.join(tmpdir(), 'loudword-find-')));
    mkdirSync(path.join(dir, '.git'));
    mkdirSync(path.join(dir, 'data', 'sub', 'deeper'), { recursive: true });
    writeFileSync(path.join(dir, 'loudword.json'), '{}');
    writeFileSync(path.join(dir, 'data', 'sub', 'loudword.json'), '{}');
    mkdirSync(path.join(dir, 'data', 'sub', 'deeper', 'loudword.json')); // a folder of that name does not count
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('findConfig returns the nearest regular file, walking past folders without one', () => {
    assert.equal(findConfig(path.join(dir, 'data', 'sub', 'deeper', 'c.csv')), path.join(dir, 'data', 'sub', 'loudword.json'));
    assert.equal(findConfig(path.join(dir, 'data', 'c.csv')), path.join(dir, 'loudword.json'));
    assert.equal(findConfig(path.join(dir, 'data', 'c.csv'), path.join(dir, 'data')), null); // the workspace ends the walk
  });

  it('findConfig takes a corpus path relative to the working directory', () => {
    const rel = path.relative(process.cwd(), path.join(dir, 'data', 'sub', 'c.csv'));
    assert.equal(findConfig(rel), path.join(dir, 'data', 'sub', 'loudword.json'));
  });
});
