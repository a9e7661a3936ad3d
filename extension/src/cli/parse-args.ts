import { parseArgs as parseNodeArgs } from 'node:util';
import { CORPUS_FORMATS, type CorpusFormatName } from '../protocol';
import { schemaAt } from '../engine/config/settings-schema';
import { UserError } from '../engine/user-error';
import { closest } from '../closest-word';

export type OutputFormat = 'text' | 'json' | 'md' | 'html';

export interface CliOptions {
  command: 'review' | 'apply' | 'help' | 'version';
  file: string | null;
  text: string | null;
  label: string | null;
  config: string | null;
  noConfig: boolean;
  stopList: string | null;
  inputFormat: CorpusFormatName | null;
  format: OutputFormat;
  out: string | null;
  sample: number | null;
  k: number | null;
  seed: number | null;
  /** Let the labels decide about the grammar words (suggest.useLabels). */
  useLabels: boolean;
  failOnSuggestions: boolean;
  dryRun: boolean;
  quiet: boolean;
  /** Run the review as shard steps on this Dask scheduler ("local": a LocalCluster). */
  dask: string | null;
  workdir: string | null;
}

/**
 * A mistake in the command line itself: a UserError like any other (one type for the user's
 * mistakes), which the CLI prints with a pointer to --help and exit code 2.
 */
export class UsageError extends UserError {
  override name = 'UsageError';
}

type ValueKind =
  /** a file, field or other name: any non-empty text */
  | { kind: 'name' }
  | { kind: 'choice'; choices: readonly string[] }
  /** a whole number, bounded like the loudword.json key it stands for */
  | { kind: 'count'; setting: readonly string[] };

/** One command-line option: parsing, checking and the usage text all come from this entry. */
export interface OptionSpec {
  flag: string;
  short?: string;
  /** Where the value goes in CliOptions; a boolean option sets it to true. */
  field: keyof CliOptions;
  /** The value's placeholder in the usage ("FILE"); absent for a switch. */
  value?: string;
  check?: ValueKind;
  /** The loudword.json key this flag overrides ("sample.k"), for messages and Report.provenance. */
  setting?: string;
  help: string;
}

export const COMMANDS = [
  { name: 'review', args: '<corpus> [options]', help: 'review the corpus and print the findings' },
  { name: 'apply', args: '<corpus> [options]', help: 'review, then add the suggested terms to the stop list file' },
  { name: 'shard', args: '<step> [options]', help: 'one step of a review in shards: settings, list, count, plan, sums, finish, serve (`loudword shard --help`)' },
] as const;

