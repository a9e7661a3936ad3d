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

  it('ChunkTable begun with 16 slots (the scan\'s warm-up) agrees with a Map as it grows, long keys included', () => {
    const t = new ChunkTable(undefined, 16);
    const m = new Map<string, number>();
    for (let i = 0; i < 5_000; i++) {
      // Short keys and keys past the ten code units kept in a slot, so the long-key store grows too.
      const key = i % 3 === 0 ? `internationalisation-${i}` : `k${i.toString(36)}`;
      t.set(key, i);
      m.set(key, i);
    }
    assert.equal(t.size, m.size);
    for (const [key, value] of m) assert.equal(t.getKey(key), value, key);
    assert.equal(t.getKey('internationalisation-1'), ABSENT);
  });

  it('ChunkTable tells apart keys that differ in their last code unit, on both sides of the length kept in a slot', () => {
    // Short keys are compared two code units at a time, long ones unit by unit: near-identical
    // keys of every length from 1 to 14 (the slot keeps 10), with units above 0x7fff (negative
    // when packed into an int32) and U+0000 (the empty high half of an odd key).
    const t = new ChunkTable();
    const m = new Map<string, number>();
    const lasts = ['a', 'b', '\u0000', '\uffff', '\ud83d', '\u8000'];
    for (let length = 1; length <= 14; length++) {
      for (const fill of ['x', '\uff21']) {
        for (const last of lasts) {
          const key = fill.repeat(length - 1) + last;
          m.set(key, m.size);
          t.set(key, m.get(key)!);
        }
      }
    }
    assert.equal(t.size, m.size);
    const text = `(${[...m.keys()].join(' ')})`;
    let start = 1;
    for (const [key, value] of m) {
      assert.equal(t.get(text, start, start + key.length, hashOf(text, start, start + key.length)), value, JSON.stringify(key));
      start += key.length + 1;
    }
    for (const probe of ['x'.repeat(10) + 'c', 'x'.repeat(9) + 'c', '\uff21'.repeat(3) + 'c', 'a\u0000\u0000']) assert.equal(t.getKey(probe), ABSENT, JSON.stringify(probe));
  });

  it('ChunkTable keeps apart two keys of the same length and the same 32-bit hash, short and long', () => {
    // Pairs found by a birthday search over seeded random keys (FNV-1a has 32 bits, so among
    // ~2^17 keys of one length some two share a hash): only the comparison of the code units
    // themselves can tell them apart.
    let seed = 99;
    const next = (): number => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0);
    const alphabet = 'abcdefghijklmnopqrstuvwxyz\u00e9\u6771\uff21\u8000';
    for (const length of [4, 10, 13]) {
      const byHash = new Map<number, string>();
      let pair: [string, string] | null = null;
      while (pair === null) {
        let key = '';
        for (let j = 0; j < length; j++) key += alphabet[(next() >>> 8) % alphabet.length];
        const h = hashOf(key, 0, length);
        const other = byHash.get(h);
        if (other !== undefined && other !== key) pair = [other, key];
        else byHash.set(h, key);
      }
      const [a, b] = pair;
      const t = new ChunkTable();
      t.set(a, 1);
      assert.equal(t.getKey(b), ABSENT, `${length}: ${JSON.stringify(b)} is not ${JSON.stringify(a)}`);
      t.set(b, 2);
      assert.equal(t.size, 2);
      assert.equal(t.getKey(a), 1);
      assert.equal(t.getKey(b), 2);
    }
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
  it('ChunkTable.insertAbsent stores a key found absent straight from its text, as set does (short and long keys, growing, starting over)', () => {
    const byInsert = new ChunkTable(3000);
    const bySet = new ChunkTable(3000);
    let seed = 777;
    const next = (): number => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0);
    const alphabet = ['a', 'b', 'é', '東', '\ud83d\ude00', 'Z', ' '];
    let text = '';
    for (let i = 0; i < 60_000; i++) text += alphabet[next() % alphabet.length];
    const kept: boolean[] = [];
    for (let k = 0; k < 5000; k++) {
      // Keys of 1-30 code units cut out of one text: some kept in a slot, some in the long store.
      const start = next() % (text.length - 30);
      const end = start + 1 + (next() % 30);
      const hash = hashOf(text, start, end);
      if (byInsert.get(text, start, end, hash) !== ABSENT) continue;
      const a = byInsert.insertAbsent(text, start, end, hash, k);
      const b = bySet.set(text.slice(start, end), k);
      assert.equal(a, b, `kept at ${k}`);
      kept.push(a);
      assert.equal(byInsert.size, bySet.size);
    }
    assert.ok(kept.includes(false), 'the table started over at least once');
    for (let k = 0; k < 20_000; k++) {
      const start = next() % (text.length - 30);
      const end = start + 1 + (next() % 30);
      assert.equal(byInsert.get(text, start, end, hashOf(text, start, end)), bySet.getKey(text.slice(start, end)));
    }
  });
});
