import { existsSync, readFileSync } from 'node:fs';
import type { CorpusRow } from '../../extension/src/engine/read/corpus-source';

/** Debian's `fortunes` package: '%'-separated sayings. Source: Debian package fortunes. */
export const FORTUNES_FILE = '/usr/share/games/fortunes/fortunes';

/**
 * The first `limit` fortunes of FORTUNES_FILE as rows, with the 1-based line each starts on.
 * Throws with an install hint when the package is missing.
 */
export function readFortunes(limit: number): CorpusRow[] {
  if (!existsSync(FORTUNES_FILE)) {
    throw new Error(`${FORTUNES_FILE} is missing: install Debian's "fortunes" package (apt-get install fortunes).`);
  }
  const lines = readFileSync(FORTUNES_FILE, 'utf8').split('\n');
  const rows: CorpusRow[] = [];
  let text: string[] = [];
  let start = 1;
  for (let i = 0; i < lines.length && rows.length < limit; i++) {
    if (lines[i] === '%') {
      if (text.join('').trim() !== '') rows.push({ text: text.join('\n'), label: null, line: start });
      text = [];
      start = i + 2;
    } else {
      text.push(lines[i]!);
    }
  }
  if (rows.length < limit && text.join('').trim() !== '') rows.push({ text: text.join('\n'), label: null, line: start });
  return rows;
}
