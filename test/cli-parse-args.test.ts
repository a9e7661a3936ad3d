// The command line as node:util's parseArgs reads it, driven by one table (cli/parse-args.ts
// OPTIONS) from which the usage text is built. Cases marked "issue 13" were found by a hostile
// run of the CLI; each must be a one-line message naming the flag, exit status 2.
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import * as path from 'node:path';
import { OPTIONS, parseArgs, UsageError } from '../extension/src/cli/parse-args';
import { closest, meantName } from '../extension/src/closest-word';
import { USAGE } from '../extension/src/cli/usage';
import { buildOnce } from './bad-input/cli-support';

function usageError(argv: string[], words: RegExp): void {
  assert.throws(() => parseArgs(argv), (e: unknown) => {
    assert.ok(e instanceof UsageError, `expected UsageError for ${JSON.stringify(argv)}, got ${String(e)}`);
    assert.match(e.message, words);
    assert.doesNotMatch(e.message, /\n/);
    return true;
  });
}

describe('parseArgs', () => {
  it('parseArgs reads a command, its corpus and every kind of option, in any order (POSIX-style, --x=v too)', () => {
    const o = parseArgs(['--k', '5', 'review', 'c.csv', '--text=body', '--format', 'json', '-q', '--sample=100', '--seed', '0', '--no-config']);
    assert.equal(o.command, 'review');
    assert.equal(o.file, 'c.csv');
    assert.equal(o.k, 5);
    assert.equal(o.sample, 100);
    assert.equal(o.seed, 0);
    assert.equal(o.text, 'body');
    assert.equal(o.format, 'json');
    assert.equal(o.quiet, true);
    assert.equal(o.noConfig, true);
    assert.equal(o.config, null);
    const a = parseArgs(['apply', 'c.csv', '--dry-run', '--stoplist', 'stop.txt', '--input-format', 'tsv']);
    assert.deepEqual([a.command, a.dryRun, a.stopList, a.inputFormat], ['apply', true, 'stop.txt', 'tsv']);
  });

  it('parseArgs: -h / -v anywhere win, and no arguments mean help', () => {
    assert.equal(parseArgs([]).command, 'help');
    assert.equal(parseArgs(['review', 'x', '--help']).command, 'help');
    assert.equal(parseArgs(['-v']).command, 'version');
  });

  it('parseArgs: number flags out of the schema’s bounds name the flag and the range (issue 13: --k 1000, --sample 1e12, --seed "")', () => {
    usageError(['review', 'c', '--k', '1000'], /^--k: must be a whole number from 1 to 100, got "1000"$/);
    usageError(['review', 'c', '--k', '0'], /^--k: must be a whole number from 1 to 100/);
    usageError(['review', 'c', '--sample', '1e12'], /^--sample: must be a whole number from 10 to 50000, got "1e12"$/);
    usageError(['review', 'c', '--sample', '9'], /^--sample: /);
    usageError(['review', 'c', '--seed', ''], /^--seed: must be a whole number from 0 to 4294967295, got ""$/);
    usageError(['review', 'c', '--seed', '4294967296'], /^--seed: /);
    usageError(['review', 'c', '--seed', '-1'], /--seed/);
    usageError(['review', 'c', '--k', ' 5'], /^--k: /);
    usageError(['review', 'c', '--k', '0x10'], /^--k: /);
    assert.equal(parseArgs(['review', 'c', '--k', '100', '--sample', '50000', '--seed', '4294967295']).seed, 4294967295);
  });

  it('parseArgs: empty names and contradictions are refused (issue 13: --stoplist "", --config F --no-config)', () => {
    usageError(['review', 'c', '--stoplist', ''], /^--stoplist: needs a file name, got ""$/);
    usageError(['review', 'c', '--config', '  '], /^--config: needs a file name/);
    usageError(['review', 'c', '--text', ''], /^--text: needs a field name/);
    usageError(['review', 'c', '--out='], /^--out: needs a file name/);
    usageError(['review', 'c', '--config', 'F', '--no-config'], /--config and --no-config/);
    usageError(['review', ''], /corpus file name is empty/);
    usageError(['review', '-'], /standard input \("-"\) is not read; name a corpus file/);
  });

  it('parseArgs: unknown flags, commands and choices get "did you mean"', () => {
    usageError(['review', 'c', '--smaple', '5'], /^unknown option --smaple; did you mean --sample\?$/);
    usageError(['review', 'c', '--stop-list', 'x'], /did you mean --stoplist\?/);
    usageError(['review', 'c', '--fail-on-suggestion'], /did you mean --fail-on-suggestions\?/);
    usageError(['review', 'c', '--zzzzzz'], /^unknown option --zzzzzz$/);
    usageError(['review', 'c', '--format', 'jsn'], /^--format: must be one of text, json, md, html, got "jsn"; did you mean json\?$/);
    usageError(['reveiw', 'c'], /unknown command "reveiw"; did you mean review\?/);
    usageError(['corpus.csv'], /"corpus.csv" is not a command; did you mean: loudword review corpus.csv\?/);
  });

  it('parseArgs: missing values, values on switches, extra arguments', () => {
    usageError(['review', 'c', '--k'], /^--k needs a value \(N\)$/);
    usageError(['review', 'c', '--out', '-x'], /--out needs a value; to give one starting with "-", write --out=-x/);
    usageError(['review', 'c', '--quiet=yes'], /--quiet is a switch/);
    usageError(['review'], /review needs a corpus file/);
    usageError(['review', 'a', 'b'], /unexpected argument "b"/);
    usageError(['review', 'a', '--dry-run'], /--dry-run only goes with apply/);
    assert.equal(parseArgs(['review', 'c', '--out=-x']).out, '-x');
  });

  it('closest() picks the single nearest candidate within edit distance 2 (Levenshtein 1966), else none', () => {
    assert.equal(closest('--sampel', ['--sample', '--seed']), '--sample');
    assert.equal(closest('--kk', ['--k', '--out']), '--k');
    assert.equal(closest('abc', ['xyz']), null);
    assert.equal(closest('ab', ['ac', 'ad']), null); // a tie helps nobody
  });

  it('meantName() prefers the same name in another case, then the closest: a corpus field typed wrong', () => {
    assert.equal(meantName('Topic', ['topic', 'Topics']), 'topic');
    assert.equal(meantName('data.meta.topc', ['id', 'data.meta', 'data.meta.topic']), 'data.meta.topic');
    assert.equal(meantName('label', ['id', 'text']), null);
  });
});

