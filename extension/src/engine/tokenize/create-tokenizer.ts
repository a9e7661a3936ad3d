import type { WinkMethods } from 'wink-nlp';
import { TOKEN_KINDS, type EffectiveSettings, type TokenKind } from '../../protocol';
import { chunkCachedUnigrams } from './chunk-cached-unigrams';
import { cutLongRuns } from './long-runs';
import { lowercaseForms } from './lowercase-forms';
import { compileTokenPattern, patternTokens, SKLEARN_TOKEN_PATTERN, translatePythonPattern } from './pattern-tokenizer';
import { settleDeferredLexemes } from './deferred-lexemes';
import { createTermOf } from './term-of-token';
import { decodingTokenizer, internedCoder, type TermCoder } from './term-coder';
import { winkInstance, winkStemmer } from './wink-instance';
import { winkSplitsLikeThis } from './wink-splitter';
import { wordRunCoder } from './word-run-coder';

/** The token settings; `tokenizer` defaults to "wink" and `pattern` to scikit-learn's default. */
export type TokenSettings = Omit<EffectiveSettings['tokens'], 'tokenizer' | 'pattern'> & Partial<Pick<EffectiveSettings['tokens'], 'tokenizer' | 'pattern'>>;

/** A document → terms function that also counts the over-long runs it had to cut. */
export interface Tokenizer {
  (text: string): string[];
  /** Runs without spaces longer than MAX_RUN cut into pieces so far (long-runs.ts). */
  readonly longRunsCut: number;
}

const ALL_KINDS: ReadonlySet<TokenKind> = new Set<TokenKind>(TOKEN_KINDS);

/** How to run wink; tests pass their own instance to compare the two paths from the same state. */
export interface TokenizerEngine {
  /** wink-nlp instance to use (default: the shared one for the pipe the settings need). */
  nlp?: WinkMethods;
  /** Use the per-chunk cache when the settings allow it (default true). */
  chunkCache?: boolean;
}

/**
 * Turns a document into its terms with wink-nlp (English lite model), tokenisation only.
 *
 * What wink-nlp does that users will notice (checked against wink-nlp 2.4 and
 * wink-eng-lite-web-model 1.8; the unit tests pin each one):
 * - Contractions are split, and with `lowercase` the parts are mapped to full words
 *   (its.normal): "don't" → "do" + "not", "can't" → "ca"→"can" + "not", "won't" → "wo"→"will" +
 *   "not", "ain't" → "are" + "not", "we'd" → "we" + "would", "cannot" → "can" + "not", "it's" →
 *   "it" + "is". Possessives split too: "ABC's" → "abc" + "'s" (a word token), but a name with a
 *   lowercase tail stays whole ("John's" → "john's"), as do "I'm", "y'all", "o'clock".
 *   Without `lowercase` the parts keep their surface form ("n't", "ca", "wo").
 * - URLs ("https://example.com/a?b=1") and e-mail addresses are single tokens of kind url / email;
 *   a bare "www.foo.org" is not a URL: it becomes "www", ".", "foo", ".", "org".
 * - "#Hashtag" → hashtag "#hashtag" and "@user" → mention "@user", each with its sign kept.
 * - Numbers keep separators: "1,000,000", "3.5", "-5", "3/4" are single number tokens; "5pm"
 *   is a time, "1st" an ordinal, "2020s"/"'90s" are counted as numbers; "$20" is currency "$"
 *   plus number "20"; "50%" is "50" plus symbol "%".
 * - Hyphenated words are split ("well-known" → "well", "-", "known"), abbreviations are kept
 *   whole ("U.S.A.", "e.g.", "Mr.").
 * - Scripts the English model has no rules for (Cyrillic, Greek, Arabic, Hebrew, Devanagari,
 *   CJK) are kept as words; unsegmented CJK text stays one token per run of characters.
 *
 * Options:
 * - lowercase: the surface lower-cased, contractions expanded (lowercase-forms.ts: wink's own
 *   normal form also respells words, "through" → "thru", which no other pipeline does).
 * - minLength: drop tokens shorter than this many Unicode code points, measured before stemming;
 *   emoji, emoticons, symbols, punctuation and currency signs are exempt.
 * - kinds: token kinds to keep; everything else is dropped before n-grams are formed.
 * - stem: Porter stemmer (wink's) on words only — it would turn "3.5" into "y.5". The stemmer
 *   lowercases its output.
 * - ngrams 2: the unigrams, then each pair of adjacent kept tokens within one sentence (wink's
 *   sentence boundaries), joined by one space. Dropped tokens do not break adjacency, as in
 *   scikit-learn, where the token pattern and stop words act before n-grams are formed.
 *
 * With ngrams 1 the terms are the same, token for token, but most of wink's work is skipped
 * through a cache of whitespace-delimited chunks (see chunk-cached-unigrams.ts for why that is
 * exact). Bigrams need wink's sentence boundaries, which look across chunks, so they always go
 * through wink whole.
 *
 * A run without spaces longer than 1,000 characters (a base64 blob, a minified line) is cut into
 * pieces of at most 256 before wink sees it, because wink's cost on one run grows with the square
 * of its length; `longRunsCut` counts them (long-runs.ts).
 */
