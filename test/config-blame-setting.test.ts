import { strict as assert } from 'node:assert';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { blameSetting } from '../extension/src/engine/config/blame-setting';
import { UserError } from '../extension/src/engine/user-error';

// Issue 10: a corpus in a subfolder picked up the root config's "label" and failed with
// "no label field 'topic'" without saying where "topic" came from (project rule, no source).
describe('blameSetting', () => {
  const settings = { ...DEFAULT_SETTINGS, label: 'topic' };
  const readerError = new UserError('no label field "topic"; available: "id", "body"', 'data/sub/c.csv', 1, 'label');

  it('blameSetting points a field error at the loudword.json line that set it', () => {
    const e = blameSetting(readerError, settings, { label: { from: 'loudword.json', where: '/p/loudword.json:3' } });
    assert.ok(e instanceof UserError);
    assert.equal(e.describe(), '/p/loudword.json:3: label "topic": no such field in data/sub/c.csv; available: "id", "body"');
  });

  it('blameSetting names a flag or an editor setting, keeping the corpus position', () => {
    const e = blameSetting(readerError, settings, { label: { from: 'command-line flag', where: '--label' } }) as UserError;
    assert.equal(e.describe(), 'data/sub/c.csv:1: --label "topic" (command-line flag): no such field in data/sub/c.csv; available: "id", "body"');
  });

  it('blameSetting leaves defaults, other errors and non-user errors alone', () => {
    assert.equal(blameSetting(readerError, settings, {}), readerError);
    const plain = new UserError('binary file', 'c.csv', null);
    assert.equal(blameSetting(plain, settings, { label: { from: 'loudword.json', where: '/p/loudword.json:3' } }), plain);
    const bug = new TypeError('x');
    assert.equal(blameSetting(bug, settings, {}), bug);
  });
});
