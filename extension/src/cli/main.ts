import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import type { Report } from '../protocol';
import { isUserError } from '../engine/user-error';
import { startReview } from '../engine/review/start-review';
import { appendTerms, readStopList, replaceStopList } from '../engine/stoplist/stop-list-file';
import { ADDED_TERMS_HEADING } from '../engine/stoplist/add-terms-to-stop-list';
import { suggestionLines } from '../engine/terms/stop-list-spelling';
import { loadWebviewAssets, renderStandaloneReport } from '../html/standalone-report';
import { LOUDWORD_VERSION } from '../engine/review/version';
import { formatMarkdown } from './format-markdown';
import { formatText } from './format-text';
import { parseArgs, UsageError, type CliOptions } from './parse-args';
import { checkWriteTarget, PathArgumentError, type NamedInput } from './output-path';
import { UserError } from '../engine/user-error';
import { lineOfKey } from '../engine/config/confine-to-workspace';
import { USAGE } from './usage';
import { progressLine, type ProgressLine } from './progress-line';
import { count, wrapLines } from './text-layout';
import { verdictCaution } from '../verdict-wording';
import { escapeControls, escapeJsonControls } from './terminal-text';
import { describeSystemError, guardStdout, writeOutputFile, writeStdout } from './write-output';
import { reviewInputOf } from './review-input-of';
import { runShardCommand } from './shard-command';
import { reviewWithDask } from './review-with-dask';

const EXIT = { ok: 0, input: 1, usage: 2, suggestions: 3, internal: 4 } as const;

/** The progress line on a terminal, wiped before any message (cli/progress-line.ts). */
let progress: ProgressLine | null = null;

/** The corpus being reviewed, for a message about an error that names no file. */
let currentCorpus: string | null = null;

/** Everything printed goes through here: control characters from the corpus are shown escaped. */
function say(text: string): Promise<void> {
  return writeStdout(escapeControls(text));
}

async function main(argv: readonly string[]): Promise<number> {
  guardStdout();
  if (argv[0] === 'shard') return runShardCommand(argv.slice(1));
  const options = parseArgs(argv);
  if (options.command === 'help') {
    await say(USAGE);
    return EXIT.ok;
  }
  if (options.command === 'version') {
    await say(`${LOUDWORD_VERSION}\n`);
    return EXIT.ok;
  }
  const input = reviewInputOf(options);
  currentCorpus = input.file;
  // Paths typed on the command line are checked before the (long) review starts.
  const inputs: NamedInput[] = [
    { role: 'the corpus', file: input.file },
    { role: 'the config file', file: input.configPath ?? null },
  ];
  if (options.out !== null) checkWriteTarget('--out', options.out, [...inputs, { role: 'the stop list', file: options.stopList }]);
  if (options.command === 'apply' && options.stopList !== null) checkWriteTarget('--stoplist', options.stopList, inputs);
  progress = progressLine(process.stderr, !options.quiet);
  const report = options.dask !== null ? await reviewWithDask(options, options.dask) : (await startReview(input, { onStage: (stage) => progress?.stage(escapeControls(stage)), reportOnly: true })).report;
  progress.clear();
  if (options.command === 'apply') return applySuggestions(report, options, inputs);

  if (options.out !== null) checkWriteTarget('--out', options.out, [...inputs, { role: 'the stop list', file: report.stopList.file }]);
  await emit(render(report, options.format), options.out);
  if (options.out !== null && !options.quiet) process.stderr.write(escapeControls(`loudword: wrote ${options.out}\n`));
  return options.failOnSuggestions && report.suggestions.length > 0 ? EXIT.suggestions : EXIT.ok;
}

/** The report in `format`; text and Markdown with control characters escaped, JSON with C1/bidi as \u escapes. */
function render(report: Report, format: CliOptions['format']): string {
  switch (format) {
    case 'json':
      return escapeJsonControls(JSON.stringify(report, null, 2)) + '\n';
    case 'md':
      return escapeControls(formatMarkdown(report));
    case 'html':
      return renderStandaloneReport(report, loadWebviewAssets(__dirname));
    case 'text':
      return escapeControls(formatText(report));
  }
}

async function emit(text: string, out: string | null): Promise<void> {
  if (out === null) await writeStdout(text);
  else await writeOutputFile(out, text);
}

