// Issue 13: `--out` accepted the corpus itself (overwritten by the report) and the stop list;
// `--out` in a missing folder or naming a directory was an internal error with a stack. Rule
// (README "What it promises on bad input"): a path typed on the command line is the user's
// choice, but never an input of the run, never a directory, never in a missing folder — one
// line, exit 2. Source: common practice, no source (compilers refuse -o onto a source file).
import { strict as assert } from 'node:assert';
import { linkSync, mkdirSync, readFileSync, rmSync, symlinkSync, writeFileSync, existsSync } from 'node:fs';
import * as path from 'node:path';
import { assertOneLineFailure, buildOnce, projectWithCorpus, runCli } from './cli-support';

describe('bad input: --out and --stoplist never write over an input, a directory or into a missing folder', function () {
  this.timeout(120_000);
  let dir: string;
  let corpus: string;
  const review = (...extra: string[]) => runCli(['review', 'corpus.csv', '--sample', '30', '--k', '3', ...extra], dir);

  before(buildOnce);
  beforeEach(() => {
    dir = projectWithCorpus();
    corpus = readFileSync(path.join(dir, 'corpus.csv'), 'utf8');
    writeFileSync(path.join(dir, 'loudword.json'), '{\n  "text": "text",\n  "stopList": "stop.txt"\n}\n');
    writeFileSync(path.join(dir, 'stop.txt'), 'hello\n');
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  const unchanged = () => {
    assert.equal(readFileSync(path.join(dir, 'corpus.csv'), 'utf8'), corpus);
    assert.equal(readFileSync(path.join(dir, 'stop.txt'), 'utf8'), 'hello\n');
    assert.equal(readFileSync(path.join(dir, 'loudword.json'), 'utf8'), '{\n  "text": "text",\n  "stopList": "stop.txt"\n}\n');
  };

  it('--out the corpus, by name, through ./ and through a symlink and a hard link', () => {
    symlinkSync(path.join(dir, 'corpus.csv'), path.join(dir, 'soft.csv'));
    linkSync(path.join(dir, 'corpus.csv'), path.join(dir, 'hard.csv'));
    for (const out of ['corpus.csv', './sub/../corpus.csv', 'soft.csv', 'hard.csv']) {
      if (out.includes('sub')) mkdirSync(path.join(dir, 'sub'), { recursive: true });
      assertOneLineFailure(review('--out', out), 2, /--out is the corpus/);
    }
    unchanged();
  });

  it('--out the config or the stop list (from the config, or from --stoplist)', () => {
    assertOneLineFailure(review('--out', 'loudword.json'), 2, /--out is the config file/);
    assertOneLineFailure(review('--out', 'stop.txt'), 2, /--out is the stop list/);
    writeFileSync(path.join(dir, 'other.txt'), 'x\n');
    assertOneLineFailure(review('--stoplist', 'other.txt', '--out', 'other.txt'), 2, /--out is the stop list/);
    assert.equal(readFileSync(path.join(dir, 'other.txt'), 'utf8'), 'x\n');
    unchanged();
  });

  it('--out a directory, or in a folder that does not exist', () => {
    assertOneLineFailure(review('--out', '.'), 2, /^loudword: \.: --out names a directory/);
    assertOneLineFailure(review('--out', 'missing/report.txt'), 2, /missing\/report\.txt: --out is in a folder that does not exist/);
    assertOneLineFailure(review('--out', 'corpus.csv/report.txt'), 2, /which is not a folder/);
    assert.equal(existsSync(path.join(dir, 'missing')), false);
  });

  it('a good --out still writes the report', () => {
    const r = review('--out', 'report.txt', '--format', 'md');
    assert.equal(r.code, 0, r.stderr);
    assert.match(readFileSync(path.join(dir, 'report.txt'), 'utf8'), /^## Loudword review/);
  });

  it('apply --stoplist naming the corpus or the config is refused before anything is written', () => {
    assertOneLineFailure(runCli(['apply', 'corpus.csv', '--stoplist', 'corpus.csv'], dir), 2, /--stoplist is the corpus/);
    assertOneLineFailure(runCli(['apply', 'corpus.csv', '--stoplist', 'loudword.json'], dir), 2, /--stoplist is the config file/);
    unchanged();
  });

  it('a config whose stopList is the config itself or the corpus: apply refuses, naming loudword.json:LINE', () => {
    for (const target of ['loudword.json', 'corpus.csv']) {
      const config = `{\n  "text": "text",\n  "stopList": "${target}"\n}\n`;
      writeFileSync(path.join(dir, 'loudword.json'), config);
      const r = runCli(['apply', 'corpus.csv', '--sample', '30', '--k', '3'], dir);
      // The stop list is read first; a corpus or config read as a stop list gives no NUL, so
      // the review runs and apply must then refuse the write.
      assertOneLineFailure(r, 1, new RegExp(`loudword\\.json:3: stopList "${target.replace('.', '\\.')}": the stop list is the (config file|corpus)`));
      assert.equal(readFileSync(path.join(dir, 'loudword.json'), 'utf8'), config);
      assert.equal(readFileSync(path.join(dir, 'corpus.csv'), 'utf8'), corpus);
    }
  });
});
