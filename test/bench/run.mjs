// `npm run bench`: Loudword's whole review against scikit-learn on seeded corpora of
// 10k / 100k / 1M documents, then the targets. Figures are whole processes, wall clock, on a
// machine others may be using: read them as rough, compare runs made back to back.
// scikit-learn's brute kNN grows as queries × documents and takes ~15 minutes alone at 1M on
// two shared cores, so by default it runs up to 100k only (--sklearn-knn-max 1M to include it).
//
// `npm run bench` runs 10k and 100k; `npm run bench:1m` runs the 1M size on its own (minutes,
// a ~600 MB corpus). At 100k the review also runs with tokens.tokenizer "pattern", and on the
// same corpus cut into 100 CSV files.
//
// usage: node test/bench/run.mjs [--sizes 10k,100k,1M] [--seed 1] [--toggles 9]
//                                [--sklearn-knn-max 100k] [--skip-loudword] [--skip-sklearn]
//                                [--cli bin/loudword.js]
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { cpus, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { DATA_DIR, ensureCorpus, parseSize, sizeLabel } from './generate-corpus.mjs';
import { measureActivation } from './activation-cost.mjs';
import { clockProbe, clockProbeText } from './clock-probe.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const root = join(here, '..', '..');
const PYTHON = '/usr/bin/python3';
const GNU_TIME = '/usr/bin/time';
const TEXT_COLUMN = 'text';
const LABEL_COLUMN = 'topic';
// The engine's defaults (extension/src/engine/config/default-settings.ts); the Report's
// settings.sample overrides these once a Loudword run has succeeded.
const DEFAULT_QUERIES = 2000;
const DEFAULT_K = 10;
const DEFAULT_SAMPLE_SEED = 1;

const TARGETS = {
  ratio100k: 1.0,
  // Issue 12: the pattern tokenizer's full review of 100k ≤ 0.4× fit_transform; 1M ≤ 2 minutes.
  patternRatio100k: 0.4,
  wall1M: 120,
  // Issue 10: click → strip ≤ 100 ms at 100k documents, of which the engine ≤ 30 ms.
  whatIfMs: 30,
  peakRss1M: 3 * 1024 ** 3,
  exponent: 1.1,
  activationMs: 50,
};

function parseArgs(argv) {
  const options = { sizes: ['10k', '100k'], seed: 1, toggles: 9, knnMax: 100_000, loudword: true, sklearn: true, cli: join(root, 'bin', 'loudword.js') };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const value = () => {
      if (i + 1 >= argv.length) throw new RangeError(`${a} needs a value`);
      return argv[++i];
    };
    if (a === '--sizes') options.sizes = value().split(',').filter(Boolean);
    else if (a === '--seed') options.seed = Number(value());
    else if (a === '--toggles') options.toggles = Number(value());
    else if (a === '--sklearn-knn-max') options.knnMax = parseSize(value());
    else if (a === '--skip-loudword') options.loudword = false;
    else if (a === '--cli') options.cli = resolve(value());
    else if (a === '--skip-sklearn') options.sklearn = false;
    else throw new RangeError(`unknown option ${a}`);
  }
  if (!Number.isInteger(options.seed)) throw new RangeError('--seed must be an integer');
  return options;
}

