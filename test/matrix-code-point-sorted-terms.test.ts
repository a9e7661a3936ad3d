import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { CodePointSortedTerms } from '../extension/src/engine/matrix/code-point-sorted-terms';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { PYTHON, requireSklearn } from './reference/run-sklearn';

/** Python's sorted() of `words` (Python 3 compares str by code point: language reference, "Value comparisons"). */
function pythonSorted(words: readonly string[]): string[] {
  const r = spawnSync(PYTHON, ['-c', 'import json,sys; print(json.dumps(sorted(json.load(sys.stdin))))'], { input: JSON.stringify(words), encoding: 'utf8', maxBuffer: 1 << 26 });
  assert.equal(r.status, 0, r.stderr);
  return JSON.parse(r.stdout) as string[];
}

/** `n` distinct seeded strings over `alphabet` (1–6 characters), in arrival order. */
function distinctWords(n: number, alphabet: readonly string[], seed: number): string[] {
  const random = mulberry32(seed);
  const seen = new Set<string>();
  while (seen.size < n) {
    let w = '';
    const length = 1 + Math.floor(random() * 6);
    for (let i = 0; i < length; i++) w += alphabet[Math.floor(random() * alphabet.length)]!;
    seen.add(w);
  }
  return [...seen];
}

describe('matrix/code-point-sorted-terms', () => {
  const latin = [...'abcdefghijklmnopqrstuvwxyzAZéß0'];
  const cases: [string, string[]][] = [
    ['Latin letters and digits', latin],
    ['with astral characters (surrogates), no U+E000–U+FFFF', [...latin, '😀', '𝒳']],
    ['with U+E000–U+FFFF, no surrogates', [...latin, 'ｚ', '\ue000', '\uffff']],
    ['with both, where UTF-16 order and code point order differ', [...latin, '😀', 'ｚ', '\ue000']],
  ];
  for (const [name, alphabet] of cases) {
    it(`gives Python's sorted() order, terms added in batches with tidy() between them: ${name}`, () => {
      requireSklearn(); // also checks that /usr/bin/python3 is there
      const words = distinctWords(30_000, alphabet, 7);
      const sorted = new CodePointSortedTerms();
      const random = mulberry32(11);
      let merges = 0;
      for (let i = 0; i < words.length; ) {
        const end = Math.min(words.length, i + 1 + Math.floor(random() * 3000));
        for (; i < end; i++) sorted.add(words[i]!);
        // Now and then the order mid-stream: it must hold the waiting terms too.
        if (merges % 7 === 3) assert.equal(sorted.sorted().length, i);
        sorted.tidy();
        merges++;
      }
      assert.ok(merges > 10, 'the terms came in many batches');
      assert.deepEqual(sorted.sorted(), pythonSorted(words));
    });
  }
});
