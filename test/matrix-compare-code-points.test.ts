import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { compareCodePoints, placesAmong, sortByCodePoint } from '../extension/src/engine/matrix/compare-code-points';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
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

  it('placesAmong finds each term of a sorted list in a larger sorted one, or -1, as a map of the larger would', () => {
    // Random words over an alphabet with astral characters and U+E000-U+FFFF units, where code
    // point order and UTF-16 order differ (the case placesAmong's binary search must follow).
    const alphabet = ['a', 'b', 'z', 'é', '\ue000', '\uffff', '😀', '𝒳', '中'];
    const random = mulberry32(20261205);
    const word = (): string => Array.from({ length: 1 + Math.floor(random() * 4) }, () => alphabet[Math.floor(random() * alphabet.length)]).join('');
    const among = sortByCodePoint([...new Set(Array.from({ length: 3000 }, word))]);
    const terms = sortByCodePoint([...new Set([...Array.from({ length: 400 }, word), among[0]!, among[among.length - 1]!])]);
    const columnOf = new Map(among.map((t, j) => [t, j]));
    const expected = terms.map((t) => columnOf.get(t) ?? -1);
    assert.ok(expected.some((c) => c < 0) && expected.filter((c) => c >= 0).length > 100, 'both present and absent terms are asked');
    assert.deepEqual([...placesAmong(terms, among)], expected);
    assert.deepEqual([...placesAmong([], among)], []);
    assert.deepEqual([...placesAmong(terms, [])], terms.map(() => -1));
  });
});
