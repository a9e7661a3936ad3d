import { strict as assert } from 'node:assert';
import { ABSENT, ChunkTable, hashOf } from '../extension/src/engine/tokenize/chunk-table';

// The chunk table is checked against a JavaScript Map holding the same keys (common practice, no
// source): whatever the table does inside (slots, probing, growing, its code-unit store), a
// lookup must answer what the Map answers.

describe('tokenize/chunk-table', () => {
  it('ChunkTable.get finds a chunk inside a longer text by position, without cutting it out', () => {
    const t = new ChunkTable();
    t.set('word', 7);
    const text = 'a word, words';
    assert.equal(t.get(text, 2, 6, hashOf(text, 2, 6)), 7);
    assert.equal(t.get(text, 8, 12, hashOf(text, 8, 12)), 7, '"word" inside "words"');
    assert.equal(t.get(text, 8, 13, hashOf(text, 8, 13)), ABSENT, '"words"');
    assert.equal(t.get(text, 2, 7, hashOf(text, 2, 7)), ABSENT, '"word,"');
    assert.equal(t.getKey(''), ABSENT);
  });

  it('ChunkTable agrees with a Map over 200,000 keys set, overwritten and looked up (growing past its first size many times)', () => {
    const t = new ChunkTable();
    const m = new Map<string, number>();
    let seed = 12345;
    const next = (): number => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0);
    // Keys that share prefixes, differ only in length, or hold surrogates and other scripts.
    const alphabet = ['a', 'b', 'é', '.', ',', '東', '\ud83d\ude00', '\u0301', 'Z'];
    for (let i = 0; i < 200_000; i++) {
      let key = '';
      const length = 1 + (next() % 12);
      for (let j = 0; j < length; j++) key += alphabet[next() % alphabet.length];
      const value = next() % 1000 === 0 ? -4 - (i % 50) : i;
      t.set(key, value);
      m.set(key, value);
    }
    assert.equal(t.size, m.size);
    for (const [key, value] of m) assert.equal(t.getKey(key), value, JSON.stringify(key));
    for (const probe of ['ab', 'zzz', 'a'.repeat(13), '東東東東東東東東東東東東東']) if (!m.has(probe)) assert.equal(t.getKey(probe), ABSENT, probe);
  });

  it('ChunkTable starts over when full and says so, keeping the entry that did not fit', () => {
    const t = new ChunkTable(100);
    for (let i = 0; i < 100; i++) assert.equal(t.set(`k${i}`, i), true);
    assert.equal(t.set('k0', 5), true, 'replacing an entry is not adding one');
    assert.equal(t.set('one more', 1), false);
    assert.equal(t.size, 1);
    assert.equal(t.getKey('one more'), 1);
    assert.equal(t.getKey('k1'), ABSENT);
  });
});
