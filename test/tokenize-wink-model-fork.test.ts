import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import type { WinkMethods } from 'wink-nlp';
import { freshWinkInstance, winkLexemeList } from '../extension/src/engine/tokenize/wink-instance';

// freshWinkInstance gives each instance a fork of one read of wink's model
// (tokenize/wink-model-fork.ts) instead of reading the model again. A fork must start in the
// state of a model read afresh: what one instance adds to its lexemes is never seen by another.
// The reference is wink-nlp run as its README shows it, on the model package's own reader.

function tokensOf(nlp: WinkMethods, text: string): string {
  const tokens = nlp.readDoc(text).tokens();
  return `${(tokens.out(nlp.its.value) as string[]).join('|')} / ${(tokens.out(nlp.its.type) as string[]).join('|')}`;
}

function winkAsShipped(): WinkMethods {
  const winkNLP = require('wink-nlp') as (model: unknown, pipe: string[]) => WinkMethods;
  return winkNLP(require('wink-eng-lite-web-model'), []);
}

describe('wink instances made from one read of the model', () => {
  it('do not see the lexemes another instance added', () => {
    // wink splits "xyzzy's" into "xyzzy" + "'s" until a chunk such as "xyzzy's." has made
    // "xyzzy's" a lexeme of the instance; from then on it is one token (seen with wink-nlp 2.4).
    const first = freshWinkInstance('tokens');
    assert.equal(tokensOf(first, "the xyzzy's lamp"), "the|xyzzy|'s|lamp / word|word|word|word");
    tokensOf(first, "xyzzy's.");
    assert.equal(tokensOf(first, "the xyzzy's lamp"), "the|xyzzy's|lamp / word|word|word");
    const second = freshWinkInstance('tokens');
    assert.equal(tokensOf(second, "the xyzzy's lamp"), "the|xyzzy|'s|lamp / word|word|word|word");
    assert.equal(winkLexemeList(second)!.includes("xyzzy's"), false);
    assert.equal(winkLexemeList(first)!.includes("xyzzy's"), true);
  });

  it('tokenise like wink-nlp on a model read afresh, after others have tokenised much (Debian fortunes)', function () {
    let text: string[];
    try {
      text = readFileSync('/usr/share/games/fortunes/fortunes', 'utf8').split('\n%\n').slice(0, 400);
    } catch {
      return this.skip(); // the fortunes package is missing (test/corpora/README.md)
    }
    const start = winkLexemeList(freshWinkInstance('tokens'))!.length;
    const busy = freshWinkInstance('tokens');
    for (const t of text) tokensOf(busy, t.toUpperCase() + ' ' + t.split('').reverse().join(''));
    const fork = freshWinkInstance('tokens');
    const reference = winkAsShipped();
    for (const t of text) assert.equal(tokensOf(fork, t), tokensOf(reference, t), t);
    // and an instance made now starts with exactly the model's own lexemes, as the first one did
    assert.equal(winkLexemeList(freshWinkInstance('tokens'))!.length, start);
  });
});
