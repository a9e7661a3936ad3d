import type { TokenKind } from '../../protocol';
import { tokenKindOf } from './token-kind';
import { winkStemmer } from './wink-instance';

/** The token options that decide what one wink token becomes (everything but n-grams). */
export interface TermOptions {
  lowercase: boolean;
  minLength: number;
  kinds: readonly TokenKind[];
  stem: boolean;
}

/** Kinds whose tokens are one sign by nature: a length floor would only ever delete them all. */
const LENGTH_EXEMPT: ReadonlySet<TokenKind> = new Set<TokenKind>(['emoji', 'emoticon', 'symbol', 'punctuation', 'currency']);

/**
 * The term one wink token becomes, or null when it is dropped: kind filter, length floor (code
 * points, before stemming; sign-like kinds exempt), Porter stem on words. `form` is the surface
 * text or, with `lowercase`, its lower-cased form (lowercase-forms.ts). Both tokenizer paths call this, so they cannot
 * disagree on what a token becomes.
 */
export function createTermOf(options: TermOptions): (form: string, winkType: string) => string | null {
  const { minLength } = options;
  const kinds: ReadonlySet<TokenKind> = new Set(options.kinds);
  const stemmer = options.stem ? winkStemmer() : null;
  return (form, winkType) => {
    // The lower-cased form has the same kind of letters and digits as the surface, which is all
    // tokenKindOf looks at for wink's "unk" tokens.
    const kind = tokenKindOf(winkType, form);
    if (kind === null || !kinds.has(kind)) return null;
    if (minLength > 0 && !LENGTH_EXEMPT.has(kind) && codePointLength(form) < minLength) return null;
    return stemmer !== null && kind === 'word' ? stemmer(form) : form;
  };
}

/** Length in code points; a surrogate pair counts once. */
function codePointLength(s: string): number {
  let n = s.length;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff) n--;
  }
  return n;
}
