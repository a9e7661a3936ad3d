import { formatCount } from './number-format';
import type { CorpusFormatName } from './protocol';

/**
 * How the CLI and the panel word what the reader skipped: rows of a table or lines, except in a
 * folder read one document per file, where a file is skipped and its reason already names it.
 */
export function skippedWording(format: CorpusFormatName | 'auto'): { unit: string; example: (s: { line: number; reason: string }) => string } {
  return format === 'files'
    ? { unit: 'file', example: (s) => s.reason }
    : { unit: 'row', example: (s) => `line ${formatCount(s.line)}: ${s.reason}` };
}
