import { UserError } from '../user-error';

/**
 * scikit-learn's default `token_pattern` (CountVectorizer / TfidfVectorizer): runs of two or more
 * Unicode word characters.
 */
export const SKLEARN_TOKEN_PATTERN = '(?u)\\b\\w\\w+\\b';

/**
 * Python's `\w` on str patterns: `str.isalnum()` or "_" (CPython _sre: SRE_UNI_IS_WORD), i.e.
 * letters (Lu Ll Lt Lm Lo), numbers (Nd Nl No, plus numeric ideographs, which are Lo) and the
 * underscore — and not combining marks, so "e\u0301" is the word "e" followed by a non-word mark.
 * Checked over every code point against Debian's python3 3.11 (Unicode 14.0): the same set, except
 * letters and numbers added in Unicode 15–17, which Node's newer tables know and Python 3.11 not.
 */
const WORD = '\\p{L}\\p{N}_';
/** Python's `\d` on str patterns: Unicode decimal digits (category Nd). */
const DIGIT = '\\p{Nd}';
const BOUNDARY = `(?:(?<=[${WORD}])(?![${WORD}])|(?<![${WORD}])(?=[${WORD}]))`;
const NOT_BOUNDARY = `(?:(?<=[${WORD}])(?=[${WORD}])|(?<![${WORD}])(?![${WORD}]))`;

/**
 * A token pattern in scikit-learn's (Python `re`) syntax as a JavaScript regular expression with
 * the `u` flag: `\w \W \d \D \b \B` get their Python Unicode meanings (JavaScript's are ASCII),
 * a leading `(?u)` is dropped (Unicode is Python 3's default). Everything else must be syntax the
 * two languages share (classes, quantifiers, groups, alternation, lookarounds), which covers the
 * token patterns people write; a pattern JavaScript cannot compile is a UserError naming the setting.
 */
export function translatePythonPattern(pattern: string): string {
  let source = pattern.startsWith('(?u)') ? pattern.slice(4) : pattern;
  if (/^\(\?[aiLmsux]+\)/.test(source)) {
    throw new UserError(`tokens.pattern: inline flags ${source.match(/^\(\?[a-zA-Z]+\)/)![0]} are not supported (only (?u), which is the default)`);
  }
  let out = '';
  let inClass = false;
  for (let i = 0; i < source.length; i++) {
    const c = source[i]!;
    if (c === '\\' && i + 1 < source.length) {
      const e = source[i + 1]!;
      i++;
      if (e === 'w') out += inClass ? WORD : `[${WORD}]`;
      else if (e === 'W') {
        if (inClass) throw new UserError('tokens.pattern: \\W inside [...] is not supported; write [^...] instead');
        out += `[^${WORD}]`;
      } else if (e === 'd') out += inClass ? DIGIT : `[${DIGIT}]`;
      else if (e === 'D') {
        if (inClass) throw new UserError('tokens.pattern: \\D inside [...] is not supported; write [^...] instead');
        out += `[^${DIGIT}]`;
      } else if (e === 'b' && !inClass) out += BOUNDARY;
      else if (e === 'B' && !inClass) out += NOT_BOUNDARY;
      else out += `\\${e}`;
      continue;
    }
    if (c === '[' && !inClass) {
      inClass = true;
      out += c;
      // A "]" right after "[" or "[^" is a literal in Python.
      if (source[i + 1] === '^') {
        out += '^';
        i++;
      }
      if (source[i + 1] === ']') {
        out += '\\]';
        i++;
      }
      continue;
    }
    if (c === ']' && inClass) inClass = false;
    out += c;
  }
  return out;
}

/** Compiles a Python-syntax token pattern; the number of capturing groups decides what a token is. */
export function compileTokenPattern(pattern: string): { regex: RegExp; group: 0 | 1 } {
  const source = translatePythonPattern(pattern);
  let regex: RegExp;
  try {
    regex = new RegExp(source, 'gu');
  } catch (e) {
    throw new UserError(`tokens.pattern: not a regular expression this tool can run (${e instanceof Error ? e.message : String(e)})`);
  }
  // As scikit-learn: with one capturing group the group is the token; more is an error.
  const groups = new RegExp(`${source}|`, 'u').exec('')!.length - 1;
  if (groups > 1) throw new UserError(`tokens.pattern: has ${groups} capturing groups; at most one is allowed (as in scikit-learn)`);
  return { regex, group: groups === 1 ? 1 : 0 };
}

/**
 * The tokens of `text` as scikit-learn's analyzer makes them before n-grams: lowercase first
 * (str.lower() and String.prototype.toLowerCase agree, final sigma included), then every
 * non-overlapping match of the pattern, left to right (re.findall). Empty matches are skipped
 * (scikit-learn would keep "" as a token; no useful pattern produces one).
 */
export function patternTokens(regex: RegExp, group: 0 | 1, lowercase: boolean): (text: string) => string[] {
  return (text: string): string[] => {
    const s = lowercase ? text.toLowerCase() : text;
    const out: string[] = [];
    regex.lastIndex = 0;
    let m: RegExpExecArray | null;
    while ((m = regex.exec(s)) !== null) {
      const token = m[group];
      if (m[0].length === 0) {
        regex.lastIndex++;
        continue;
      }
      if (token !== undefined && token !== '') out.push(token);
    }
    return out;
  };
}
