// Issue 13, "Loses or rewrites the user's bytes": `apply` rewrote the whole stop list in place
// (kill -9 left 0 bytes, two runs lost terms, a BOM was dropped, Latin-1 entries became mojibake,
// a read-only file gave an internal error). Now: new file beside it + rename, old bytes kept as
// a prefix, a concurrent change refused. Sources: rename(2) is atomic on one file system (POSIX
// rename, "from memory"); windows-1252 bytes per the WHATWG Encoding Standard (from memory:
// ü = 0xFC, € = 0x80); UTF-8 BOM EF BB BF and UTF-16 LE BOM FF FE per the Unicode standard.
import { strict as assert } from 'node:assert';
import { spawn, spawnSync } from 'node:child_process';
import { chmodSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, readlinkSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { appendTerms, readStopList, replaceStopList } from '../../extension/src/engine/stoplist/stop-list-file';
import { UserError } from '../../extension/src/engine/user-error';

async function appendFile(file: string, terms: string[]): Promise<Buffer> {
  const list = await readStopList(file);
  const r = appendTerms(list, terms);
  await replaceStopList(list, r.bytes);
  return readFileSync(file);
}

describe('bad input: stop-list writes are atomic and keep every existing byte', () => {
  let dir: string;
  beforeEach(() => (dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-atomic-'))));
  afterEach(() => rmSync(dir, { recursive: true, force: true }));
  const leftovers = () => readdirSync(dir).filter((n) => n.endsWith('.tmp'));

  it('keeps a UTF-8 BOM and CRLF line breaks; the old bytes are a prefix of the new', async () => {
    const file = path.join(dir, 'stop.txt');
    const old = Buffer.from('\ufeff# mine\r\nthe\r\nöf\r\n', 'utf8');
    writeFileSync(file, old);
    const now = await appendFile(file, ['hello', 'öf']);
    assert.deepEqual(now.subarray(0, old.length), old);
    assert.equal(now.subarray(old.length).toString('utf8'), 'hello\r\n');
    assert.deepEqual([...now.subarray(0, 3)], [0xef, 0xbb, 0xbf]);
  });

  it('keeps a windows-1252 (Latin-1) file in windows-1252, and leaves out terms it cannot hold', async () => {
    const file = path.join(dir, 'stop.txt');
    const old = Buffer.from([0x63, 0x61, 0x66, 0xe9, 0x0a, 0x6e, 0x61, 0xef, 0x76, 0x65, 0x0a]); // café\nnaïve\n
    writeFileSync(file, old);
    const list = await readStopList(file);
    assert.equal(list.encoding, 'windows-1252');
    assert.deepEqual(list.text, 'café\nnaïve\n');
    const r = appendTerms(list, ['über', '€uro', '日本', 'café']);
    assert.deepEqual(r.added, ['über', '€uro']);
    assert.deepEqual(r.unrepresentable, ['日本']);
    await replaceStopList(list, r.bytes);
    const now = readFileSync(file);
    assert.deepEqual(now.subarray(0, old.length), old);
    assert.deepEqual([...now.subarray(old.length)], [0xfc, 0x62, 0x65, 0x72, 0x0a, 0x80, 0x75, 0x72, 0x6f, 0x0a]);
  });

  it('keeps UTF-16 LE with its BOM, and a file without a final line break stays without one', async () => {
    const file = path.join(dir, 'stop.txt');
    const old = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('the\nof', 'utf16le')]);
    writeFileSync(file, old);
    const now = await appendFile(file, ['и']);
    assert.deepEqual(now.subarray(0, old.length), old);
    assert.equal(now.subarray(2).toString('utf16le'), 'the\nof\nи');
  });

  it('a UTF-8 file with one stray byte stays UTF-8 (the stray byte is kept as it was)', async () => {
    const file = path.join(dir, 'stop.txt');
    const old = Buffer.concat([Buffer.from('straße\nnaïve\n', 'utf8'), Buffer.from([0xff, 0x0a])]);
    writeFileSync(file, old);
    const list = await readStopList(file);
    assert.equal(list.encoding, 'utf-8');
    assert.match(list.note ?? '', /^line 3: 1 byte/);
    await replaceStopList(list, appendTerms(list, ['größe']).bytes);
    const now = readFileSync(file);
    assert.deepEqual(now.subarray(0, old.length), old);
    assert.equal(now.subarray(old.length).toString('utf8'), 'größe\n');
  });

  it('refuses when the file changed between the read and the rename, and leaves the other writer\'s bytes', async () => {
    const file = path.join(dir, 'stop.txt');
    writeFileSync(file, 'the\n');
    const list = await readStopList(file);
    const r = appendTerms(list, ['hello']);
    await assert.rejects(
      replaceStopList(list, r.bytes, { afterTempWritten: () => writeFileSync(file, 'the\nother\n') }),
      (e: unknown) => e instanceof UserError && e.file === file && /changed by someone else/.test(e.message) && /nothing was written/.test(e.message),
    );
    assert.equal(readFileSync(file, 'utf8'), 'the\nother\n');
    assert.deepEqual(leftovers(), []);
    // A file created by someone else after we found none is refused too.
    const missing = path.join(dir, 'new.txt');
    const none = await readStopList(missing);
    await assert.rejects(replaceStopList(none, appendTerms(none, ['x']).bytes, { afterTempWritten: () => writeFileSync(missing, 'y\n') }), /created by someone else/);
    assert.equal(readFileSync(missing, 'utf8'), 'y\n');
  });

  it('a read-only stop list gives a clear message and stays as it was', async () => {
    const file = path.join(dir, 'stop.txt');
    writeFileSync(file, 'the\n');
    chmodSync(file, 0o444);
    const list = await readStopList(file);
    await assert.rejects(replaceStopList(list, appendTerms(list, ['x']).bytes), (e: unknown) => e instanceof UserError && /read-only/.test(e.message));
    assert.equal(readFileSync(file, 'utf8'), 'the\n');
  });

  it('the new file replaces the old one by rename (new inode), keeps its mode, and a symlink stays a link', async () => {
    const real = path.join(dir, 'lists', 'real.txt');
    mkdirSync(path.dirname(real));
    writeFileSync(real, 'the\n');
    chmodSync(real, 0o640);
    const link = path.join(dir, 'stop.txt');
    symlinkSync(real, link);
    const inode = statSync(real).ino;
    await appendFile(link, ['hello']);
    assert.ok(lstatSync(link).isSymbolicLink());
    assert.equal(readlinkSync(link), real);
    assert.equal(readFileSync(real, 'utf8'), 'the\nhello\n');
    assert.notEqual(statSync(real).ino, inode);
    assert.equal(statSync(real).mode & 0o777, 0o640);
    assert.deepEqual(readdirSync(path.dirname(real)), ['real.txt']);
  });

  it('kill -9 while the new file is being written leaves the old stop list whole', async function () {
    this.timeout(60_000);
    const file = path.join(dir, 'stop.txt');
    const old = 'the\nof\n'.repeat(1000);
    writeFileSync(file, old);
    const script = `
      const { appendTerms, readStopList, replaceStopList } = require(${JSON.stringify(path.join(__dirname, '../../extension/src/engine/stoplist/stop-list-file.ts'))});
      (async () => {
        const list = await readStopList(${JSON.stringify(file)});
        await replaceStopList(list, appendTerms(list, ['hello']).bytes, { afterTempWritten: () => { process.stdout.write('ready\\n'); return new Promise(() => setInterval(() => {}, 1000)); } });
      })();`;
    const child = spawn(process.execPath, ['--require', 'tsx/cjs', '-e', script], { cwd: path.join(__dirname, '../..'), stdio: ['ignore', 'pipe', 'inherit'] });
    await new Promise<void>((resolve, reject) => {
      child.stdout.on('data', (d: Buffer) => (String(d).includes('ready') ? resolve() : undefined));
      child.on('exit', (code) => reject(new Error(`child exited early (${code})`)));
    });
    child.kill('SIGKILL');
    await new Promise((r) => child.once('exit', r));
    assert.equal(readFileSync(file, 'utf8'), old);
  });

  it('a full disk gives a clear message and leaves the old file (tmpfs of 64 KiB; needs mount, as root in CI)', async function () {
    const mnt = path.join(dir, 'small');
    mkdirSync(mnt);
    if (spawnSync('mount', ['-t', 'tmpfs', '-o', 'size=64k', 'tmpfs', mnt]).status !== 0) this.skip();
    try {
      const file = path.join(mnt, 'stop.txt');
      writeFileSync(file, 'x'.repeat(40_000) + '\n');
      const list = await readStopList(file);
      await assert.rejects(replaceStopList(list, appendTerms(list, ['hello']).bytes), (e: unknown) => e instanceof UserError && /disk is full/.test(e.message) && /nothing was changed/.test(e.message));
      assert.equal(readFileSync(file, 'utf8').length, 40_001);
      assert.deepEqual(readdirSync(mnt), ['stop.txt']);
    } finally {
      spawnSync('umount', [mnt]);
    }
  });
});
