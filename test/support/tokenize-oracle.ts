import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import * as path from 'node:path';
import Papa from 'papaparse';
import type { WinkMethods } from 'wink-nlp';
import { TOKEN_KINDS, type TokenKind } from '../../extension/src/protocol';
import { DEFAULT_SETTINGS } from '../../extension/src/engine/config/default-settings';
import { createTokenizer, type TokenSettings } from '../../extension/src/engine/tokenize/create-tokenizer';
import { freshWinkInstance } from '../../extension/src/engine/tokenize/wink-instance';
import { FORTUNES_DIR, fortunesAvailable } from '../corpora/fortunes';

// The oracle for the chunk-cached tokenizer: each whole document through wink-nlp (the plain
// path). wink's output depends on its lexeme cache (what it has tokenised before), so the two
// paths run on two fresh wink instances fed the same documents in the same order.

export const ALL_KINDS: readonly TokenKind[] = TOKEN_KINDS;

/** Every combination of the options that change what a token becomes (24 variants). */
export const VARIANTS: TokenSettings[] = [];
for (const lowercase of [true, false]) {
  for (const stem of [false, true]) {
    for (const minLength of [1, 2, 3]) {
      for (const kinds of [DEFAULT_SETTINGS.tokens.kinds, ALL_KINDS]) VARIANTS.push({ lowercase, stem, minLength, kinds: [...kinds], ngrams: 1 });
    }
  }
}

/** Two opposite corners of VARIANTS: the defaults, and case kept + stemming + every kind + length 1. */
export const CORNER_VARIANTS: TokenSettings[] = [
  { ...DEFAULT_SETTINGS.tokens, kinds: [...DEFAULT_SETTINGS.tokens.kinds], ngrams: 1 },
  { lowercase: false, stem: true, minLength: 1, kinds: [...ALL_KINDS], ngrams: 1 },
];

export const describeVariant = (v: TokenSettings): string =>
  `lowercase ${v.lowercase}, stem ${v.stem}, minLength ${v.minLength}, ${v.kinds.length === ALL_KINDS.length ? 'all kinds' : 'default kinds'}`;

export interface Oracle {
  /** Both paths for `settings`; `winkChars` counts the text the cached path sent to wink. */
  pair(settings: TokenSettings): { plain: (t: string) => string[]; cached: (t: string) => string[]; winkChars: () => number };
  /** Runs both paths over `docs` in order; fails on the first document where they differ. */
  assertSameOverCorpus(settings: TokenSettings, docs: readonly string[]): { winkShare: number };
}

/**
 * One wink instance for each path, shared by every check that uses this oracle and fed the same
 * documents in the same order (plain path on one, cached path on the other), so their lexeme
 * caches stay in step; the checks must therefore run in file order. Fresh instances per check
 * would be cleaner but wink-eng-lite-web-model grows with each instance loaded (RangeError after
 * a few dozen), so each test file makes one oracle.
 */
export function makeOracle(): Oracle {
  let shared: { plainNlp: WinkMethods; cachedNlp: WinkMethods; chars: number } | null = null;
  const pair: Oracle['pair'] = (settings) => {
    if (shared === null) {
      const nlp = freshWinkInstance('tokens');
      const s = { plainNlp: freshWinkInstance('tokens'), cachedNlp: nlp, chars: 0 };
      s.cachedNlp = { ...nlp, readDoc: (text: string) => ((s.chars += text.length), nlp.readDoc(text)) };
      shared = s;
    }
    const s = shared;
    const plain = createTokenizer(settings, { nlp: s.plainNlp, chunkCache: false });
    const cached = createTokenizer(settings, { nlp: s.cachedNlp });
    return { plain, cached, winkChars: () => s.chars };
  };
  const assertSameOverCorpus: Oracle['assertSameOverCorpus'] = (settings, docs) => {
    const { plain, cached, winkChars } = pair(settings);
    let secondHalfChars = 0;
    let secondHalfWink = 0;
    for (let d = 0; d < docs.length; d++) {
      const before = winkChars();
      const got = cached(docs[d]!);
      const want = plain(docs[d]!);
      if (d >= docs.length / 2) {
        secondHalfChars += docs[d]!.length;
        secondHalfWink += winkChars() - before;
      }
      if (got.length !== want.length || got.some((t, i) => t !== want[i])) {
        assert.deepEqual(got, want, `document ${d} (${describeVariant(settings)}): ${JSON.stringify(docs[d]!.slice(0, 300))}`);
      }
    }
    return { winkShare: secondHalfWink / Math.max(1, secondHalfChars) };
  };
  return { pair, assertSameOverCorpus };
}

/**
 * Every saying of every category file, raw (tabs, newlines and layout kept), entries separated
 * by lines holding a single '%'. Source: the Debian package `fortunes` (fortune-mod data files).
 * `npm test` installs the package first (scripts/ensure-system-packages.sh), so a missing
 * package is a failure, not a skip.
 */
export function readAllFortunes(): string[] {
  if (!fortunesAvailable()) throw new Error(`${FORTUNES_DIR} is missing: run scripts/ensure-system-packages.sh (Debian package "fortunes")`);
  const out: string[] = [];
  for (const f of readdirSync(FORTUNES_DIR).sort()) {
    if (f.endsWith('.dat') || f.endsWith('.u8')) continue;
    const file = path.join(FORTUNES_DIR, f);
    if (!statSync(file).isFile()) continue;
    for (const s of readFileSync(file, 'latin1').split(/\r?\n%\r?\n/)) if (s.trim() !== '' && s !== '%') out.push(s);
  }
  return out;
}

export function readCsvColumn(file: string, column: string): string[] {
  const parsed = Papa.parse<Record<string, string>>(readFileSync(file, 'utf8'), { header: true, skipEmptyLines: true });
  return parsed.data.map((r) => r[column]).filter((t): t is string => typeof t === 'string');
}

const ROOT = path.join(__dirname, '..', '..');
export const TICKETS = path.join(ROOT, 'samples', 'support-tickets.csv');

/**
 * The seeded benchmark corpus of `size` documents (test/bench/generate-corpus.mjs), generated
 * here when it is not cached yet (10k: ~2 s), so no check waits for a file nobody makes.
 */
export function benchCorpus(size: '10k' | '100k', seed = 1): string {
  const out = execFileSync(process.execPath, [path.join(ROOT, 'test', 'bench', 'generate-corpus.mjs'), '--size', size, '--seed', String(seed)], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  const last = out.trim().split('\n').pop()!;
  return (JSON.parse(last) as { file: string }).file;
}
