import { fmix32 } from '../random/place-hash';
import { FNV_OFFSET, FNV_PRIME } from '../tokenize/chunk-table';

/**
 * Lines that recur across documents of several lines: signatures ("Sent from my iPhone"),
 * disclaimers, form footers, licence headers. A repeated line adds the same similarity to every
 * pair of documents that holds it, whatever they say, and a stop list cannot remove it: it stops
 * words everywhere, not a line where it stands. The Report names such lines (review/boilerplate-note.ts).
 *
 * Counted on a seeded share of the documents: those whose number's hash is a multiple of a
 * stride, which doubles whenever more than MAX_CHECKED documents are kept (those off the new
 * stride are let go), so the check costs the same at a million documents as at ten thousand. Of a long
 * document only its two ends are read (EDGE_CHARS each), where boilerplate stands: reading every
 * line of Debian's documentation tree (changelogs of megabytes) added 8.5 s to a 17 s review.
 * Lines are kept as hashes; a line's text is copied once a second document holds it.
 */
export interface RepeatedLines {
  /** Documents checked (every one at the stride, of one line or more). */
  checked: number;
  /** The lines held by at least two of the checked documents (the MAX_LINES_KEPT most held), with how many hold each. */
  lines: Array<[line: string, documents: number]>;
}

/** Most lines a count hands on (a shard's partial holds them). */
const MAX_LINES_KEPT = 200;

/** Most documents kept for the count at once. */
const MAX_CHECKED = 4000;

/** Characters read at each end of a document. */
const EDGE_CHARS = 4096;

/** Lines kept from each end of a document. */
const LINES_PER_EDGE = 20;

/** A line counts when it has at least this many words or characters: shorter ones ("Hi,", "Thanks") are greetings a stop list sees as words. */
const MIN_WORDS = 4;
const MIN_CHARS = 24;

/** Characters of a line that are hashed and kept; a longer line is told apart by its start. */
const MAX_LINE_CHARS = 200;

export class RepeatedLineCounter {
  private stride = 1;
  /** The documents at the stride so far, each with its lines' hashes (none for a document of one line). */
  private kept: Array<{ doc: number; hashes: Uint32Array }> = [];
  /** Per line hash: how many kept documents hold it. */
  private counts = new Map<number, number>();
  /** Per line hash held by two documents or more: its text. */
  private readonly texts = new Map<number, string>();

  /** Document number `doc` (0-based) with its text. */
  add(doc: number, text: string): void {
    if (!atStride(doc, this.stride)) return;
    const found = text.indexOf('\n') < 0 ? [] : edgeLines(text);
    const hashes = new Uint32Array(found.length);
    found.forEach(({ hash, start, end }, i) => {
      hashes[i] = hash;
      const count = (this.counts.get(hash) ?? 0) + 1;
      this.counts.set(hash, count);
      if (count === 2 && !this.texts.has(hash)) this.texts.set(hash, copyOf(text.slice(start, end)));
    });
    this.kept.push({ doc, hashes });
    if (this.kept.length > MAX_CHECKED) this.doubleStride();
  }

  result(): RepeatedLines {
    const lines: Array<[string, number]> = [];
    for (const [hash, count] of this.counts) if (count >= 2) lines.push([this.texts.get(hash)!, count]);
    lines.sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0));
    lines.length = Math.min(lines.length, MAX_LINES_KEPT);
    return { checked: this.kept.length, lines };
  }

  /** Keeps the documents at twice the stride and counts their lines again (texts already copied are kept). */
  private doubleStride(): void {
    this.stride *= 2;
    const stride = this.stride;
    this.kept = this.kept.filter((k) => atStride(k.doc, stride));
    this.counts = new Map();
    for (const { hashes } of this.kept) for (const hash of hashes) this.counts.set(hash, (this.counts.get(hash) ?? 0) + 1);
  }
}

/**
 * Whether document `doc` is among those checked at `stride` (a power of two): its number's hash
 * is a multiple of the stride, so each doubling keeps half of the documents kept before, and a
 * file whose every tenth document carries a footer is not read at multiples of 8 (every 40th).
 */
function atStride(doc: number, stride: number): boolean {
  return (fmix32(doc >>> 0) & (stride - 1)) === 0;
}

