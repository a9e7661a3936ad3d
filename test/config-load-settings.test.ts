import assert from 'node:assert/strict';
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { confineToWorkspace } from '../extension/src/engine/config/confine-to-workspace';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { loadSettings } from '../extension/src/engine/config/load-settings';
import { UserError } from '../extension/src/engine/user-error';
import { scratchFolder } from './support/scratch-folder';

let badInputCases = 0;

function userError(fn: () => unknown, file: string | null, line: number | null, words: RegExp): void {
  badInputCases++;
  assert.throws(fn, (e: unknown) => {
    assert.ok(e instanceof UserError, `expected UserError, got ${String(e)}`);
    assert.equal(e.file, file);
    assert.equal(e.line, line);
    assert.match(e.message, words);
    return true;
  });
}

after(() => console.log(`      config bad-input cases run: ${badInputCases}`));

describe('loadSettings', () => {
  const dir = scratchFolder('loudword-config-');

  it('loadSettings without a file gives the defaults', async () => {
    const { settings, configDir } = await loadSettings(null);
    assert.deepEqual(settings, DEFAULT_SETTINGS);
    assert.equal(configDir, null);
  });

  it('loadSettings layers file over defaults and overrides over the file; stopList relative to the config folder', async () => {
    const sub = path.join(dir(), 'project');
    mkdirSync(sub);
    writeFileSync(path.join(sub, 'loudword.json'), '{"stopList": "lists/stop.txt", "sample": {"k": 5, "seed": 9}, "text": "body"}');
    const loaded = await loadSettings(path.join(sub, 'loudword.json'), { text: 'title', sample: { seed: 3 } });
    assert.equal(loaded.configDir, sub);
    assert.equal(loaded.settings.text, 'title');
    assert.deepEqual(loaded.settings.sample, { documents: 2000, k: 5, seed: 3 });
    assert.equal(loaded.settings.stopList, 'lists/stop.txt');
    assert.equal(loaded.stopListPath, path.join(sub, 'lists', 'stop.txt'));
    assert.deepEqual(loaded.settings.weighting, DEFAULT_SETTINGS.weighting);
  });

  it('loadSettings: a missing config file, and k not below the sample size, are UserErrors', async () => {
    const missing = path.join(dir(), 'none.json');
    await assert.rejects(loadSettings(missing), (e: unknown) => e instanceof UserError && e.file === missing && /not found/.test(e.message));
    badInputCases++;
    await assert.rejects(loadSettings(null, { sample: { documents: 10, k: 10 } }), (e: unknown) => e instanceof UserError && /sample.k/.test(e.message));
    badInputCases++;
    await assert.rejects(loadSettings(null, { sample: { k: 0 } }, { overridesFrom: { from: 'command-line flag', names: { 'sample.k': '--k' } } }), (e: unknown) => e instanceof UserError && /^--k must be an integer from 1 to 100, got 0 \(command-line flag\)$/.test(e.message));
    badInputCases++;
  });

  it('loadSettings layers defaults < editor settings < loudword.json < flags and says where each setting came from', async () => {
    const sub = path.join(dir(), 'layers');
    mkdirSync(sub);
    writeFileSync(path.join(sub, 'loudword.json'), '{\n  "label": "topic",\n  "sample": {\n    "k": 5\n  }\n}\n');
    const editor = { values: { sample: { documents: 300, k: 20 } }, from: 'editor setting' as const, names: { 'sample.documents': 'loudword.sampleSize', 'sample.k': 'loudword.neighbors' } };
    const loaded = await loadSettings(path.join(sub, 'loudword.json'), { sample: { seed: 7 } }, { editor, overridesFrom: { from: 'command-line flag', names: { 'sample.seed': '--seed' } } });
    assert.deepEqual(loaded.settings.sample, { documents: 300, k: 5, seed: 7 });
    assert.deepEqual(loaded.sources, {
      'sample.documents': { from: 'editor setting', where: 'loudword.sampleSize' },
      'sample.k': { from: 'loudword.json', where: `${path.join(sub, 'loudword.json')}:4` },
      label: { from: 'loudword.json', where: `${path.join(sub, 'loudword.json')}:2` },
      'sample.seed': { from: 'command-line flag', where: '--seed' },
    });
  });

  it('loadSettings resolves the default stop list beside the config, else beside the corpus; a flag’s against the working directory', async () => {
    const proj = path.join(dir(), 'stops');
    mkdirSync(path.join(proj, 'data'), { recursive: true });
    writeFileSync(path.join(proj, 'loudword.json'), '{}');
    const corpus = path.join(proj, 'data', 'c.csv');
    assert.equal((await loadSettings(path.join(proj, 'loudword.json'), {}, { corpusFile: corpus })).stopListPath, path.join(proj, 'stoplist.txt'));
    assert.equal((await loadSettings(null, {}, { corpusFile: corpus })).stopListPath, path.join(proj, 'data', 'stoplist.txt'));
    assert.equal((await loadSettings(null, { stopList: 'x.txt' }, { corpusFile: corpus, baseDir: dir() })).stopListPath, path.join(dir(), 'x.txt'));
    assert.equal((await loadSettings(null, { stopList: null }, { corpusFile: corpus })).stopListPath, null);
  });

  it('loadSettings: k not below the sample size names both places', async () => {
    const sub = path.join(dir(), 'kdocs');
    mkdirSync(sub);
    const file = path.join(sub, 'loudword.json');
    writeFileSync(file, '{\n "sample": {\n  "k": 50\n }\n}');
    await assert.rejects(loadSettings(file, { sample: { documents: 40 } }, { overridesFrom: { from: 'command-line flag', names: { 'sample.documents': '--sample' } } }), (e: unknown) => {
      assert.ok(e instanceof UserError);
      assert.equal(e.describe(), `${file}:3: "sample.k" (50) must be smaller than --sample (40)`);
      return true;
    });
    badInputCases++;
  });
});

describe('confineToWorkspace', () => {
  it('confineToWorkspace resolves inside paths and refuses ones that escape, also through a symlink', () => {
    const root = mkdtempSync(path.join(tmpdir(), 'loudword-ws-'));
    const outside = mkdtempSync(path.join(tmpdir(), 'loudword-out-'));
    try {
      assert.equal(confineToWorkspace(root, 'a/../stop.txt'), path.join(root, 'stop.txt'));
      assert.equal(confineToWorkspace(root, '..stop.txt'), path.join(root, '..stop.txt'));
      userError(() => confineToWorkspace(root, '../x.txt'), null, null, /outside the workspace/);
      userError(() => confineToWorkspace(root, '/etc/passwd'), null, null, /outside the workspace/);
      writeFileSync(path.join(outside, 'secret.txt'), 'x');
      symlinkSync(outside, path.join(root, 'link'));
      userError(() => confineToWorkspace(root, 'link/secret.txt'), null, null, /symbolic link/);
    } finally {
      rmSync(root, { recursive: true, force: true });
      rmSync(outside, { recursive: true, force: true });
    }
  });
});
