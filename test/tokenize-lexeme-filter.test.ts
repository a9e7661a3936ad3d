import { strict as assert } from 'node:assert';
import { mulberry32, randomBelow } from '../extension/src/engine/random/seeded-random';
import { hashOf } from '../extension/src/engine/tokenize/chunk-table';
import { LexemeFilter } from '../extension/src/engine/tokenize/lexeme-filter';
import { freshWinkInstance, winkLexemeFilter, winkLexemeList } from '../extension/src/engine/tokenize/wink-instance';

// lexeme-filter.ts: the chunk-cached coder skips wink's lexeme look-up when the filter says no,
// so a "no" for a string that is a lexeme would change tokens. Random strings here are made of
// a small alphabet (some uppercase, some signs) so that wink's runs add lexemes and their
// lowercase forms.
const ALPHABET = 'abcdeABCDEéÉxyz.,\'-5';

function randomStrings(seed: number, count: number): string[] {
  const random = mulberry32(seed);
  const out: string[] = [];
  for (let i = 0; i < count; i++) {
    let s = '';
    const n = 1 + randomBelow(random, 9);
    for (let j = 0; j < n; j++) s += ALPHABET[randomBelow(random, ALPHABET.length)];
    out.push(s);
  }
  return out;
}

const hash = (s: string): number => hashOf(s, 0, s.length);

describe('tokenize: the lexeme filter (a no means wink has no such lexeme)', function () {
  this.timeout(60_000);

  it('an instance made by freshWinkInstance exposes its live lexeme list', () => {
    const nlp = freshWinkInstance('tokens');
    const list = winkLexemeList(nlp);
    assert.ok(list !== null && list.length > 80_000, 'the model has ~87k lexemes');
    const before = list.length;
    nlp.readDoc('qqzxv Wqqzxv').tokens().out();
    assert.ok(list.length > before, 'wink pushed its new lexemes onto the same list');
    assert.ok(list.includes('qqzxv') && list.includes('Wqqzxv') && list.includes('wqqzxv'));
  });

  it('says yes for every lexeme, also for those wink adds after the filter is made', () => {
    const nlp = freshWinkInstance('tokens');
    const list = winkLexemeList(nlp)!;
    const filter = new LexemeFilter(list);
    for (const entry of list) assert.ok(filter.mayHave(hash(entry as string)), `model lexeme ${String(entry)}`);
    const before = list.length;
    const texts = randomStrings(20261205, 3000);
    for (let i = 0; i < texts.length; i += 50) nlp.readDoc(texts.slice(i, i + 50).join(' ')).tokens().out();
    assert.ok(list.length > before + 1000, `wink added ${list.length - before} lexemes`);
    const lexemes = nlp.readDoc('');
    for (const t of texts) {
      // Every string wink knows now (the chunks and the parts it split them into).
      if (lexemes.isLexeme(t) !== null) assert.ok(filter.mayHave(hash(t)), `new lexeme ${t}`);
    }
    for (let k = before; k < list.length; k++) assert.ok(filter.mayHave(hash(list[k] as string)), `added lexeme ${String(list[k])}`);
  });

  it('a no is never wrong, and most strings that are no lexemes get one', () => {
    const nlp = freshWinkInstance('tokens');
    const filter = new LexemeFilter(winkLexemeList(nlp)!);
    const lexemes = nlp.readDoc('');
    const asked = [...randomStrings(7, 20_000), 'the', 'The', 'THE', "don't", 'cannot', '.', ',', 'people', 'People'];
    let notLexemes = 0;
    let noes = 0;
    for (const s of asked) {
      const isLexeme = lexemes.isLexeme(s) !== null;
      if (!filter.mayHave(hash(s))) {
        noes++;
        assert.ok(!isLexeme, `the filter said no to the lexeme ${s}`);
      }
      if (!isLexeme) notLexemes++;
    }
    assert.ok(notLexemes > 10_000);
    assert.ok(noes > 0.9 * notLexemes, `${noes} noes for ${notLexemes} strings that are no lexemes`);
  });

  it('a filter started from the model\'s own lexemes answers as one that hashed the whole list', () => {
    // winkLexemeFilter copies the words of a filter over the lexemes every instance starts with.
    const busy = freshWinkInstance('tokens');
    for (const t of randomStrings(3, 2000)) busy.readDoc(t).tokens().out();
    const nlp = freshWinkInstance('tokens');
    const started = winkLexemeFilter(nlp)!;
    const list = winkLexemeList(nlp)!;
    const texts = randomStrings(11, 2000);
    for (let i = 0; i < texts.length; i += 50) nlp.readDoc(texts.slice(i, i + 50).join(' ')).tokens().out();
    const whole = new LexemeFilter(list);
    const asked = [...randomStrings(5, 20_000), ...(list as string[])];
    for (const s of asked) assert.equal(started.mayHave(hash(s)), whole.mayHave(hash(s)), s);
  });
});
