import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { compareCodePoints, sortByCodePoint } from '../extension/src/engine/matrix/compare-code-points';
import { PYTHON, requireSklearn } from './reference/run-sklearn';

describe('matrix/compare-code-points', () => {
  it('compareCodePoints sorts like Python\'s sorted() (code point order)', () => {
    requireSklearn(); // also checks that /usr/bin/python3 is there
    const words = ['b', 'a', 'ab', '', 'Z', 'é', 'e\u0301', 'ｚ', '\uffff', '😀', '𝒳', '\ue000', '\ud7ff', 'a😀', 'a\uff21', '中文', 'ß', 'ss', '#tag', '10', '9', 'zz'];
    // Source: Python 3 compares str by code point (Python language reference, "Value comparisons"),
    // run here by /usr/bin/python3.
    const r = spawnSync(PYTHON, ['-c', 'import json,sys; print(json.dumps(sorted(json.load(sys.stdin))))'], { input: JSON.stringify(words), encoding: 'utf8' });
    assert.equal(r.status, 0, r.stderr);
    const expected = JSON.parse(r.stdout) as string[];
    assert.deepEqual([...words].sort(compareCodePoints), expected);
    assert.notDeepEqual([...words].sort(), expected, 'UTF-16 order differs here, so the test can tell them apart');
    // sortByCodePoint: the same order with both kinds of units present, and without either.
    assert.deepEqual(sortByCodePoint(words), expected);
    for (const without of [(w: string) => !/[\ud800-\udfff]/.test(w), (w: string) => !/[\ue000-\uffff]/.test(w)]) {
      const some = words.filter(without);
      assert.deepEqual(sortByCodePoint(some), expected.filter(without));
    }
  });
});
