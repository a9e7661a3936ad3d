// Issue 13: text from the corpus reached the terminal raw — escape sequences in a header, a file
// name or a document set the terminal's title and colours through the summary, hub previews and
// error messages. Sources: ECMA-48 (ESC, OSC ... BEL, CSI; C1 0x80-0x9F), Unicode UAX #9 (bidi
// overrides such as U+202E, the "Trojan Source" paper, CVE-2021-42574).
import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { escapeControls, escapeJsonControls } from '../../extension/src/cli/terminal-text';
import { buildOnce, runCli } from './cli-support';

const RAW_CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;

describe('bad input: control characters from the corpus are shown escaped', function () {
  this.timeout(120_000);
  let dir: string;
  before(buildOnce);
  before(() => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-ctl-'));
    const lines = ['id,te\u001b]0;PWNED\u0007xt,topic'];
    for (let i = 0; i < 40; i++) lines.push(`${i},"hello \u001b[31mred\u001b[0m world \u009b2J printer ${i % 4} paper\rover \u202eevil",t${i % 2}`);
    writeFileSync(path.join(dir, 'c\u001b[2J.csv'), lines.join('\n') + '\n');
  });
  after(() => rmSync(dir, { recursive: true, force: true }));
  const base = ['review', 'c\u001b[2J.csv', '--no-config', '--sample', '30', '--k', '3'];

  it('the text summary (header, file name, hub previews) has no raw control character', () => {
    const r = runCli(base, dir);
    assert.equal(r.code, 0, r.stderr);
    assert.doesNotMatch(r.stdout.replace(/[\n\t]/g, ''), RAW_CONTROL);
    assert.match(r.stdout, /te\\x1b\]0;PWNED\\x07xt/);
    assert.match(r.stdout, /c\\x1b\[2J\.csv/);
  });

  it('Markdown output too; JSON keeps the same values with C1 and bidi controls as \\u escapes', () => {
    const md = runCli([...base, '--format', 'md'], dir);
    assert.equal(md.code, 0, md.stderr);
    assert.doesNotMatch(md.stdout.replace(/[\n\t]/g, ''), RAW_CONTROL);
    const json = runCli([...base, '--format', 'json'], dir);
    assert.equal(json.code, 0, json.stderr);
    assert.doesNotMatch(json.stdout.replace(/[\n\t]/g, ''), RAW_CONTROL);
    const report = JSON.parse(json.stdout);
    assert.equal(report.input.textField, 'te\u001b]0;PWNED\u0007xt');
  });

  it('error messages naming a field or file from the corpus', () => {
    const r = runCli([...base, '--text', 'nope'], dir);
    assert.equal(r.code, 1);
    assert.doesNotMatch(r.stderr.replace(/\n/g, ''), RAW_CONTROL);
    assert.match(r.stderr, /te\\x1b\]0;PWNED\\x07xt/);
  });

  it('escapeControls keeps line breaks and tabs, escapes the rest; escapeJsonControls keeps the JSON value', () => {
    assert.equal(escapeControls('a\tb\nc\rd\u001be\u009bf\u202eg\u0000'), 'a\tb\nc\\rd\\x1be\\x9bf\\u{202e}g\\x00');
    const value = { s: 'x\u009by\u202ez\u007f' };
    const json = escapeJsonControls(JSON.stringify(value));
    assert.doesNotMatch(json, RAW_CONTROL);
    assert.deepEqual(JSON.parse(json), value);
  });
});
