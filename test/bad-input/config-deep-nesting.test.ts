// Issue 13: "10,000-deep nesting in the config" was an internal error (stack overflow in the
// parser). It is one UserError naming loudword.json and its line. Source: common practice, no
// source (recursive-descent parsers overflow the stack on deep nesting).
import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { loadSettings } from '../../extension/src/engine/config/load-settings';
import { UserError } from '../../extension/src/engine/user-error';

describe('bad input: a config nested 10,000 deep', () => {
  it('is one UserError naming the file and line, not a stack overflow', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-deep-'));
    try {
      const file = path.join(dir, 'loudword.json');
      writeFileSync(file, '{"a":'.repeat(10_000) + '1' + '}'.repeat(10_000) + '\n');
      await assert.rejects(loadSettings(file), (e: unknown) => e instanceof UserError && e.file === file && e.line === 1 && /nested more than/.test(e.message));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
