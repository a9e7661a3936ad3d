// Issue 13, "Writes where it must not": a loudword.json in a cloned repository pointed stopList
// at any file (absolute, ../.., through a symlink) and `loudword apply` appended corpus terms
// there — a shell start-up file, say. The rule (README "What it promises on bad input"): a path a
// config names must resolve, after symbolic links, inside the project folder. Source of the
// threat model: common practice, no source (a repository's config is untrusted input).
import { strict as assert } from 'node:assert';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { loadSettings } from '../../extension/src/engine/config/load-settings';
import { confineStopListWrite, realPathAllowingMissing, resolveInsideProject } from '../../extension/src/engine/config/confine-to-workspace';
import { UserError } from '../../extension/src/engine/user-error';
import { assertOneLineFailure, buildOnce, projectWithCorpus, runCli } from './cli-support';

async function refused(configText: string, dir: string, words: RegExp, projectRoot?: string): Promise<UserError> {
  const config = path.join(dir, 'loudword.json');
  writeFileSync(config, configText);
  try {
    await loadSettings(config, {}, { projectRoot: projectRoot ?? null });
  } catch (e) {
    assert.ok(e instanceof UserError, String(e));
    assert.equal(e.file, config);
    assert.equal(e.line, configText.split('\n').findIndex((l) => l.includes('"stopList"')) + 1, 'the line of the setting');
    assert.match(e.message, words);
    return e;
  }
  return assert.fail(`accepted ${configText}`);
}

describe('bad input: a config may only name a stop list inside its project', () => {
  let base: string;
  let proj: string;
  let home: string;
  beforeEach(() => {
    base = mkdtempSync(path.join(os.tmpdir(), 'loudword-confine-'));
    proj = path.join(base, 'proj');
    home = path.join(base, 'home');
    mkdirSync(proj);
    mkdirSync(home);
    writeFileSync(path.join(home, '.bashrc'), '# start-up\n');
  });
  afterEach(() => rmSync(base, { recursive: true, force: true }));

  it('refuses ../ out of the config folder, naming the setting and its line', async () => {
    await refused('{\n  "text": "text",\n  "stopList": "../home/.bashrc"\n}\n', proj, /^stopList "\.\.\/home\/\.bashrc" resolves outside the project folder/);
  });

  it('refuses an absolute path elsewhere', async () => {
    await refused(`{\n  "stopList": ${JSON.stringify(path.join(home, '.bashrc'))}\n}\n`, proj, /resolves outside the project folder/);
  });

  it('refuses a symlink inside the project that leads out', async () => {
    symlinkSync(path.join(home, '.bashrc'), path.join(proj, 'stop.txt'));
    await refused('{"stopList": "stop.txt"}', proj, /through a symbolic link/);
  });

  it('refuses a file that does not exist yet under a symlinked folder that leads out', async () => {
    symlinkSync(home, path.join(proj, 'lists'));
    await refused('{\n"stopList": "lists/new-stop.txt"}', proj, /resolves outside the project folder.*symbolic link/);
  });

  it('refuses a path through a file component (ENOTDIR) that lies outside', async () => {
    await refused('{"stopList": "../home/.bashrc/x"}', proj, /resolves outside/);
  });

  it('accepts paths inside, also through a symlink that stays inside and a "..foo" name', async () => {
    mkdirSync(path.join(proj, 'real'));
    symlinkSync(path.join(proj, 'real'), path.join(proj, 'alias'));
    for (const value of ['stop.txt', 'sub/../stop.txt', '..stop.txt', 'alias/stop.txt', path.join(proj, 'x.txt')]) {
      writeFileSync(path.join(proj, 'loudword.json'), JSON.stringify({ stopList: value }));
      const loaded = await loadSettings(path.join(proj, 'loudword.json'));
      assert.equal(loaded.stopListPath, path.resolve(proj, value));
    }
  });

  it('a project folder reached through a symlink is still the project', async () => {
    symlinkSync(proj, path.join(base, 'proj-link'));
    writeFileSync(path.join(proj, 'loudword.json'), '{"stopList": "stop.txt"}');
    const loaded = await loadSettings(path.join(base, 'proj-link', 'loudword.json'));
    assert.equal(loaded.stopListPath, path.join(base, 'proj-link', 'stop.txt'));
  });

  it('in the editor the workspace is the project: ../ from a sub-folder config stays inside it', async () => {
    const sub = path.join(proj, 'data');
    mkdirSync(sub);
    writeFileSync(path.join(sub, 'loudword.json'), '{"stopList": "../stop.txt"}');
    const loaded = await loadSettings(path.join(sub, 'loudword.json'), {}, { projectRoot: proj });
    assert.equal(loaded.stopListPath, path.join(proj, 'stop.txt'));
    // …but without the workspace (the CLI) the config's folder is the project.
    await refused('{"stopList": "../stop.txt"}', sub, /outside the project folder/);
    // …and the workspace does not widen anything for a config outside it.
    await refused('{"stopList": "../home/.bashrc"}', proj, /outside/, sub);
  });

  it('a stop list given as an override (the command line) is the user\'s choice and is not confined', async () => {
    writeFileSync(path.join(proj, 'loudword.json'), '{"stopList": "../home/.bashrc"}');
    const loaded = await loadSettings(path.join(proj, 'loudword.json'), { stopList: path.join(home, 'mine.txt') });
    assert.equal(loaded.stopListPath, path.join(home, 'mine.txt'));
  });

  it('the editor write check refuses a stop list outside the workspace, whatever named it', () => {
    assert.throws(() => confineStopListWrite(proj, path.join(home, '.bashrc')), (e: unknown) => e instanceof UserError && /will not write it/.test(e.message));
    symlinkSync(path.join(home, '.bashrc'), path.join(proj, 'stop.txt'));
    assert.throws(() => confineStopListWrite(proj, path.join(proj, 'stop.txt')), /really is/);
    assert.equal(confineStopListWrite(proj, path.join(proj, 'ok.txt')), path.join(realPathAllowingMissing(proj), 'ok.txt'));
    assert.equal(resolveInsideProject(proj, '../home'), null);
  });

  describe('through the CLI', function () {
    this.timeout(120_000);
    before(buildOnce);

    it('apply with such a config exits 1 with one line naming loudword.json:LINE, and the outside file is unchanged', () => {
      const dir = projectWithCorpus();
      try {
        const target = path.join(home, '.bashrc');
        writeFileSync(path.join(dir, 'loudword.json'), `{\n  "text": "text",\n  "stopList": ${JSON.stringify(target)}\n}\n`);
        const r = runCli(['apply', 'corpus.csv', '--sample', '30', '--k', '3'], dir);
        assertOneLineFailure(r, 1, /loudword\.json:3: stopList ".*" resolves outside the project folder/);
        assert.equal(readFileSync(target, 'utf8'), '# start-up\n');
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    });
  });
});