export const OPTIONS: readonly OptionSpec[] = [
  { flag: 'text', setting: 'text', field: 'text', value: 'FIELD', check: { kind: 'name' }, help: 'column or key holding the text (default: the one with the longest texts)' },
  { flag: 'label', setting: 'label', field: 'label', value: 'FIELD', check: { kind: 'name' }, help: 'column or key with a class label; enables label precision@k' },
  { flag: 'config', field: 'config', value: 'FILE', check: { kind: 'name' }, help: 'loudword.json to read (default: the nearest one from the corpus folder up to the project root)' },
  { flag: 'no-config', field: 'noConfig', help: 'ignore any loudword.json' },
  { flag: 'stoplist', setting: 'stopList', field: 'stopList', value: 'FILE', check: { kind: 'name' }, help: 'the stop list file (default: "stopList" of the config, else stoplist.txt)' },
  { flag: 'input-format', setting: 'format', field: 'inputFormat', value: 'F', check: { kind: 'choice', choices: [...CORPUS_FORMATS] }, help: 'how to read the corpus (default: from the file name and content); files: a folder, each file one document (--label folder: its subfolder)' },
  { flag: 'format', field: 'format', value: 'F', check: { kind: 'choice', choices: ['text', 'json', 'md', 'html'] }, help: 'output; json prints the Report (default text)' },
  { flag: 'out', field: 'out', value: 'FILE', check: { kind: 'name' }, help: 'write the output to FILE instead of standard output' },
  { flag: 'sample', setting: 'sample.documents', field: 'sample', value: 'N', check: { kind: 'count', setting: ['sample', 'documents'] }, help: 'documents in the seeded sample for the neighbour measures' },
  { flag: 'k', setting: 'sample.k', field: 'k', value: 'N', check: { kind: 'count', setting: ['sample', 'k'] }, help: 'neighbours per document' },
  { flag: 'seed', setting: 'sample.seed', field: 'seed', value: 'N', check: { kind: 'count', setting: ['sample', 'seed'] }, help: 'sample seed' },
  { flag: 'use-labels', setting: 'suggest.useLabels', field: 'useLabels', help: 'with --label: let the labels decide whether the grammar words below half the documents are suggested; half the sample decides, the verdict is measured on the other half' },
  { flag: 'dask', field: 'dask', value: 'ADDR', check: { kind: 'name' }, help: 'run the review as shard steps on a Dask cluster (tcp://host:8786), or "local" for a LocalCluster here; the corpus is a glob or a folder of shards' },
  { flag: 'workdir', field: 'workdir', value: 'DIR', check: { kind: 'name' }, help: 'with --dask: the folder for the partial files, readable and writable by every worker (default: a new temporary folder)' },
  { flag: 'fail-on-suggestions', field: 'failOnSuggestions', help: 'exit with status 3 when terms are suggested (for CI)' },
  { flag: 'dry-run', field: 'dryRun', help: 'with apply: show what would be added, change nothing' },
  { flag: 'quiet', short: 'q', field: 'quiet', help: 'no progress on standard error' },
  { flag: 'help', short: 'h', field: 'command', help: 'this help' },
  { flag: 'version', short: 'v', field: 'command', help: 'the version' },
];

/** "sample.k" → "--k": the flag that overrides each loudword.json key. */
export const FLAG_OF_SETTING: Readonly<Record<string, string>> = Object.fromEntries(OPTIONS.filter((o) => o.setting !== undefined).map((o) => [o.setting!, `--${o.flag}`]));

/** The bounds and default of the loudword.json key a number flag stands for. */
export function countBounds(setting: readonly string[]): { min: number; max: number; default: number } {
  const node = schemaAt(setting);
  if (node?.minimum === undefined || node.maximum === undefined || typeof node.default !== 'number') throw new Error(`no bounds for ${setting.join('.')} in the schema`);
  return { min: node.minimum, max: node.maximum, default: node.default };
}

const DEFAULTS: CliOptions = {
  command: 'help',
  file: null,
  text: null,
  label: null,
  config: null,
  noConfig: false,
  stopList: null,
  inputFormat: null,
  format: 'text',
  out: null,
  sample: null,
  k: null,
  seed: null,
  useLabels: false,
  failOnSuggestions: false,
  dryRun: false,
  quiet: false,
  dask: null,
  workdir: null,
};

