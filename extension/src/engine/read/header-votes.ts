/**
 * Whether the first record of a table is a header, by the vote CPython's csv.Sniffer.has_header
 * takes (Lib/csv.py): over the next rows (up to 21, those with the first record's field count),
 * each column is either numeric in every row (a value Python's complex() reads) or text of one
 * length in every row, or out of the vote. A column whose first-record value breaks its type
 * (a name over numbers, or a name of another length over ids of one length) votes for a header;
 * one that fits it votes against. `> 0` is has_header's answer; `< 0` is evidence that the first
 * record is data (0: no column could tell).
 */
export function headerVotes(first: readonly string[], next: readonly (readonly string[])[]): number {
  const columns = first.length;
  // Per column: NUMERIC, a length (≥ 0), or OUT once two rows disagree.
  const types = new Array<number | null>(columns).fill(null);
  let checked = 0;
  for (const row of next) {
    if (checked > 20) break;
    checked++;
    if (row.length !== columns) continue;
    for (let c = 0; c < columns; c++) {
      if (types[c] === OUT) continue;
      const type = typeOf(row[c]!);
      if (types[c] === null) types[c] = type;
      else if (types[c] !== type) types[c] = OUT;
    }
  }
  let votes = 0;
  for (let c = 0; c < columns; c++) {
    const type = types[c]!;
    if (type === OUT) continue;
    // A column no row typed (no regular row): has_header calls None(value), a TypeError: a vote for a header.
    if (type === null) votes++;
    else votes += typeOf(first[c]!) === type ? -1 : 1;
  }
  return votes;
}

const NUMERIC = -1;
const OUT = -2;

/** NUMERIC for a value Python's complex() reads, else its length in code points. */
function typeOf(value: string): number {
  return readsAsComplex(value) ? NUMERIC : codePoints(value);
}

/** Whether Python's complex(value) reads `value` (rather than raising ValueError). */
export function readsAsComplex(value: string): boolean {
  return PYTHON_COMPLEX.test(value);
}

function codePoints(value: string): number {
  let n = 0;
  for (let i = 0; i < value.length; i++) {
    const c = value.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff && i + 1 < value.length) {
      const d = value.charCodeAt(i + 1);
      if (d >= 0xdc00 && d <= 0xdfff) i++;
    }
    n++;
  }
  return n;
}

/** A float as Python's float() and complex() read one: decimal digits of any script (Nd) with single underscores between them, a point, an exponent; inf, infinity, nan. */
const NUMBER = String.raw`(?:(?:\p{Nd}(?:_?\p{Nd})*(?:\.(?:\p{Nd}(?:_?\p{Nd})*)?)?|\.\p{Nd}(?:_?\p{Nd})*)(?:[eE][+-]?\p{Nd}(?:_?\p{Nd})*)?|[iI][nN][fF](?:[iI][nN][iI][tT][yY])?|[nN][aA][nN])`;
/** What Python's complex(str) accepts: a real, an imaginary part (j), or both, optionally in parentheses, blank around (Unicode white space, as JavaScript's \s with the u flag). */
const BODY = String.raw`(?:[+-]?${NUMBER}(?:[+-]${NUMBER}?[jJ])?|[+-]?${NUMBER}?[jJ])`;
const BLANK = String.raw`\s*`;
const PYTHON_COMPLEX = new RegExp(`^${BLANK}(?:${BODY}|\\(${BLANK}${BODY}${BLANK}\\))${BLANK}$`, 'u');
