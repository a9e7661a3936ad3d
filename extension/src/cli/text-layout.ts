/** Terminal text rules shared by the CLI's summaries: counted nouns and a line width. */
import { formatCount } from '../number-format';

export const LINE_WIDTH = 100;

/** "1 term", "2 terms", "22,919 terms"; `plural` for irregular nouns ("1 entry never occurs"). */
export function count(n: number, singular: string, plural = `${singular}s`): string {
  return `${formatCount(n)} ${n === 1 ? singular : plural}`;
}

/** The verb after a count: "1 never occurs", "3 never occur". */
export function verb(n: number, singular: string, plural: string): string {
  return n === 1 ? singular : plural;
}

/**
 * Lines of at most `width` characters (code points): a longer line breaks at its last space that
 * fits and continues four spaces deeper than its own indent; a word longer than the room left
 * (a URL) is cut where it must be.
 */
export function wrapLines(lines: readonly string[], width = LINE_WIDTH): string[] {
  const out: string[] = [];
  for (const line of lines) {
    let rest = [...line];
    if (rest.length <= width) {
      out.push(line);
      continue;
    }
    const indent = ' '.repeat(Math.min(/^ */.exec(line)![0].length + 4, width / 2));
    let first = true;
    while (rest.length > (first ? width : width - indent.length)) {
      const room = first ? width : width - indent.length;
      let cut = rest.lastIndexOf(' ', room);
      const minCut = first ? indent.length - 3 : 1;
      if (cut < minCut) cut = room;
      out.push((first ? '' : indent) + rest.slice(0, cut).join('').trimEnd());
      rest = rest.slice(rest[cut] === ' ' ? cut + 1 : cut);
      while (rest[0] === ' ') rest.shift();
      first = false;
    }
    if (rest.length > 0) out.push(indent + rest.join(''));
  }
  return out;
}
