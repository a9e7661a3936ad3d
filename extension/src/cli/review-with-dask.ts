import { spawn } from 'node:child_process';
import { existsSync, promises as fs } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import type { Report } from '../protocol';
import { loadReviewSettings, provenanceOf } from '../engine/review/review-settings';
import { listCorpusFiles } from '../engine/read/corpus-files';
import { LOUDWORD_VERSION } from '../engine/review/version';
import { UserError } from '../engine/user-error';
import type { CliOptions } from './parse-args';
import { reviewInputOf } from './review-input-of';
import type { ShardSettingsFile } from './shard-command';
import { writeAtomically } from './write-atomically';

/** The Python that has Debian's python3-distributed; LOUDWORD_PYTHON overrides it. */
const PYTHON = process.env.LOUDWORD_PYTHON ?? '/usr/bin/python3';

/**
 * `loudword review <glob> --dask ADDR`: resolves the settings once, lists the shards, and hands
 * them to cluster/loudword_dask.py, which runs the shard steps as Dask tasks (each task runs
 * `node bin/loudword.js shard …` on a worker) and the merge and finish here. Returns the Report the
 * finish step wrote; the caller renders it like any other.
 */
export async function reviewWithDask(o: CliOptions, scheduler: string): Promise<Report> {
  const input = reviewInputOf(o);
  const { settings, configDir, sources } = await loadReviewSettings(input);
  if (settings.format === 'files') {
    throw new UserError('--dask reviews shard files (tables or lines); a folder of one document per file (format "files") is reviewed without --dask', input.file, null);
  }
  const provenance = provenanceOf(input, sources);
  const shards = await listCorpusFiles(input.file);
  const packageRoot = findPackageRoot();
  const workdir = o.workdir ?? (await fs.mkdtemp(path.join(os.tmpdir(), 'loudword-dask-')));
  const ownWorkdir = o.workdir === null;
  try {
    await fs.mkdir(workdir, { recursive: true });
    const shared: ShardSettingsFile = { loudword: 'shard-settings', toolVersion: LOUDWORD_VERSION, corpus: input.file, configDir, settings, provenance };
    await writeAtomically(path.join(workdir, 'settings.json'), JSON.stringify(shared));
    await writeAtomically(path.join(workdir, 'shards.json'), JSON.stringify(shards.map((s) => ({ key: s.key, file: path.resolve(s.path) }))));
    const args = [
      path.join(packageRoot, 'cluster', 'loudword_dask.py'),
      '--scheduler', scheduler,
      '--workdir', path.resolve(workdir),
      '--loudword', path.join(packageRoot, 'bin', 'loudword.js'),
      // A LocalCluster runs here, with this Node; remote workers use the `node` on their PATH.
      '--node', scheduler === 'local' ? process.execPath : 'node',
    ];
    if (o.quiet) args.push('--quiet');
    const reportFile = await runDriver(args);
    return JSON.parse(await fs.readFile(reportFile, 'utf8')) as Report;
  } finally {
    if (ownWorkdir) await removeWorkdir(workdir);
  }
}

/**
 * Removes the review's own working folder. A step that outlived the driver can still be writing
 * into it; a folder left behind must never hide the review's result or its error, so a failure
 * here is retried, then only said.
 */
async function removeWorkdir(workdir: string): Promise<void> {
  try {
    await fs.rm(workdir, { recursive: true, force: true, maxRetries: 5, retryDelay: 200 });
  } catch (e) {
    process.stderr.write(`loudword: could not remove the working folder ${workdir} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})\n`);
  }
}

/** Runs the Python driver; its last stdout line names the Report file, its stderr is progress. */
function runDriver(args: string[]): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn(PYTHON, args, { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    child.stdout.on('data', (d: Buffer) => (out += d.toString('utf8')));
    child.stderr.on('data', (d: Buffer) => {
      const text = d.toString('utf8');
      err += text;
      for (const line of text.split('\n')) if (line.startsWith('loudword: ')) process.stderr.write(`${line}\n`);
    });
    child.on('error', (e) =>
      reject(new UserError(`cannot run ${PYTHON} for --dask (${(e as NodeJS.ErrnoException).code ?? e.message}); install python3-distributed, or set LOUDWORD_PYTHON`)),
    );
    child.on('close', (code) => {
      const last = out.trim().split('\n').pop() ?? '';
      let result: { report?: string; error?: string; file?: string | null; line?: number | null } = {};
      try {
        result = JSON.parse(last) as typeof result;
      } catch {
        // fall through: no result line
      }
      if (code === 0 && typeof result.report === 'string') return resolve(result.report);
      if (typeof result.error === 'string') return reject(new UserError(result.error, result.file ?? null, result.line ?? null));
      reject(new UserError(`the Dask driver failed (exit ${code}):\n${err.trim().split('\n').slice(-12).join('\n')}`));
    });
  });
}

/** The folder holding bin/ and cluster/: from dist/cli.js one up, from sources under tsx three up. */
function findPackageRoot(): string {
  for (let dir = __dirname, i = 0; i < 5; i++, dir = path.dirname(dir)) {
    if (existsSync(path.join(dir, 'cluster', 'loudword_dask.py')) && existsSync(path.join(dir, 'bin', 'loudword.js'))) return dir;
  }
  throw new UserError('cannot find cluster/loudword_dask.py beside the loudword package');
}
