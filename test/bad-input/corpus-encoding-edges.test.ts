// Issue 13, "Loses or rewrites the user's bytes": a valid UTF-8 file with one stray byte was read
// as Latin-1 from that point (mojibake terms); a cut at limits.maxBytes inside a multi-byte
// character switched the rest to Latin-1; binary after a UTF-8 BOM was reviewed as 15,445
// documents. Sources: RFC 3629 (UTF-8 sequences), WHATWG Encoding Standard (one U+FFFD per
// maximal invalid subpart; Node's decoder follows it), Unicode BOMs EF BB BF / FF FE.
import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import type { CorpusRow, CorpusSource, ReadOptions } from '../../extension/src/engine/read/corpus-source';
import { openCorpus } from '../../extension/src/engine/read/open-corpus';
import { UserError } from '../../extension/src/engine/user-error';

describe('bad input: encoding edges of the corpus', () => {
  let dir: string;
  beforeEach(() => (dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-enc-'))));
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  async function read(name: string, bytes: Buffer, options: ReadOptions = {}): Promise<{ rows: CorpusRow[]; source: CorpusSource }> {
    const file = path.join(dir, name);
    writeFileSync(file, bytes);
    const source = await openCorpus(file, options);
    const rows: CorpusRow[] = [];
    for await (const b of source.batches()) rows.push(...b);
    return { rows, source };
  }

  it('UTF-8 with one stray byte: U+FFFD at that byte, the rest stays UTF-8, a note names the line', async () => {
    const bytes = Buffer.concat([Buffer.from('id,text\n1,café crème\n2,bad '), Buffer.from([0xff]), Buffer.from(' byte\n3,naïve señor\n')]);
    const { rows, source } = await read('stray.csv', bytes);
    assert.deepEqual(rows.map((r) => r.text), ['café crème', 'bad \ufffd byte', 'naïve señor']);
    const notes = (source.notes ?? []).join(' | ');
    assert.match(notes, /line 3: a byte that is not UTF-8 \(offset 29\) was read as U\+FFFD/);
    assert.doesNotMatch(notes, /windows-1252/);
  });

  it('the same past the 1 MiB head (stream decoding), with CRLF line breaks counted', async () => {
    const filler = Array.from({ length: 60000 }, (_, i) => `${i + 2},été numéro ${i}\r\n`).join('');
    const bytes = Buffer.concat([Buffer.from('id,text\r\n1,début\r\n' + filler + '99999,x '), Buffer.from([0xc3, 0x28]), Buffer.from(' y\r\n100000,über\r\n')]);
    assert.ok(bytes.length > 1024 * 1024);
    const { rows, source } = await read('late.csv', bytes, { chunkBytes: 64 * 1024 });
    assert.equal(rows.at(-1)?.text, 'über');
    assert.equal(rows.at(-2)?.text, 'x \ufffd( y');
    assert.match((source.notes ?? []).join(' '), new RegExp(`line ${60000 + 3}: a byte that is not UTF-8`));
  });

  it('a file of ASCII then lone Latin-1 bytes is still read as windows-1252 (no UTF-8 evidence)', async () => {
    const { rows, source } = await read('latin.csv', Buffer.from([...Buffer.from('id,text\n1,caf'), 0xe9, 0x0a]));
    assert.equal(rows[0]?.text, 'café');
    assert.match((source.notes ?? []).join(' '), /windows-1252/);
  });

  it('a cut at limits.maxBytes inside a multi-byte character keeps UTF-8 for everything before it', async () => {
    const text = 'id,text\n1,café\n2,naïve\n3,é';
    const bytes = Buffer.from(text);
    const { rows, source } = await read('cut.csv', bytes, { maxBytes: bytes.length - 1 }); // cuts the last é in half
    assert.deepEqual(rows.map((r) => r.text), ['café', 'naïve']);
    assert.doesNotMatch((source.notes ?? []).join(' '), /windows-1252|U\+FFFD/);
    assert.ok(source.truncated !== null);
  });

  it('binary after a UTF-8 BOM, or after a UTF-16 BOM, is refused as binary', async () => {
    const junk = Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 131 + 7) % 256));
    for (const [name, bom] of [['b8.csv', [0xef, 0xbb, 0xbf]], ['b16.csv', [0xff, 0xfe]]] as const) {
      const file = path.join(dir, name);
      writeFileSync(file, Buffer.concat([Buffer.from(bom), junk]));
      await assert.rejects(openCorpus(file), (e: unknown) => e instanceof UserError && e.file === file && /looks like a binary file/.test(e.message));
    }
  });

  it('real UTF-16 LE text with a BOM still reads (the binary check is not always failing)', async () => {
    const { rows } = await read('u16.csv', Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('id,text\n1,naïve 😀\n', 'utf16le')]));
    assert.deepEqual(rows.map((r) => r.text), ['naïve 😀']);
  });
});
