import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { createTokenizer, type TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';
import { tokenKindOf } from '../extension/src/engine/tokenize/token-kind';
import { TOKEN_KINDS } from '../extension/src/protocol';

// Expected tokens below are wink-nlp's own behaviour. Source: wink-nlp 2.4.0 with
// wink-eng-lite-web-model 1.8.1 (package.json), observed here; a wink upgrade that changes them
// should fail these tests so the README's list of behaviours is updated.
const base: TokenSettings = { lowercase: true, minLength: 1, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams: 1 };
const every: TokenSettings['kinds'] = [...TOKEN_KINDS];

describe('createTokenizer', () => {
  it("createTokenizer accepts exactly the kinds of TOKEN_KINDS, and loudword.schema.json's enum is that list", () => {
    // Source: the project's own contract (one list of kinds, protocol.ts); no outside source.
    const schema = JSON.parse(readFileSync(path.join(__dirname, '..', 'loudword.schema.json'), 'utf8'));
    assert.deepEqual(schema.properties.tokens.properties.kinds.items.enum, [...TOKEN_KINDS]);
    for (const kind of TOKEN_KINDS) assert.doesNotThrow(() => createTokenizer({ ...base, kinds: [kind] }), kind);
    assert.throws(() => createTokenizer({ ...base, kinds: ['hashtags' as never] }), /unknown token kind "hashtags"/);
  });

  it('createTokenizer splits contractions and maps the parts to words when lowercasing', () => {
    const t = createTokenizer(base);
    assert.deepEqual(t("I don't know, we can't go, they won't come"), ['i', 'do', 'not', 'know', 'we', 'can', 'not', 'go', 'they', 'will', 'not', 'come']);
    assert.deepEqual(t('cannot'), ['can', 'not']);
    assert.deepEqual(t("It's"), ['it', 'is']);
  });

  it('createTokenizer lower-cases every other word and nothing more, as scikit-learn does (wink would respell it)', () => {
    // wink's normal form respells: "through" → "thru", "colour" → "color", "cd" → "could",
    // "da" → "the", and keeps "Steve" capitalised (observed, versions above). scikit-learn's
    // analyzer only lower-cases (Debian python3-sklearn 1.2, lowercase=True), so a term here is
    // the word the user's vectors hold. Both paths: whole documents and the chunk cache.
    const text = 'Through the colour of Steve cd da b4 behaviour';
    const want = ['through', 'the', 'colour', 'of', 'steve', 'cd', 'da', 'b4', 'behaviour'];
    assert.deepEqual(createTokenizer(base, { chunkCache: false })(text), want);
    assert.deepEqual(createTokenizer(base)(`${text} ${text}`), [...want, ...want]);
  });

  it('createTokenizer keeps the surface forms of contraction parts without lowercase', () => {
    assert.deepEqual(createTokenizer({ ...base, lowercase: false })("Don't"), ['Do', "n't"]);
  });

  it('createTokenizer types URLs, e-mails, hashtags and mentions as single tokens', () => {
    const t = createTokenizer({ ...base, kinds: every });
    const tokens = t('See https://example.com/a?b=1 or mail me@example.org #Topic @someone');
    assert.ok(tokens.includes('https://example.com/a?b=1'));
    assert.ok(tokens.includes('me@example.org'));
    assert.ok(tokens.includes('#topic'));
    assert.ok(tokens.includes('@someone'));
  });

  it('createTokenizer keeps only the requested kinds', () => {
    const text = 'Mail me@example.org about #Topic at 5pm, 3.5 times :) 😀 $20!';
    assert.deepEqual(createTokenizer({ ...base, kinds: ['word'] })(text), ['mail', 'about', 'at', 'times']);
    assert.deepEqual(createTokenizer({ ...base, kinds: ['number'] })(text), ['3.5', '20']);
    assert.deepEqual(createTokenizer({ ...base, kinds: ['email', 'hashtag', 'time', 'emoticon', 'emoji', 'currency'] })(text), ['me@example.org', '#topic', '5pm', ':)', '😀', '$']);
    assert.deepEqual(createTokenizer({ ...base, kinds: ['punctuation'] })(text), [',', '!']);
  });

  it('createTokenizer keeps words of scripts the English model does not know', () => {
    // wink types Cyrillic and Greek as "unk"; we keep them as words (token-kind.ts).
    assert.deepEqual(createTokenizer({ ...base, kinds: ['word'] })('Привет мир, αβγ'), ['привет', 'мир', 'αβγ']);
  });

  it('createTokenizer drops tokens shorter than minLength code points, exempting emoji', () => {
    const t = createTokenizer({ ...base, minLength: 2 });
    assert.deepEqual(t('I am a cat 😀 7 42'), ['am', 'cat', '😀', '42']);
    // "𝒳𝒴" is two code points but four UTF-16 units. Source: Unicode (U+1D4B3, U+1D4B4 are astral).
    assert.deepEqual(createTokenizer({ ...base, minLength: 3 })('ab 𝒳𝒴 abc'), ['abc']);
    assert.deepEqual(createTokenizer({ ...base, minLength: 2 })('𝒳𝒴'), ['𝒳𝒴']);
  });

  it('createTokenizer stems words only', () => {
    // Porter (1980) stemmer as shipped in wink's model: running → run, quickly → quick.
    const t = createTokenizer({ ...base, stem: true });
    assert.deepEqual(t('Running quickly 3.5 10:30'), ['run', 'quick', '3.5', '10:30']);
  });

  it('createTokenizer makes bigrams of adjacent kept tokens within a sentence, after the unigrams', () => {
    const t = createTokenizer({ ...base, ngrams: 2 });
    assert.deepEqual(t('Red, green apples. Blue sky!'), ['red', 'green', 'apples', 'blue', 'sky', 'red green', 'green apples', 'blue sky']);
    // A dropped token does not break adjacency (as in scikit-learn, where filtering precedes n-grams).
    assert.deepEqual(createTokenizer({ ...base, minLength: 2, ngrams: 2 })('big a dog'), ['big', 'dog', 'big dog']);
  });

  it('createTokenizer returns nothing for empty or blank text', () => {
    const t = createTokenizer(base);
    assert.deepEqual(t(''), []);
    assert.deepEqual(t(' \n\t '), []);
  });

  it('createTokenizer rejects bad settings', () => {
    assert.throws(() => createTokenizer({ ...base, minLength: -1 }), RangeError);
    assert.throws(() => createTokenizer({ ...base, ngrams: 3 as 1 }), RangeError);
    assert.throws(() => createTokenizer({ ...base, kinds: ['words' as 'word'] }), RangeError);
  });
});

describe('tokenKindOf', () => {
  it('tokenKindOf maps wink-only categories onto ours', () => {
    assert.equal(tokenKindOf('decade', '2020s'), 'number');
    assert.equal(tokenKindOf('tabCRLF', '\n'), null);
    assert.equal(tokenKindOf('unk', 'мир'), 'word');
    assert.equal(tokenKindOf('unk', '½'), 'number'); // U+00BD is category No. Source: Unicode data.
    assert.equal(tokenKindOf('unk', '≠'), 'symbol');
    assert.equal(tokenKindOf('hashtag', '#x'), 'hashtag');
  });
});