/** Parses the command line with node:util's parseArgs, driven by OPTIONS; throws UsageError. */
export function parseArgs(argv: readonly string[]): CliOptions {
  const config: Record<string, { type: 'string' | 'boolean'; short?: string }> = {};
  for (const o of OPTIONS) config[o.flag] = { type: o.value === undefined ? 'boolean' : 'string', ...(o.short !== undefined ? { short: o.short } : {}) };
  let parsed;
  try {
    parsed = parseNodeArgs({ args: [...argv], options: config, allowPositionals: true, strict: true });
  } catch (e) {
    throw new UsageError(wordParseError(e as Error & { code?: string }, argv));
  }
  const values = parsed.values as Record<string, string | boolean | undefined>;
  if (values.help === true) return { ...DEFAULTS, command: 'help' };
  if (values.version === true) return { ...DEFAULTS, command: 'version' };

  const o: CliOptions = { ...DEFAULTS };
  const set = o as unknown as Record<string, unknown>;
  for (const spec of OPTIONS) {
    const value = values[spec.flag];
    if (value === undefined || spec.field === 'command') continue;
    set[spec.field] = typeof value === 'boolean' ? value : checkValue(spec, value);
  }
  if (o.config !== null && o.noConfig) throw new UsageError('--config and --no-config contradict each other; give one');

  const [command, file, ...extra] = parsed.positionals;
  if (command === undefined) {
    if (argv.length > 0) throw new UsageError(`which command? Give ${COMMANDS.map((c) => c.name).join(' or ')} before the corpus`);
    return o;
  }
  if (command !== 'review' && command !== 'apply') {
    if (/[./\\]/.test(command)) throw new UsageError(`"${command}" is not a command; did you mean: loudword review ${command}?`);
    const near = closest(command, COMMANDS.map((c) => c.name));
    throw new UsageError(`unknown command "${command}"${near !== null ? `; did you mean ${near}?` : ` (use ${COMMANDS.map((c) => c.name).join(' or ')})`}`);
  }
  if (file === undefined) throw new UsageError(`${command} needs a corpus file`);
  if (file === '') throw new UsageError(`${command}: the corpus file name is empty`);
  if (file === '-') throw new UsageError(`${command}: standard input ("-") is not read; name a corpus file (a .gz file is read as it is, so save other streams to a file first)`);
  if (extra.length > 0) throw new UsageError(`unexpected argument "${extra[0]}" (one corpus file per run)`);
  if (o.dryRun && command !== 'apply') throw new UsageError('--dry-run only goes with apply');
  if (o.workdir !== null && o.dask === null) throw new UsageError('--workdir only goes with --dask');
  return { ...o, command, file };
}

function checkValue(spec: OptionSpec, value: string): string | number {
  const flag = `--${spec.flag}`;
  const check = spec.check ?? { kind: 'name' };
  switch (check.kind) {
    case 'name':
      if (value.trim() === '') throw new UsageError(`${flag}: needs a ${spec.value === 'FILE' ? 'file name' : 'field name'}, got ${JSON.stringify(value)}`);
      return value;
    case 'choice':
      if (!check.choices.includes(value)) {
        const near = closest(value, check.choices);
        throw new UsageError(`${flag}: must be one of ${check.choices.join(', ')}, got ${JSON.stringify(value)}${near !== null ? `; did you mean ${near}?` : ''}`);
      }
      return value;
    case 'count': {
      const { min, max } = countBounds(check.setting);
      // Digits only: "1e3", "0x10", " 5" and "" are refused rather than read as numbers.
      const n = /^\d{1,16}$/.test(value) ? Number(value) : NaN;
      if (!Number.isSafeInteger(n) || n < min || n > max) throw new UsageError(`${flag}: must be a whole number from ${min} to ${max}, got ${JSON.stringify(value)}`);
      return n;
    }
  }
}

function wordParseError(e: Error & { code?: string }, argv: readonly string[]): string {
  const quoted = /'([^']+)'/.exec(e.message)?.[1] ?? '';
  switch (e.code) {
    case 'ERR_PARSE_ARGS_UNKNOWN_OPTION': {
      const written = quoted.replace(/=.*$/, '');
      const flags = OPTIONS.map((o) => `--${o.flag}`);
      const near = written.startsWith('--') ? closest(written, flags) : null;
      return `unknown option ${written}${near !== null ? `; did you mean ${near}?` : ''}`;
    }
    case 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE': {
      const flag = /^(-{1,2}[\w-]+)/.exec(quoted)?.[1] ?? quoted;
      const long = OPTIONS.find((o) => `-${o.short}` === flag);
      const name = long !== undefined ? `--${long.flag}` : flag;
      const spec = OPTIONS.find((o) => `--${o.flag}` === name);
      if (spec?.value === undefined) return `${name} is a switch and takes no value`;
      // node:util refuses a value that looks like an option ("--out -x"); say how to pass one.
      const i = argv.findIndex((a) => a === name || a === flag);
      const next = i >= 0 ? argv[i + 1] : undefined;
      if (next !== undefined && next.startsWith('-')) return `${name} needs a value; to give one starting with "-", write ${name}=${next}`;
      return `${name} needs a value (${spec.value})`;
    }
    case 'ERR_PARSE_ARGS_UNEXPECTED_POSITIONAL':
      return e.message;
    default:
      return e.message;
  }
}