export function createTokenizer(settings: TokenSettings, engine: TokenizerEngine = {}): Tokenizer {
  const coder = chunkCoder(settings, engine);
  return coder !== null ? decodingTokenizer(coder) : wholeDocumentTokenizer(settings, engine);
}

/**
 * The same tokenizer as term ids (term-coder.ts): the unigram wink path encodes straight from
 * its chunk cache to ids, scikit-learn's default pattern from its word runs (word-run-coder.ts);
 * the other paths intern the strings `createTokenizer` gives.
 */
export function createTermCoder(settings: TokenSettings, engine: TokenizerEngine = {}): TermCoder {
  return chunkCoder(settings, engine) ?? internedCoder(wholeDocumentTokenizer(settings, engine));
}

/** Checks the settings; the chunk-cached (wink) or word-run (pattern) coder when they allow it, else null. */
function chunkCoder(settings: TokenSettings, engine: TokenizerEngine): TermCoder | null {
  const { minLength, ngrams } = settings;
  if (!Number.isInteger(minLength) || minLength < 0) throw new RangeError(`tokens.minLength must be a whole number ≥ 0, got ${minLength}`);
  if (ngrams !== 1 && ngrams !== 2) throw new RangeError(`tokens.ngrams must be 1 or 2, got ${String(ngrams)}`);
  for (const k of settings.kinds) if (!ALL_KINDS.has(k)) throw new RangeError(`unknown token kind "${k}"`);
  if (settings.tokenizer !== undefined && settings.tokenizer !== 'wink' && settings.tokenizer !== 'pattern') {
    throw new RangeError(`tokens.tokenizer must be "wink" or "pattern", got ${String(settings.tokenizer)}`);
  }
  if (settings.tokenizer === 'pattern') return isDefaultPatternUnigrams(settings) ? wordRunCoder(settings.lowercase, minLength) : null;
  if (ngrams !== 1 || engine.chunkCache === false || !winkSplitsLikeThis()) return null;
  return chunkCachedUnigrams(engine.nlp ?? winkInstance('tokens'), settings.lowercase, createTermOf(settings));
}

