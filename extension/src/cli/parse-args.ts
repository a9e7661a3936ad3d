import type { CorpusFormatName } from '../protocol';

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
  failOnSuggestions: boolean;
  dryRun: boolean;
  quiet: boolean;
}

/** A mistake in the command line itself: the CLI prints it with the usage and exits 2. */
export class UsageError extends Error {
  override name = 'UsageError';
}

const valueOptions = new Set(['--text', '--label', '--config', '--stoplist', '--input-format', '--format', '--out', '--sample', '--k', '--seed']);

export function parseArgs(argv: readonly string[]): CliOptions {
  const o: CliOptions = {
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
    failOnSuggestions: false,
    dryRun: false,
    quiet: false,
  };
  const positional: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    let arg = argv[i]!;
    let value: string | undefined;
    const eq = arg.indexOf('=');
    if (arg.startsWith('--') && eq > 0) {
      value = arg.slice(eq + 1);
      arg = arg.slice(0, eq);
    }
    if (valueOptions.has(arg) && value === undefined) {
      value = argv[++i];
      if (value === undefined) throw new UsageError(`${arg} needs a value`);
    }
    switch (arg) {
      case '-h':
      case '--help':
        return { ...o, command: 'help' };
      case '-v':
      case '--version':
        return { ...o, command: 'version' };
      case '--text': o.text = value!; break;
      case '--label': o.label = value!; break;
      case '--config': o.config = value!; break;
      case '--no-config': o.noConfig = true; break;
      case '--stoplist': o.stopList = value!; break;
      case '--input-format': o.inputFormat = oneOf(arg, value!, ['csv', 'tsv', 'jsonl', 'text'] as const); break;
      case '--format': o.format = oneOf(arg, value!, ['text', 'json', 'md', 'html'] as const); break;
      case '--out': o.out = value!; break;
      case '--sample': o.sample = wholeNumber(arg, value!, 10); break;
      case '--k': o.k = wholeNumber(arg, value!, 1); break;
      case '--seed': o.seed = wholeNumber(arg, value!, 0); break;
      case '--fail-on-suggestions': o.failOnSuggestions = true; break;
      case '--dry-run': o.dryRun = true; break;
      case '-q':
      case '--quiet': o.quiet = true; break;
      default:
        if (arg.startsWith('-') && arg !== '-') throw new UsageError(`unknown option ${arg}`);
        positional.push(arg);
    }
  }
  const [command, file, ...extra] = positional;
  if (command === undefined) return o;
  if (command !== 'review' && command !== 'apply') throw new UsageError(`unknown command "${command}" (use review or apply)`);
  if (file === undefined) throw new UsageError(`${command} needs a corpus file`);
  if (extra.length > 0) throw new UsageError(`unexpected argument "${extra[0]}"`);
  return { ...o, command, file };
}

function oneOf<T extends string>(option: string, value: string, allowed: readonly T[]): T {
  if ((allowed as readonly string[]).includes(value)) return value as T;
  throw new UsageError(`${option} must be one of ${allowed.join(', ')} (got "${value}")`);
}

function wholeNumber(option: string, value: string, min: number): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n < min) throw new UsageError(`${option} must be a whole number ≥ ${min} (got "${value}")`);
  return n;
}
