import { strict as assert } from 'node:assert';
import { samePath } from '../extension/src/host/pure/same-path';

describe('host/pure/same-path', () => {
  it('samePath ignores case on Windows and macOS and not on Linux', () => {
    // Source: default file systems — NTFS and APFS are case-insensitive, ext4 is case-sensitive
    // (common practice, no source).
    assert.equal(samePath('C:\\Work\\StopList.txt', 'c:\\work\\stoplist.txt', 'win32'), true);
    assert.equal(samePath('/Users/a/StopList.txt', '/Users/a/stoplist.txt', 'darwin'), true);
    assert.equal(samePath('/home/a/StopList.txt', '/home/a/stoplist.txt', 'linux'), false);
    assert.equal(samePath('/home/a/stoplist.txt', '/home/a/stoplist.txt', 'linux'), true);
    assert.equal(samePath('/home/a/x.txt', '/home/a/y.txt', 'darwin'), false);
  });
});