async function applySuggestions(report: Report, o: CliOptions, inputs: readonly NamedInput[]): Promise<number> {
  const file = report.stopList.file;
  if (file === null) throw new UsageError('no stop list file is configured; give --stoplist FILE');
  checkStopListTarget(file, o, inputs);
  if (report.suggestions.length === 0) {
    await say(`No stop terms suggested; ${file} is unchanged.\n`);
    return EXIT.ok;
  }
  // Read again now, just before writing: the bytes the rename will be checked against.
  const list = await readStopList(file);
  // Under the same '# added by Loudword' line the editor's quick fixes write (one engine function).
  // Each in its plain spelling ("because", not the stem "becaus"): the line other pipelines match too.
  const result = appendTerms(list, suggestionLines(report), { heading: ADDED_TERMS_HEADING });
  const leftOut = result.unrepresentable.length > 0
    ? `Left out ${count(result.unrepresentable.length, 'term')} that ${file} (${list.encoding}) cannot hold: ${result.unrepresentable.join(', ')}\n`
    : '';
  if (result.added.length === 0) {
    await say(leftOut || `${report.suggestions.length === 1 ? 'The suggestion is' : `All ${report.suggestions.length} suggestions are`} already in ${file}.\n`);
    return EXIT.ok;
  }
  if (!o.dryRun) await replaceStopList(list, result.bytes);
  const verb = o.dryRun ? 'Would add' : 'Added';
  const pieceSet = new Set(Object.keys(report.suggestionPieces ?? {}));
  const pieces = result.added.filter((l) => pieceSet.has(l)).length;
  const what = count(result.added.length - pieces, 'term') + (pieces === 0 ? '' : ` and ${count(pieces, 'piece')} of contractions for scikit-learn's tokens`);
  const lines = [`${verb} ${what} to ${file}: ${result.added.join(', ')}`];
  if (leftOut !== '') lines.push(leftOut.trimEnd());
  // apply does what it was told, but it is the moment to repeat a verdict that the list hurts,
  // with the way back: the lines it wrote are the file's last ones.
  const caution = verdictCaution(report.verdict);
  if (caution !== null) {
    lines.push(o.dryRun
      ? `Note: ${caution}.`
      : `Note: ${caution}; to undo, delete the last ${count(result.newLines.length, 'line')} of ${file}, just added.`);
  }
  await say(wrapLines(lines).join('\n') + '\n');
  if (o.dryRun) {
    // The lines exactly as they would be written, and where: nothing has changed yet.
    const where = result.afterLine === 0 ? 'as its first lines' : `after line ${result.afterLine}`;
    await say(`Lines that would be appended to ${file} ${where}:\n${result.newLines.map((l) => `  + ${l}`).join('\n')}\n`);
  }
  return EXIT.ok;
}

/** The stop list apply writes is never the corpus or the config, wherever it was named. */
function checkStopListTarget(file: string, o: CliOptions, inputs: readonly NamedInput[]): void {
  try {
    checkWriteTarget(o.stopList !== null ? '--stoplist' : 'the stop list', file, inputs);
  } catch (e) {
    const config = inputs.find((i) => i.role === 'the config file')?.file ?? null;
    if (!(e instanceof PathArgumentError) || o.stopList !== null || config === null) throw e;
    throw new UserError(`stopList "${path.relative(path.dirname(config), file)}": ${e.message.slice(e.message.indexOf(': ') + 2)}`, config, lineOfKey(readFileSync(config, 'utf8'), 'stopList'));
  }
}

/**
 * Errors that come from the machine, not from a bug: a file system error with its path (a
 * corpus that cannot be read half-way, a full disk) and a value too long for memory. One line,
 * `file: what is wrong`, like a UserError; anything else is an internal error with its stack.
 */
function asOneLine(error: unknown): string | null {
  const e = error as NodeJS.ErrnoException;
  if (typeof e?.code === 'string' && /^E[A-Z]+$/.test(e.code)) {
    const where = e.path ?? currentCorpus ?? '(unknown file)';
    return `${where}: ${describeSystemError(e)} (${e.code}${e.syscall ? `, ${e.syscall}` : ''})`;
  }
  if (error instanceof RangeError && /Invalid string length|Array buffer allocation failed|Invalid array length/.test(error.message)) {
    return `${currentCorpus ?? '(input)'}: a value too large to hold in memory (${error.message}); is there a line or field of hundreds of megabytes?`;
  }
  if ((error as { code?: string })?.code === 'ERR_STRING_TOO_LONG') {
    return `${currentCorpus ?? '(input)'}: a value too large to hold in memory; is there a line or field of hundreds of megabytes?`;
  }
  return null;
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    progress?.clear();
    const oneLine = asOneLine(error);
    // Usage errors are user errors too; they are told apart first for their exit code.
    if (error instanceof PathArgumentError) {
      process.stderr.write(`loudword: ${escapeControls(error.message)}\n`);
      process.exitCode = EXIT.usage;
    } else if (error instanceof UsageError) {
      const help = process.argv[2] === 'shard' ? '`loudword shard --help` for the steps' : '`loudword --help` for the options';
      process.stderr.write(`loudword: ${escapeControls(error.message)}\nRun ${help}.\n`);
      process.exitCode = EXIT.usage;
    } else if (isUserError(error)) {
      process.stderr.write(`loudword: ${escapeControls(error.describe())}\n`);
      process.exitCode = EXIT.input;
    } else if (oneLine !== null) {
      process.stderr.write(`loudword: ${escapeControls(oneLine)}\n`);
      process.exitCode = EXIT.input;
    } else {
      process.stderr.write(`loudword: internal error — please report it with the input that caused it.\n${(error as Error)?.stack ?? String(error)}\n`);
      process.exitCode = EXIT.internal;
    }
  },
);