/**
 * The distinct lines long enough to count in a document of two lines or more, by hash, with their
 * trimmed bounds in `text`: all of them in a document of at most 2·EDGE_CHARS characters, else
 * the first LINES_PER_EDGE of its head and the last LINES_PER_EDGE of its tail. One line of text
 * is the whole document: a repeat of it is a duplicate, which the Report counts apart.
 */
function edgeLines(text: string): Array<{ hash: number; start: number; end: number }> {
  if (text.length <= 2 * EDGE_CHARS) {
    const { lines, nonBlank } = linesIn(text, 0, text.length);
    return nonBlank < 2 ? [] : distinct(lines);
  }
  const head = linesIn(text, 0, EDGE_CHARS).lines.slice(0, LINES_PER_EDGE);
  // The tail from the first line break in it, so that no line is read cut.
  const from = text.indexOf('\n', text.length - EDGE_CHARS);
  const tail = from < 0 ? [] : linesIn(text, from + 1, text.length).lines.slice(-LINES_PER_EDGE);
  return distinct([...head, ...tail]);
}

/** The lines of text[from, to) long enough to count (cut to MAX_LINE_CHARS), and how many lines are not blank. */
function linesIn(text: string, from: number, to: number): { lines: Array<{ hash: number; start: number; end: number }>; nonBlank: number } {
  const lines: Array<{ hash: number; start: number; end: number }> = [];
  let nonBlank = 0;
  let at = from;
  while (at < to) {
    let stop = text.indexOf('\n', at);
    if (stop < 0 || stop > to) stop = to;
    const line = trimmed(text, at, stop);
    at = stop + 1;
    if (line === null) continue;
    nonBlank++;
    if (!longEnough(text, line.start, line.end)) continue;
    const end = Math.min(line.end, line.start + MAX_LINE_CHARS);
    lines.push({ hash: hashOf(text, line.start, end), start: line.start, end });
  }
  return { lines, nonBlank };
}

/** The first line of each hash. */
function distinct<L extends { hash: number }>(lines: readonly L[]): L[] {
  const seen = new Set<number>();
  const out: L[] = [];
  for (const line of lines) {
    if (seen.has(line.hash)) continue;
    seen.add(line.hash);
    out.push(line);
  }
  return out;
}

/** [start, end) of text[from, to) without the white space at its ends; null when blank. */
function trimmed(text: string, from: number, to: number): { start: number; end: number } | null {
  let start = from;
  let end = to;
  while (start < end && isSpace(text.charCodeAt(start))) start++;
  while (end > start && isSpace(text.charCodeAt(end - 1))) end--;
  return start === end ? null : { start, end };
}

function isSpace(c: number): boolean {
  return c === 0x20 || c === 0x09 || c === 0x0d || c === 0x0b || c === 0x0c || c === 0xa0;
}

/** At least MIN_CHARS characters, or MIN_WORDS words (runs between spaces). */
function longEnough(text: string, start: number, end: number): boolean {
  if (end - start >= MIN_CHARS) return true;
  let words = 1;
  for (let i = start + 1; i < end; i++) if (isSpace(text.charCodeAt(i)) && !isSpace(text.charCodeAt(i - 1))) words++;
  return words >= MIN_WORDS;
}

/** FNV-1a over the code units of text[start, end), as the tokenizers' chunk table hashes. */
function hashOf(text: string, start: number, end: number): number {
  let h = FNV_OFFSET;
  for (let i = start; i < end; i++) h = Math.imul(h ^ text.charCodeAt(i), FNV_PRIME);
  return h >>> 0;
}

/** A flat copy of a string, not a view of the document it was cut from. */
function copyOf(s: string): string {
  return Buffer.from(s, 'utf16le').toString('utf16le');
}

/**
 * Counts of several parts (files, shards) added up, as of one corpus. A line is named by a part
 * only when two of its documents hold it, so a line held once in each of many files goes uncounted.
 */
export function mergeRepeatedLines(parts: readonly RepeatedLines[]): RepeatedLines {
  const counts = new Map<string, number>();
  let checked = 0;
  for (const p of parts) {
    checked += p.checked;
    for (const [line, n] of p.lines) counts.set(line, (counts.get(line) ?? 0) + n);
  }
  return { checked, lines: [...counts] };
}
