// Tokeniser and matrix throughput on this machine (a script that prints figures; not a test).
// Corpus: every saying in Debian's `fortunes` package (/usr/share/games/fortunes), repeated;
// the chunk-cache comparison also uses the generated bench corpus test/bench/data/corpus-v1-10k-seed1.csv.
//
// usage: node test/bench/tokenize-speed.mjs [--repeat 4] [--mask-rows 100000] [--mask-nnz 100] [--only-cache]
// Figures are wall clock on a 2-core machine others may be using: compare runs made back to back.
import { existsSync, readdirSync, readFileSync, mkdtempSync, rmSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { createRequire } from 'node:module';
import { build } from 'esbuild';

const here = dirname(fileURLToPath(import.meta.url));
const root = join(here, '..', '..');
// One esbuild bundle holds the engine pieces, wink-nlp and its model, so there is exactly one
// copy of wink-nlp (wink checks its its-functions by identity), and the worker is bundled the
// way scripts/build.mjs bundles it.
const dir = mkdtempSync(join(tmpdir(), 'loudword-bench-'));
process.on('exit', () => rmSync(dir, { recursive: true, force: true }));
const benchBundle = join(dir, 'bench-entry.js');
const workerScript = join(dir, 'tokenize-worker.js');
await build({
  stdin: {
    contents: [
      "export { createTokenizer } from './extension/src/engine/tokenize/create-tokenizer';",
      "export { freshWinkInstance } from './extension/src/engine/tokenize/wink-instance';",
      "export { buildCountMatrix } from './extension/src/engine/matrix/build-count-matrix';",
      "export { maskTerms } from './extension/src/engine/matrix/mask-terms';",
      "export { default as winkNLP } from 'wink-nlp';",
      "export { default as winkModel } from 'wink-eng-lite-web-model';",
    ].join('\n'),
    resolveDir: root,
    loader: 'ts',
  },
  outfile: benchBundle, bundle: true, platform: 'node', format: 'cjs', target: 'node20', logLevel: 'warning',
});
await build({ entryPoints: [join(root, 'extension/src/engine/tokenize/tokenize-worker.ts')], outfile: workerScript, bundle: true, platform: 'node', format: 'cjs', target: 'node20', logLevel: 'warning' });
const require = createRequire(import.meta.url);
const { createTokenizer, freshWinkInstance, buildCountMatrix, maskTerms, winkNLP, winkModel } = require(benchBundle);

function option(name, fallback) {
  const i = process.argv.indexOf(name);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}
const repeat = option('--repeat', 4);
const maskRows = option('--mask-rows', 100000);
const maskNnz = option('--mask-nnz', 100);

const FORTUNES = '/usr/share/games/fortunes';
const sayings = [];
for (const f of readdirSync(FORTUNES).sort()) {
  if (f.includes('.')) continue; // skip .dat indexes and .u8 links
  for (const s of readFileSync(join(FORTUNES, f), 'utf8').split(/\n%\n/)) if (s.trim() !== '') sayings.push(s);
}
const texts = [];
for (let r = 0; r < repeat; r++) texts.push(...sayings);
const fmt = (n) => Math.round(n).toLocaleString('en-US');
console.log(`corpus: ${fmt(texts.length)} documents (${fmt(sayings.length)} fortunes × ${repeat}), ${(texts.reduce((s, t) => s + t.length, 0) / 1e6).toFixed(1)} M characters`);

function time(fn) {
  const t0 = performance.now();
  const out = fn();
  return [performance.now() - t0, out];
}

// 0. The chunk cache: whole documents through wink ("before") vs the chunk-cached path
// ("after"), default token settings, each on its own fresh wink instance starting cold; the
// term lists must be identical, which is checked here too.
{
  const corpora = [[`fortunes × ${repeat}`, texts]];
  const generated = join(root, 'test/bench/data/corpus-v1-10k-seed1.csv');
  if (existsSync(generated)) {
    const Papa = require('papaparse');
    const rows = Papa.parse(readFileSync(generated, 'utf8'), { header: true, skipEmptyLines: true }).data;
    corpora.push(['corpus-v1-10k-seed1', rows.map((r) => r.text).filter((t) => typeof t === 'string')]);
  } else console.log(`note: ${generated} missing (node test/bench/generate-corpus.mjs); only fortunes measured`);
  const settings = { lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams: 1 };
  for (const [name, docs] of corpora) {
    const rates = [];
    const outputs = [];
    for (const chunkCache of [false, true]) {
      const tokenize = createTokenizer(settings, { nlp: freshWinkInstance('tokens'), chunkCache });
      const out = [];
      const [ms, n] = time(() => {
        let count = 0;
        for (const t of docs) { const terms = tokenize(t); out.push(terms); count += terms.length; }
        return count;
      });
      rates.push((n / ms) * 1000);
      outputs.push(out);
      console.log(`${name}: ${chunkCache ? 'chunk cache ' : 'whole docs  '} ${fmt((n / ms) * 1000)} terms/s (${fmt(n)} terms, ${fmt(docs.length)} docs, ${ms.toFixed(0)} ms, cold start)`);
    }
    const same = outputs[0].every((terms, d) => terms.length === outputs[1][d].length && terms.every((t, i) => t === outputs[1][d][i]));
    console.log(`${name}: speed-up ×${(rates[1] / rates[0]).toFixed(2)}; outputs identical: ${same}`);
  }
  if (process.argv.includes('--only-cache')) process.exit(0);
}

// 1. wink-nlp alone: empty pipe vs the default pipe (sbd, pos, ner, negation, sentiment).
{
  const model = winkModel;
  for (const [name, pipe] of [['empty pipe []', []], ['pipe ["sbd"]', ['sbd']], ['default pipe', undefined]]) {
    const nlp = pipe === undefined ? winkNLP(model) : winkNLP(model, pipe);
    const its = nlp.its;
    for (const t of sayings.slice(0, 300)) nlp.readDoc(t).tokens().out(its.normal); // warm up
    const [ms, n] = time(() => {
      let count = 0;
      for (const t of texts) count += nlp.readDoc(t).tokens().out(its.normal).length;
      return count;
    });
    console.log(`wink readDoc + its.normal, ${name.padEnd(14)}: ${fmt((n / ms) * 1000)} tokens/s (${fmt(n)} tokens, ${ms.toFixed(0)} ms)`);
  }
}

// 2. Our tokenizer with the default settings, unigrams and bigrams.
for (const ngrams of [1, 2]) {
  const tokenize = createTokenizer({ lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams });
  for (const t of sayings.slice(0, 300)) tokenize(t);
  const [ms, n] = time(() => {
    let count = 0;
    for (const t of texts) count += tokenize(t).length;
    return count;
  });
  console.log(`createTokenizer ngrams=${ngrams}: ${fmt((n / ms) * 1000)} terms/s (${fmt(n)} terms, ${ms.toFixed(0)} ms)`);
}

// 3. The whole count-matrix build, in-process vs worker threads.
{
  const rows = texts.map((text, i) => ({ text, label: null, line: i + 1 }));
  const source = {
    file: 'fortunes', format: 'text', textField: null, labelField: null, fields: [], skipped: { count: 0, examples: [] }, truncated: null,
    async *batches(size = 1000) { for (let i = 0; i < rows.length; i += size) yield rows.slice(i, i + size); },
  };
  const tokens = { lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams: 1 };
  for (const workers of [0, 1, Math.min(2, availableParallelism())]) {
    const t0 = performance.now();
    const built = await buildCountMatrix(source, tokens, { workers, workerScript });
    const ms = performance.now() - t0;
    const n = built.counts.tokensPerDoc.reduce((a, b) => a + b, 0);
    console.log(`buildCountMatrix workers=${workers}: ${fmt((n / ms) * 1000)} tokens/s, ${fmt(built.counts.rows / ms * 1000)} docs/s (${ms.toFixed(0)} ms incl. worker start-up; ${fmt(built.counts.cols)} terms)`);
  }
}

// 4. What-if masking on a synthetic l2-normalised matrix of maskRows × maskNnz entries.
{
  const cols = 50000;
  const rows = maskRows;
  const total = rows * maskNnz;
  const indptr = new Uint32Array(rows + 1);
  const indices = new Uint32Array(total);
  const data = new Float64Array(total);
  let seed = 1;
  const rand = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  const picked = new Uint8Array(cols);
  for (let r = 0, at = 0; r < rows; r++) {
    const start = at;
    while (at - start < maskNnz) {
      // Zipf-like column choice so frequent terms appear in most rows, as in text.
      const c = Math.min(cols - 1, Math.floor(Math.exp(rand() * Math.log(cols))) - 1);
      if (picked[c]) continue;
      picked[c] = 1;
      indices[at++] = c;
    }
    indices.subarray(start, at).sort();
    let s = 0;
    for (let k = start; k < at; k++) { data[k] = 0.1 + rand(); s += data[k] ** 2; picked[indices[k]] = 0; }
    for (let k = start; k < at; k++) data[k] /= Math.sqrt(s);
    indptr[r + 1] = at;
  }
  const weights = { rows, cols, indptr, indices, data };
  const removed = new Uint8Array(cols);
  for (let c = 0; c < 40; c++) removed[c] = 1; // the 40 most frequent columns
  const out = { indptr: new Uint32Array(rows + 1), indices: new Uint32Array(total), data: new Float64Array(total) };
  for (const [name, buffers] of [['fresh arrays', undefined], ['reused buffers', out]]) {
    maskTerms(weights, removed, 'l2', buffers);
    const times = [];
    for (let i = 0; i < 9; i++) times.push(time(() => maskTerms(weights, removed, 'l2', buffers))[0]);
    times.sort((a, b) => a - b);
    console.log(`maskTerms ${fmt(rows)} rows × ${maskNnz} nnz, 40 frequent terms removed, ${name}: median ${times[4].toFixed(1)} ms (min ${times[0].toFixed(1)})`);
  }
}
