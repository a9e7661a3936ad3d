// One rule for finding loudword.json and the stop list, the same in the CLI and the editor
// (README.md "Configuration"), and the Report saying where each setting came from (issue 10).
// Project rule; common practice (.editorconfig, .gitignore), no source.
import { strict as assert } from 'node:assert';
import { mkdirSync, mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { buildOnce, runCli, smallCorpusCsv } from './bad-input/cli-support';

describe('loudword: which config and stop list a review uses', function () {
  this.timeout(120_000);
  let proj: string;
  before(() => {
    buildOnce();
    proj = realpathSync(mkdtempSync(path.join(os.tmpdir(), 'loudword-resolve-')));
    mkdirSync(path.join(proj, '.git'));
    mkdirSync(path.join(proj, 'data', 'sub'), { recursive: true });
    writeFileSync(path.join(proj, 'data', 'sub', 'tickets.csv'), smallCorpusCsv());
    writeFileSync(path.join(proj, 'loudword.json'), '{\n  "sample": { "documents": 20, "k": 3 },\n  "label": "topic"\n}\n');
    writeFileSync(path.join(proj, 'stoplist.txt'), 'hello\n');
  });
  after(() => rmSync(proj, { recursive: true, force: true }));

  it('a corpus in a subfolder uses the project root’s loudword.json and the stop list beside it, from any working folder', () => {
    for (const cwd of [proj, path.join(proj, 'data'), os.tmpdir()]) {
      const r = runCli(['review', path.join(proj, 'data', 'sub', 'tickets.csv'), '--format', 'json', '--seed', '2'], cwd);
      assert.equal(r.code, 0, r.stderr);
      const report = JSON.parse(r.stdout);
      assert.equal(report.stopList.file, path.join(proj, 'stoplist.txt'));
      assert.equal(report.stopList.exists, true);
      assert.deepEqual(report.provenance.config, { file: path.join(proj, 'loudword.json'), how: 'nearest' });
      assert.deepEqual(report.provenance.sources, {
        'sample.documents': { from: 'loudword.json', where: `${path.join(proj, 'loudword.json')}:2` },
        'sample.k': { from: 'loudword.json', where: `${path.join(proj, 'loudword.json')}:2` },
        label: { from: 'loudword.json', where: `${path.join(proj, 'loudword.json')}:3` },
        'sample.seed': { from: 'command-line flag', where: '--seed' },
      });
      assert.equal(report.settings.sample.documents, 20);
    }
  });

  it('the text summary says which config was used and what it and the flags set', () => {
    const r = runCli(['review', 'data/sub/tickets.csv', '--k', '4'], proj);
    assert.equal(r.code, 0, r.stderr);
    assert.match(r.stdout, /^Config: loudword\.json \(nearest to the corpus\): sample\.documents, label; flags: --k$/m);
    const none = runCli(['review', 'data/sub/tickets.csv', '--no-config', '--sample', '20', '--k', '3'], proj);
    assert.match(none.stdout, /^Config: ignored, --no-config; flags: --sample, --k$/m);
    // Without a config the default stop list lies beside the corpus.
    // It is not there yet: the summary says so rather than "(0 terms)", which reads as an empty file.
    assert.match(none.stdout, new RegExp(`^Stop list: ${path.join(proj, 'data', 'sub', 'stoplist.txt').replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} \\(not created yet\\)$`, 'm'));
  });

  it('a parent config’s label that the corpus lacks names the config line where it was set (issue 10)', () => {
    writeFileSync(path.join(proj, 'data', 'sub', 'other.csv'), smallCorpusCsv().replace(/^([^\n]*)topic/, '$1category'));
    const r = runCli(['review', 'data/sub/other.csv'], proj);
    assert.equal(r.code, 1);
    assert.match(r.stderr, new RegExp(`^loudword: ${path.join(proj, 'loudword.json')}:3: label "topic": no such field in data/sub/other.csv; available: .*"category"`));
  });

  it('a nearer loudword.json wins whole; files are not merged', () => {
    writeFileSync(path.join(proj, 'data', 'loudword.json'), '{ "sample": { "documents": 30, "k": 2 } }');
    try {
      const r = runCli(['review', 'data/sub/tickets.csv', '--format', 'json'], proj);
      assert.equal(r.code, 0, r.stderr);
      const report = JSON.parse(r.stdout);
      assert.equal(report.provenance.config.file, path.join(proj, 'data', 'loudword.json'));
      assert.equal(report.settings.label, null); // the root's label does not leak in
      assert.equal(report.stopList.file, path.join(proj, 'data', 'stoplist.txt'));
      assert.equal(report.stopList.exists, false);
    } finally {
      rmSync(path.join(proj, 'data', 'loudword.json'));
    }
  });
});
