// Where a word first occurs in a text file, as the 1-based line and column the editor's
// "go to line" takes: the cursor lands inside the word, as when a user clicks on it.
import { readFileSync } from 'node:fs';

export function firstWordPosition(file, word, { fromLine = 1 } = {}) {
  const lines = readFileSync(file, 'utf8').split('\n');
  const escaped = word.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const re = new RegExp(`(?<![\\p{L}\\p{N}_])${escaped}(?![\\p{L}\\p{N}_])`, 'iu');
  for (let i = fromLine - 1; i < lines.length; i++) {
    const m = re.exec(lines[i]);
    if (m) return { line: i + 1, column: m.index + 2 };
  }
  return null;
}