/** Every path but the chunk-cached one: the pattern tokenizer, or whole documents through wink. */
function wholeDocumentTokenizer(settings: TokenSettings, engine: TokenizerEngine): Tokenizer {
  if (settings.tokenizer === 'pattern') return patternTokenizer(settings);
  const { lowercase, ngrams } = settings;
  const nlp = engine.nlp ?? winkInstance(ngrams === 2 ? 'sentences' : 'tokens');
  const termOf = createTermOf(settings);
  let longRunsCut = 0;
  const withCount = (f: (text: string) => string[]): Tokenizer =>
    Object.defineProperty(f, 'longRunsCut', { get: () => longRunsCut }) as Tokenizer;
  const its = nlp.its;

  return withCount((whole: string): string[] => {
    const bounded = cutLongRuns(whole);
    longRunsCut += bounded.runs;
    // A chunk-cached coder on the same instance may have words wink has not been given yet.
    settleDeferredLexemes(nlp);
    const doc = nlp.readDoc(bounded.text);
    const tokens = doc.tokens();
    const forms = lowercase ? lowercaseForms(tokens, its) : (tokens.out() as string[]);
    const types = tokens.out(its.type) as string[];
    const kept: string[] = [];
    // Sentence id of each kept token, only needed to stop bigrams at sentence ends.
    const sentenceOfKept: number[] | null = ngrams === 2 ? [] : null;
    const spans = ngrams === 2 ? (doc.sentences().out(its.span) as unknown as [number, number][]) : null;
    let sentence = 0;
    for (let i = 0; i < forms.length; i++) {
      const term = termOf(forms[i]!, types[i]!);
      if (term === null) continue;
      kept.push(term);
      if (spans !== null && sentenceOfKept !== null) {
        while (sentence < spans.length - 1 && i > spans[sentence]![1]) sentence++;
        sentenceOfKept.push(sentence);
      }
    }
    if (sentenceOfKept === null) return kept;
    const unigrams = kept.length;
    for (let i = 1; i < unigrams; i++) {
      if (sentenceOfKept[i] === sentenceOfKept[i - 1]) kept.push(`${kept[i - 1]} ${kept[i]}`);
    }
    return kept;
  });
}

/**
 * tokenizer "pattern": scikit-learn's analyzer (lowercase, then re.findall of token_pattern, then
 * word n-grams over the whole document: each pair of adjacent tokens joined by one space, after
 * the unigrams). minLength and stem apply as with wink (stem to tokens with a letter); kinds do not
 * (a pattern has no kinds). Linear in the text: no run needs cutting.
 */
function patternTokenizer(settings: TokenSettings): Tokenizer {
  const { regex, group } = compileTokenPattern(settings.pattern ?? SKLEARN_TOKEN_PATTERN);
  const tokensOf = patternTokens(regex, group, settings.lowercase);
  const { minLength, ngrams } = settings;
  const stemmer = settings.stem ? winkStemmer() : null;
  const HAS_LETTER = /\p{L}/u;
  const tokenize = (text: string): string[] => {
    let kept = tokensOf(text);
    if (minLength > 1 || stemmer !== null) {
      const out: string[] = [];
      for (const t of kept) {
        if (minLength > 1 && codePoints(t) < minLength) continue;
        out.push(stemmer !== null && HAS_LETTER.test(t) ? stemmer(t) : t);
      }
      kept = out;
    }
    if (ngrams !== 2) return kept;
    const unigrams = kept.length;
    for (let i = 1; i < unigrams; i++) kept.push(`${kept[i - 1]} ${kept[i]}`);
    return kept;
  };
  return Object.defineProperty(tokenize, 'longRunsCut', { get: () => 0 }) as Tokenizer;
}

/** scikit-learn's default pattern, unigrams, no stemmer: word-run-coder.ts scans it without a regex. */
function isDefaultPatternUnigrams(settings: TokenSettings): boolean {
  if (settings.ngrams !== 1 || settings.stem) return false;
  const pattern = settings.pattern ?? SKLEARN_TOKEN_PATTERN;
  return pattern === SKLEARN_TOKEN_PATTERN || translatePythonPattern(pattern) === translatePythonPattern(SKLEARN_TOKEN_PATTERN);
}

function codePoints(s: string): number {
  let n = s.length;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff) n--;
  }
  return n;
}
