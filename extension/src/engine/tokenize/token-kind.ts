import { TOKEN_KINDS, type TokenKind } from '../../protocol';

/** wink-nlp types that carry the same name as one of our kinds. */
const SAME_NAME: ReadonlySet<string> = new Set<TokenKind>(TOKEN_KINDS);

const HAS_LETTER = /[\p{L}\p{M}]/u;
const HAS_DIGIT = /\p{N}/u;

/**
 * Our kind for a token of wink-nlp type `winkType` (its.type), or null for whitespace.
 * wink's English model has a few internal categories beyond ours: "decade" ("2020s", "'90s")
 * counts as a number; "alpha" and "wordRP" as words; "apos" as punctuation; "tabCRLF" is
 * whitespace and never kept. "unk" is what wink gives to every script it has no rules for —
 * Cyrillic, Greek, Arabic, Hebrew, Devanagari, CJK — and to rare signs ("½", "≠", "←"); so an unk
 * token with a letter is a word, one with a digit a number, anything else a symbol. Without
 * this, a corpus in another script would silently lose all its words.
 */
export function tokenKindOf(winkType: string, value: string): TokenKind | null {
  if (SAME_NAME.has(winkType)) return winkType as TokenKind;
  switch (winkType) {
    case 'decade':
      return 'number';
    case 'alpha':
    case 'wordRP':
      return 'word';
    case 'apos':
      return 'punctuation';
    case 'tabCRLF':
      return null;
    default:
      if (HAS_LETTER.test(value)) return 'word';
      if (HAS_DIGIT.test(value)) return 'number';
      return value.trim() === '' ? null : 'symbol';
  }
}
