import { COMMANDS, countBounds, OPTIONS, type OptionSpec } from './parse-args';

const INDENT = 2;
const COLUMN = 24;
const WIDTH = 100;

function left(o: OptionSpec): string {
  const names = o.short !== undefined ? `-${o.short}, --${o.flag}` : `--${o.flag}`;
  const value = o.check?.kind === 'choice' ? `${o.check.choices.join('|')}` : o.value;
  return value === undefined ? names : `${names} ${value}`;
}

function help(o: OptionSpec): string {
  if (o.check?.kind !== 'count') return o.help;
  const { min, max, default: d } = countBounds(o.check.setting);
  return `${o.help} (${min}–${max}, default ${d})`;
}

/** Wraps `text` into lines of at most WIDTH characters, starting and continuing at `column`. */
function wrap(first: string, text: string, column = COLUMN): string[] {
  const lines: string[] = [];
  let line = first.padEnd(column);
  if (first.length >= column) {
    lines.push(first);
    line = ' '.repeat(column);
  }
  let empty = true;
  for (const word of text.split(' ')) {
    if (!empty && line.length + 1 + word.length > WIDTH) {
      lines.push(line);
      line = ' '.repeat(column);
      empty = true;
    }
    line += (empty ? '' : ' ') + word;
    empty = false;
  }
  lines.push(line);
  return lines;
}

/** The usage text, built from the one table of options and commands in parse-args.ts. */
export function usageText(): string {
  const out = ['loudword — how healthy are the TF-IDF distances of a corpus, and which terms distort them', '', 'Usage:'];
  const commands = COMMANDS.map((c) => `${' '.repeat(INDENT)}loudword ${c.name} ${c.args}`);
  const column = Math.max(...commands.map((c) => c.length)) + 3;
  COMMANDS.forEach((c, i) => out.push(...wrap(commands[i]!, c.help, column)));
  out.push('', 'Corpus: CSV, TSV, JSON Lines (.jsonl/.ndjson), a JSON array of records (.json), plain text', 'with one document per line, Parquet; or a folder or glob of them.', '', 'Options:');
  for (const o of OPTIONS) out.push(...wrap(' '.repeat(INDENT) + left(o), help(o)));
  out.push(
    '',
    'Exit status: 0 done, 1 the input or config is wrong (the message names file and line),',
    '2 the command line is wrong, 3 suggestions exist and --fail-on-suggestions was given,',
    '4 an internal error (please report it).',
  );
  return out.join('\n') + '\n';
}

export const USAGE = usageText();