describe('usage text', () => {
  it('USAGE names every option of the table, with the schema’s bounds and defaults, in lines of at most 100 characters', () => {
    for (const o of OPTIONS) assert.match(USAGE, new RegExp(`--${o.flag}\\b`), o.flag);
    assert.match(USAGE, /--k N +neighbours per document \(1–100, default 10\)/);
    assert.match(USAGE.replace(/\s+/g, ' '), /--sample N [^-]*\(10–50000, default 2000\)/);
    for (const line of USAGE.split('\n')) assert.ok(line.length <= 100, `too long: ${line}`);
  });

  it('every option named in README’s CLI section exists in the table, and every table option is in the README', () => {
    const readme = require('node:fs').readFileSync(path.join(__dirname, '..', 'README.md'), 'utf8') as string;
    const flags = new Set(OPTIONS.map((o) => `--${o.flag}`));
    const cliPart = readme.slice(readme.indexOf('Options: `'), readme.indexOf('## In VS Code'));
    const named = [...cliPart.matchAll(/`(--[a-z-]+)/g)].map((m) => m[1]!);
    assert.ok(named.length > 5);
    for (const flag of named) assert.ok(flags.has(flag), `README names ${flag}, which the CLI does not have`);
    for (const flag of flags) if (flag !== '--help' && flag !== '--version') assert.ok(readme.includes(flag), `README does not mention ${flag}`);
  });
});

describe('loudword exit status for command-line mistakes', () => {
  it('a wrong flag value exits 2 with one line naming the flag, before any file is read', function () {
    this.timeout(60_000);
    const root = path.join(__dirname, '..');
    buildOnce(); // only when dist/ is missing or older than the sources: npm test has built it, and a rebuild here would race the other test process's CLI runs
    const r = spawnSync(process.execPath, [path.join(root, 'bin', 'loudword.js'), 'review', 'no-such-file.csv', '--k', '1000'], { encoding: 'utf8' });
    assert.equal(r.status, 2);
    assert.match(r.stderr, /^loudword: --k: must be a whole number from 1 to 100, got "1000"\n/);
    assert.equal(r.stdout, '');
  });
});