/** Runs a command, resolving with its exit code, wall seconds and captured output. */
function run(command, args, { env, cwd = root } = {}) {
  return new Promise((resolveRun, reject) => {
    const started = process.hrtime.bigint();
    const child = spawn(command, args, { cwd, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => {
      const wall = Number(process.hrtime.bigint() - started) / 1e9;
      resolveRun({ code, wall, stdout, stderr });
    });
  });
}

function lastLines(text, n = 4) {
  return text.trim().split('\n').slice(-n).join(' | ');
}

/**
 * The whole CLI review, JSON out. Peak RSS comes from GNU time (%M, the child's maximum
 * resident set) when present, otherwise from a preload that reads process.resourceUsage()
 * at exit. Wall time is measured here around the child, node start-up included.
 */
async function runLoudword(cli, file, label, configPath = null) {
  const bundle = join(root, 'dist', 'cli.js');
  if (cli === join(root, 'bin', 'loudword.js') && !existsSync(bundle)) return { error: 'dist/cli.js does not exist yet (the CLI has not landed)' };
  const out = join(DATA_DIR, `report-${label}.json`);
  const measureFile = join(DATA_DIR, `rss-${label}.txt`);
  rmSync(out, { force: true });
  rmSync(measureFile, { force: true });
  const cliArgs = [cli, 'review', file, '--text', TEXT_COLUMN, '--label', LABEL_COLUMN, '--format', 'json', '--out', out];
  if (configPath !== null) cliArgs.push('--config', configPath);
  const useTime = existsSync(GNU_TIME);
  const result = useTime
    ? await run(GNU_TIME, ['-f', '%M %e %U %S', '-o', measureFile, process.execPath, ...cliArgs], { cwd: DATA_DIR })
    : await run(process.execPath, cliArgs, {
        cwd: DATA_DIR,
        env: { NODE_OPTIONS: `--require ${join(here, 'peak-rss-probe.cjs')}`, LOUDWORD_BENCH_RSS_FILE: measureFile },
      });
  if (!existsSync(out)) return { error: `exit ${result.code}, no report: ${lastLines(result.stderr || result.stdout)}` };
  let report;
  try {
    report = JSON.parse(readFileSync(out, 'utf8'));
  } catch (e) {
    return { error: `report is not JSON: ${e.message}` };
  }
  let peakRss = null;
  let cpuSeconds = null;
  if (existsSync(measureFile)) {
    const text = readFileSync(measureFile, 'utf8').trim();
    if (useTime) {
      // GNU time prints "Command exited with non-zero status N" above the format line.
      const [kb, , user, system] = text.split('\n').pop().split(' ').map(Number);
      peakRss = kb * 1024;
      cpuSeconds = user + system;
    } else {
      ({ peakRss, cpuSeconds } = JSON.parse(text));
    }
  }
  return {
    wall: result.wall,
    exitCode: result.code,
    peakRss,
    cpuSeconds,
    rssMethod: useTime ? 'GNU time %M' : 'process.resourceUsage().maxRSS at exit',
    documents: report.input?.documents,
    tokens: report.vocabulary?.tokens,
    terms: report.vocabulary?.terms,
    nonzeros: report.vocabulary?.nonzeros,
    sample: report.settings?.sample,
    timings: report.timings ?? null,
    suggestions: report.suggestions?.length ?? 0,
  };
}

async function runSklearn(file, queries, k, sampleSeed, withKnn) {
  if (!existsSync(PYTHON)) return { error: `${PYTHON} is missing` };
  const args = [join(here, 'sklearn_side.py'), file, '--text', TEXT_COLUMN, '--queries', String(queries), '--k', String(k), '--seed', String(sampleSeed)];
  if (!withKnn) args.push('--no-knn');
  const result = await run(PYTHON, args);
  if (result.code !== 0) return { error: `exit ${result.code}: ${lastLines(result.stderr)}` };
  return { ...JSON.parse(result.stdout.trim().split('\n').pop()), wall: result.wall };
}

async function runWhatIf(file, toggles) {
  const script = join(here, 'what-if-latency.ts');
  if (!existsSync(join(root, 'extension', 'src', 'engine', 'review', 'start-review.ts'))) {
    return { error: 'extension/src/engine/review/start-review.ts does not exist yet' };
  }
  const result = await run(process.execPath, ['--import', 'tsx', script, file, '--text', TEXT_COLUMN, '--label', LABEL_COLUMN, '--toggles', String(toggles)], { cwd: DATA_DIR });
  if (result.code !== 0) return { error: `exit ${result.code}: ${lastLines(result.stderr)}` };
  return JSON.parse(result.stdout.trim().split('\n').pop());
}

// ---- printing ----
const dash = '—';
const seconds = (s) => (s == null ? dash : `${s.toFixed(s < 10 ? 2 : 1)} s`);
const megabytes = (b) => (b == null ? dash : `${Math.round(b / 1024 ** 2)} MB`);
const rate = (n) => (n == null || !Number.isFinite(n) ? dash : n >= 1e6 ? `${(n / 1e6).toFixed(2)} M/s` : `${Math.round(n / 1e3)} k/s`);
const count = (n) => (n == null ? dash : n.toLocaleString('en-US'));
const ms = (x) => (x == null ? dash : `${x.toFixed(1)} ms`);

/** Fixed-width columns; `align` holds 'l' or 'r' per column (default: first left, rest right). */
function table(rows, align = 'lrr') {
  const widths = rows[0].map(() => 0);
  for (const r of rows) r.forEach((c, i) => (widths[i] = Math.max(widths[i], String(c).length)));
  const cell = (c, i) => (align[i] === 'l' ? String(c).padEnd(widths[i]) : String(c).padStart(widths[i]));
  return rows.map((r) => r.map(cell).join('   ').trimEnd()).join('\n');
}

/** The 100k corpus is also reviewed as this many CSV files. */
const FOLDER_FILES = 100;

/**
 * `file`'s rows in `parts` CSV files of whole rows, each with the header, in a folder beside it
 * (made once). The generated corpora hold no line break inside a field, so a line is a row; the
 * review's document count, printed beside the one file's, shows it.
 */
function corpusAsFiles(file, parts) {
  const dir = file.replace(/\.csv$/, `-as-${parts}-files`);
  const done = join(dir, 'complete');
  if (existsSync(done)) return dir;
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  const [header, ...rows] = readFileSync(file, 'utf8').split('\n').filter((line) => line !== '');
  const per = Math.ceil(rows.length / parts);
  for (let p = 0; p < parts; p++) writeFileSync(join(dir, `part-${String(p).padStart(3, '0')}.csv`), `${header}\n${rows.slice(p * per, (p + 1) * per).join('\n')}\n`);
  writeFileSync(done, '');
  return dir;
}

function printSize(label, corpus, lw, sk, whatIf, pattern, clock, files = null) {
  const queries = sk?.queries ?? lw?.sample?.documents ?? DEFAULT_QUERIES;
  const k = sk?.k ?? lw?.sample?.k ?? DEFAULT_K;
  const lwOk = lw && !lw.error;
  const skOk = sk && !sk.error;
  const ratio = lwOk && skOk ? lw.wall / sk.fitTransformSeconds : null;
  const cpuRatio = lwOk && skOk && lw.cpuSeconds != null ? lw.cpuSeconds / sk.fitTransformCpuSeconds : null;
  console.log(`\n== ${label} documents — ${corpus.file.replace(root + '/', '')} (${megabytes(corpus.bytes)}${corpus.cached ? ', cached' : `, generated in ${seconds(corpus.seconds)}`}) — load average now ${loadavg()[0].toFixed(1)} on ${cpus().length} cores; clock probe ${clock.review.toFixed(3)} ns a step before the review${clock.whatIf === null ? '' : `, ${clock.whatIf.toFixed(3)} before the what-if`} ==`);
  const rows = [
    ['', 'Loudword', 'scikit-learn'],
    ['full review, whole process (wall)', lwOk ? seconds(lw.wall) : dash, dash],
    ['TfidfVectorizer.fit_transform alone (wall)', dash, skOk ? seconds(sk.fitTransformSeconds) : dash],
    [`brute cosine kNN, ${queries} queries, k=${k} (wall)`, lwOk ? '(inside review)' : dash, skOk ? (sk.knnSeconds == null ? 'skipped (--sklearn-knn-max)' : seconds(sk.knnSeconds)) : dash],
    ['ratio Loudword / fit_transform', ratio == null ? dash : `${ratio.toFixed(2)}×`, ''],
    ...(pattern
      ? [
          ['full review, tokens.tokenizer "pattern" (wall)', pattern.error ? dash : seconds(pattern.wall), ''],
          ['ratio Loudword "pattern" / fit_transform', !pattern.error && skOk ? `${(pattern.wall / sk.fitTransformSeconds).toFixed(2)}×` : dash, ''],
          ['tokens, "pattern" (scikit-learn\'s token_pattern)', pattern.error ? dash : count(pattern.tokens), ''],
          ['peak RSS, "pattern"', pattern.error ? dash : megabytes(pattern.peakRss), ''],
        ]
      : []),
    ...(files
      ? [
          [`full review, the same corpus as ${FOLDER_FILES} CSV files (wall; documents)`, files.error ? dash : `${seconds(files.wall)}; ${count(files.documents)}`, ''],
          [`ratio ${FOLDER_FILES} files / one file`, !files.error && lwOk ? `${(files.wall / lw.wall).toFixed(2)}×` : dash, ''],
        ]
      : []),
    ['CPU time, user+sys (Loudword: whole process; sklearn: fit_transform | kNN)', lwOk ? seconds(lw.cpuSeconds) : dash, skOk ? `${seconds(sk.fitTransformCpuSeconds)} | ${seconds(sk.knnCpuSeconds)}` : dash],
    ['CPU ratio Loudword / fit_transform', cpuRatio == null ? dash : `${cpuRatio.toFixed(2)}×`, ''],
    ['tokens', lwOk ? count(lw.tokens) : dash, skOk ? count(sk.tokens) : dash],
    ['tokens/s (Loudword: whole review; sklearn: fit_transform)', lwOk ? rate(lw.tokens / lw.wall) : dash, skOk ? rate(sk.tokens / sk.fitTransformSeconds) : dash],
    ['terms / nonzeros', lwOk ? `${count(lw.terms)} / ${count(lw.nonzeros)}` : dash, skOk ? `${count(sk.terms)} / ${count(sk.nonzeros)}` : dash],
    ['peak RSS', lwOk ? megabytes(lw.peakRss) : dash, skOk ? megabytes(sk.peakRssBytes) : dash],
    ['what-if, one term toggled (median; sample half on its own thread, as in the editor)', whatIf && !whatIf.error ? ms(whatIf.medianMs) : dash, ''],
    ['what-if, one term toggled, engine CPU time, both threads (median)', whatIf && !whatIf.error && whatIf.medianCpuMs != null ? ms(whatIf.medianCpuMs) : dash, ''],
    ['what-if, the same toggles asked ahead on a hover: the prefetch | the click that adopts it (median)', whatIf?.prefetched ? `${ms(whatIf.prefetched.medianPrefetchMs)} | ${ms(whatIf.prefetched.medianClickMs)}` : dash, ''],
    ['what-if, the same toggles in one thread (median | CPU time)', whatIf?.oneThread ? `${ms(whatIf.oneThread.medianMs)} | ${ms(whatIf.oneThread.medianCpuMs)}` : dash, ''],
  ];
  console.log(table(rows));
  if (lw?.error) console.log(`Loudword: not measured — ${lw.error}`);
  else if (lw) {
    console.log(`Loudword: peak RSS by ${lw.rssMethod}; wall measured around the child (node start-up, reading and writing included)${lw.exitCode ? `; CLI exit code ${lw.exitCode}` : ''}.`);
    if (lw.timings) console.log(`Loudword stages (Report timings, ms): ${Object.entries(lw.timings).map(([k2, v]) => `${k2} ${typeof v === 'number' ? v.toFixed(0) : v}`).join(', ')}`);
  }
  if (files?.error) console.log(`Loudword, ${FOLDER_FILES} files: not measured — ${files.error}`);
  else if (files?.timings) console.log(`Loudword, ${FOLDER_FILES} files, stages (ms): ${Object.entries(files.timings).map(([k2, v]) => `${k2} ${typeof v === 'number' ? v.toFixed(0) : v}`).join(', ')}`);
  if (pattern?.error) console.log(`Loudword "pattern": not measured — ${pattern.error}`);
  else if (pattern?.timings) console.log(`Loudword "pattern" stages (ms): ${Object.entries(pattern.timings).map(([k2, v]) => `${k2} ${typeof v === 'number' ? v.toFixed(0) : v}`).join(', ')}`);
  if (sk?.error) console.log(`scikit-learn: not measured — ${sk.error}`);
  else if (sk) console.log(`scikit-learn ${sk.sklearn}: CSV read ${seconds(sk.readSeconds)}, whole process ${seconds(sk.wall)}; peak RSS by getrusage ru_maxrss, single-threaded.`);
  if (whatIf?.error) console.log(`what-if: not measured — ${whatIf.error}`);
  else if (whatIf) {
    const pause = whatIf.pauseMs == null ? '' : `, a click every ${whatIf.pauseMs} ms after the previous answer`;
    console.log(`what-if: ${whatIf.toggles} toggles after a ${seconds(whatIf.reviewMs / 1000)} engine review, the sample's half on its own thread${pause}; toggle on median ${ms(whatIf.medianMs)}, back off median ${ms(whatIf.medianBackMs)}, first ${ms(whatIf.firstMs)} (after the idle preparation the editor does while the Report is read: the thread's opening build and ${whatIf.warmUp ? 'the warm-up toggles' : 'no warm-up'}).`);
    if (whatIf.cold?.error) console.log(`what-if cold (no warm-up): not measured — ${whatIf.cold.error}`);
    else if (whatIf.cold) console.log(`what-if cold (no warm-up, a process of its own: the first clicks run unoptimised code): ${whatIf.cold.onMs.map((x) => ms(x)).join(', ')}.`);
    if (whatIf.oneThread) console.log(`what-if in one thread (the same clicks after the thread is closed): toggle on median ${ms(whatIf.oneThread.medianMs)}, back off median ${ms(whatIf.oneThread.medianBackMs)}. Two threads help only when a core is free: compare at the load printed above.`);
  }
}

function verdict(ok) {
  return ok == null ? 'n/a ' : ok ? 'PASS' : 'MISS';
}

async function main() {
  const options = parseArgs(process.argv.slice(2));
  const sizes = options.sizes.map(parseSize);
  mkdirSync(DATA_DIR, { recursive: true });
  const gnuTime = existsSync(GNU_TIME);
  console.log(`Loudword bench — seed ${options.seed}, sizes ${sizes.map(sizeLabel).join(', ')}; node ${process.version}; peak RSS and CPU of the CLI by ${gnuTime ? 'GNU time' : 'a resourceUsage() preload'}; load average ${loadavg()[0].toFixed(1)} on ${cpus().length} cores (wall figures stretch when it exceeds the cores; CPU figures less so); ${clockProbeText()}, the core's speed, which can move between runs minutes apart.`);
  const python = spawnSync(PYTHON, ['-c', 'import sklearn; print(sklearn.__version__)'], { encoding: 'utf8' });
  if (python.status !== 0) console.log(`scikit-learn not importable with ${PYTHON}: the sklearn columns will be empty.`);

  const results = new Map();
  for (const documents of sizes) {
    const label = sizeLabel(documents);
    const corpus = ensureCorpus(documents, options.seed, { log: (m) => console.log(m) });
    // The core's speed before the review and before the what-if: a slow run with a slow probe
    // says more about the host than about the code (clock-probe.mjs).
    const clock = { review: clockProbe(), whatIf: null };
    const lw = options.loudword ? await runLoudword(options.cli, corpus.file, label) : null;
    const sample = lw && !lw.error && lw.sample ? lw.sample : { documents: DEFAULT_QUERIES, k: DEFAULT_K, seed: DEFAULT_SAMPLE_SEED };
    const sk = options.sklearn && python.status === 0 ? await runSklearn(corpus.file, sample.documents, sample.k, sample.seed, documents <= options.knnMax) : null;
    if (options.loudword && documents === 100_000) clock.whatIf = clockProbe();
    const whatIf = options.loudword && documents === 100_000 ? await runWhatIf(corpus.file, options.toggles) : null;
    let pattern = null;
    if (options.loudword && documents === 100_000) {
      const config = join(DATA_DIR, 'loudword-pattern.json');
      writeFileSync(config, `${JSON.stringify({ tokens: { tokenizer: 'pattern' } })}\n`);
      pattern = await runLoudword(options.cli, corpus.file, `${label}-pattern`, config);
    }
    // The same corpus as a folder of files, each counted with a tokeniser of its own (README
    // "Many files"): what many files cost against one.
    const files = options.loudword && documents === 100_000 ? await runLoudword(options.cli, corpusAsFiles(corpus.file, FOLDER_FILES), `${label}-${FOLDER_FILES}-files`) : null;
    results.set(documents, { lw, sk, whatIf, pattern });
    printSize(label, corpus, lw, sk, whatIf, pattern, clock, files);
  }

  // Growth: time ∝ nonzeros^e between 100k and 1M; e ≈ 1 means linear in the matrix size.
  const ok = (r) => r && !r.error;
  const small = results.get(100_000);
  const large = results.get(1_000_000);
  let exponent = null;
  if (ok(small?.lw) && ok(large?.lw)) {
    const nnzSmall = small.lw.nonzeros ?? small.sk?.nonzeros;
    const nnzLarge = large.lw.nonzeros ?? large.sk?.nonzeros;
    if (nnzSmall && nnzLarge) exponent = Math.log(large.lw.wall / small.lw.wall) / Math.log(nnzLarge / nnzSmall);
  }
  let cpuExponent = null;
  if (ok(small?.lw) && ok(large?.lw) && small.lw.cpuSeconds && large.lw.cpuSeconds) {
    const nnzSmall = small.lw.nonzeros ?? small.sk?.nonzeros;
    const nnzLarge = large.lw.nonzeros ?? large.sk?.nonzeros;
    if (nnzSmall && nnzLarge) cpuExponent = Math.log(large.lw.cpuSeconds / small.lw.cpuSeconds) / Math.log(nnzLarge / nnzSmall);
  }
  let skExponent = null;
  if (ok(small?.sk) && ok(large?.sk)) {
    skExponent = Math.log(large.sk.fitTransformSeconds / small.sk.fitTransformSeconds) / Math.log(large.sk.nonzeros / small.sk.nonzeros);
  }
  const fixed2 = (x) => (x == null ? dash : x.toFixed(2));
  console.log(`\nGrowth exponent of time vs nonzeros, 100k → 1M: Loudword wall ${fixed2(exponent)}, CPU ${fixed2(cpuExponent)}; fit_transform wall ${fixed2(skExponent)}`);

  const activation = measureActivation(5);
  if (activation.error) console.log(`Activation: not measured — ${activation.error}`);
  else console.log(`Activation (median of ${activation.runs} fresh processes, stub vscode): require ${ms(activation.requireMs)} + activate() ${ms(activation.activateMs)} = ${ms(activation.totalMs)}, ${activation.subscriptions} subscriptions.`);

  const ratio = ok(small?.lw) && ok(small?.sk) ? small.lw.wall / small.sk.fitTransformSeconds : null;
  const whatIfMs = ok(small?.whatIf) ? small.whatIf.medianMs : null;
  const peak = ok(large?.lw) ? large.lw.peakRss : null;
  const wall1M = ok(large?.lw) ? large.lw.wall : null;
  const patternRatio = ok(small?.pattern) && ok(small?.sk) ? small.pattern.wall / small.sk.fitTransformSeconds : null;
  const tokensPerSecond = ok(small?.lw) && small.lw.timings?.tokenizing ? small.lw.tokens / (small.lw.timings.tokenizing / 1000) : null;
  console.log('\nTargets');
  console.log(table([
    [verdict(ratio == null ? null : ratio <= TARGETS.ratio100k), `full review of 100k ≤ ${TARGETS.ratio100k}× fit_transform alone`, ratio == null ? dash : `${ratio.toFixed(2)}×`],
    [verdict(patternRatio == null ? null : patternRatio <= TARGETS.patternRatio100k), `full review of 100k, tokenizer "pattern" ≤ ${TARGETS.patternRatio100k}× fit_transform alone`, patternRatio == null ? dash : `${patternRatio.toFixed(2)}×`],
    [verdict(tokensPerSecond == null ? null : tokensPerSecond >= 1.8e6), 'wink tokenising of 100k ≥ 1.8 M tokens/s (Report timings: tokenizing stage)', rate(tokensPerSecond)],
    [verdict(wall1M == null ? null : wall1M <= TARGETS.wall1M), `1M reviewed in ≤ ${TARGETS.wall1M} s wall (npm run bench:1m)`, seconds(wall1M)],
    [verdict(whatIfMs == null ? null : whatIfMs <= TARGETS.whatIfMs), `what-if on 100k ≤ ${TARGETS.whatIfMs} ms (engine, wall)`, ms(whatIfMs)],
    [verdict(peak == null ? null : peak <= TARGETS.peakRss1M), '1M reviewed with peak RSS ≤ 3 GB (npm run bench:1m)', megabytes(peak)],
    [verdict(exponent == null ? null : exponent <= TARGETS.exponent), `growth exponent 100k → 1M ≤ ${TARGETS.exponent}`, exponent == null ? dash : exponent.toFixed(2)],
    [verdict(activation.error ? null : activation.totalMs < TARGETS.activationMs), `activation (require + activate) < ${TARGETS.activationMs} ms`, activation.error ? dash : ms(activation.totalMs)],
  ], 'llr'));
}

main().catch((error) => {
  console.error(error instanceof RangeError ? `bench: ${error.message}` : error);
  process.exitCode = 2;
});
