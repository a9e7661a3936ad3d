// Bundles every entry point with esbuild. An entry whose source file does not exist yet is
// skipped with a note, so the project builds while parts are still being written.
import { build } from 'esbuild';
import { existsSync, mkdirSync, copyFileSync, readdirSync } from 'node:fs';
import { basename, join, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildSettingsValidator } from './settings-validator.mjs';
import { assembleWat, ENGINE_WAT } from './assemble-wat.mjs';
import { wordRanges } from './word-ranges.mjs';

const production = process.argv.includes('--production');
const common = {
  bundle: true,
  sourcemap: !production,
  minify: production,
  logLevel: 'warning',
  // jsonc-parser's "main" is a UMD build whose dynamic require('./impl/…') esbuild cannot follow;
  // its ES module build bundles cleanly.
  alias: { 'jsonc-parser': './node_modules/jsonc-parser/lib/esm/main.js' },
};

// wink's English model data (7 JSON files, 3.6 MB) stays out of the bundles: the bundles that hold
// wink require it from dist/wink-model/ when a wink instance is first made. As object literals in
// every such bundle it was parsed wherever a bundle was loaded (the CLI, each tokenising thread,
// the opinion thread), wink used or not: loading cli.js took 0.20 s of CPU and 5.5k page faults
// without it, 0.26-0.31 s and 10.1k with it; a 100k pattern review's peak RSS was ~80 MB lower.
const WINK_MODELS = join('node_modules', 'wink-eng-lite-web-model', 'dist', 'languages', 'cur', 'models');
const winkModelOutside = {
  name: 'wink-model-outside',
  setup(b) {
    b.onResolve({ filter: /[\\/]languages[\\/]cur[\\/]models[\\/][\w-]+\.json$/ }, (args) => {
      // The model's own loaders require it relatively; the tokenizer's code by the package's name.
      if (!args.path.startsWith('wink-eng-lite-web-model/') && !args.importer.includes(`${sep}wink-eng-lite-web-model${sep}`)) return undefined;
      return { path: `./wink-model/${basename(args.path)}`, external: true };
    });
  },
};

// wink-eng-lite-web-model's read-core-model.js copies the 3 MB model through JSON.stringify and
// JSON.parse for each wink instance; extension/src/engine/tokenize/wink-core-model.ts gives the same
// object from one parse of the file's text (~300 -> ~200 ms of CPU per instance, four instances in
// a wink review: the review's thread, two tokenising threads, the opinion check).
const winkCoreReader = {
  name: 'wink-core-reader',
  setup(b) {
    b.onResolve({ filter: /^\.\/read-core-model(\.js)?$/ }, (args) => {
      if (!args.importer.includes(`${sep}wink-eng-lite-web-model${sep}`)) return undefined;
      return { path: 'read-core-model', namespace: 'wink-core-reader' };
    });
    b.onLoad({ filter: /.*/, namespace: 'wink-core-reader' }, () => ({
      contents: "module.exports = require('./extension/src/engine/tokenize/wink-core-model.ts').readCoreModel;",
      resolveDir: fileURLToPath(new URL('..', import.meta.url)),
      loader: 'js',
    }));
  },
};

// wink-nlp's code and its model's (0.4 MB, 416 kB of the CLI's 1.4 MB and 476 kB of a tokenising
// thread's bundle) are bundles of their own, which the others require from beside them when a wink
// instance is first made: a bundle's text is read and compiled whenever it is loaded, wink used or
// not, and the pattern review's three loads (the CLI and two tokenising threads) took ~40 ms of CPU
// each for wink's part (docs/performance.md, "The pattern review's start"). One file per package
// keeps one copy of each in a thread (wink-nlp checks its its-functions by identity).
const WINK_PACKAGES = { 'wink-nlp': 'wink-nlp.js', 'wink-eng-lite-web-model': 'wink-eng-lite-web-model.js' };
// The module that reads wink's core model (wink-core-model.ts) is one of its own too: the
// tokenizer peeks at the model's regexes and leaves that parse for the next instance, which the
// model's bundle reads through it, so both must hold the same module (a copy in each parsed the 3 MB
// model twice in each wink thread).
const WINK_CORE_MODEL = 'wink-core-model.js';
const winkOutside = {
  name: 'wink-outside',
  setup(b) {
    b.onResolve({ filter: /^wink-(nlp|eng-lite-web-model)$/ }, (args) => {
      if (args.kind === 'entry-point') return undefined;
      return { path: `./${WINK_PACKAGES[args.path]}`, external: true };
    });
    b.onResolve({ filter: /(^|\/)wink-core-model(\.ts)?$/ }, (args) => {
      if (args.kind === 'entry-point') return undefined;
      return { path: `./${WINK_CORE_MODEL}`, external: true };
    });
  },
};

// ajv compiles the settings schema only where settings-validator.js is missing (running from
// source: engine/config/settings-schema.ts); the bundles always have it beside them, so ajv's
// 0.25 MB (with fast-uri) stays out of them rather than being read and compiled at every start.
const ajvOutside = {
  name: 'ajv-outside',
  setup(b) {
    b.onResolve({ filter: /^ajv$/ }, () => ({ path: 'ajv', namespace: 'ajv-outside' }));
    b.onLoad({ filter: /.*/, namespace: 'ajv-outside' }, () => ({
      contents: "throw new Error('settings-validator.js is missing beside the bundle: run npm run build');",
      loader: 'js',
    }));
  },
};

const entries = [
  // Node side: the extension host, the engine worker, the CLI.
  { entry: 'extension/src/host/extension.ts', out: 'dist/extension.js', platform: 'node', external: ['vscode'] },
  { entry: 'extension/src/worker/review-worker.ts', out: 'dist/review-worker.js', platform: 'node' },
  { entry: 'extension/src/engine/tokenize/tokenize-worker.ts', out: 'dist/tokenize-worker.js', platform: 'node' },
  { entry: 'extension/src/engine/measures/matrix-thread.ts', out: 'dist/assemble-worker.js', platform: 'node' },
  { entry: 'extension/src/engine/shards/shard-thread.ts', out: 'dist/shard-thread.js', platform: 'node' },
  { entry: 'extension/src/engine/what-if/sample-thread.ts', out: 'dist/what-if-thread.js', platform: 'node' },
  { entry: 'extension/src/engine/measures/masked-term-sums-thread.ts', out: 'dist/masked-term-sums-thread.js', platform: 'node' },
  { entry: 'extension/src/engine/terms/opinion-thread.ts', out: 'dist/opinion-thread.js', platform: 'node' },
  { entry: 'extension/src/cli/main.ts', out: 'dist/cli.js', platform: 'node' },
  // wink's two packages, each as its own bundle (winkOutside).
  ...Object.entries(WINK_PACKAGES).map(([name, file]) => ({ entry: name, out: `dist/${file}`, platform: 'node' })),
  { entry: 'extension/src/engine/tokenize/wink-core-model.ts', out: `dist/${WINK_CORE_MODEL}`, platform: 'node' },
  // Browser side: the panel; the same bundle renders the standalone HTML report.
  { entry: 'webview/src/main.ts', out: 'dist/webview.js', platform: 'browser', format: 'iife' },
];

// The engine's WebAssembly (scripts/assemble-wat.mjs lists it: the sampled measures' row sweep,
// the what-if's column gather and dot-product update), assembled once here and carried in the
// Node bundles as base64 (a few KB): the extension host, the CLI and the what-if's threads run
// them; the webview does not.
const wasmModules = {};
for (const [name, wat] of Object.entries(ENGINE_WAT)) wasmModules[name] = JSON.stringify(Buffer.from(await assembleWat(wat)).toString('base64'));

mkdirSync('dist', { recursive: true });
for (const e of entries) {
  if (!(e.entry in WINK_PACKAGES) && !existsSync(e.entry)) {
    console.log(`build: skipping ${e.entry} (not written yet)`);
    continue;
  }
  await build({
    ...common,
    entryPoints: [e.entry],
    outfile: e.out,
    platform: e.platform,
    format: e.format ?? 'cjs',
    target: e.platform === 'node' ? 'node20' : 'es2022',
    external: e.external ?? [],
    plugins: e.platform === 'node' ? [winkOutside, winkModelOutside, winkCoreReader, ajvOutside] : [],
    // The token pattern scan's table of word characters, worked out once here (word-ranges.mjs).
    define: e.platform === 'node' ? { LOUDWORD_WORD_RANGES: JSON.stringify(JSON.stringify(wordRanges())), LOUDWORD_WINK_CORE_READER: '"bundled"', ...wasmModules } : {},
  });
}
// The settings schema compiled once here; the bundles above load it from beside them.
await buildSettingsValidator('dist/settings-validator.js', { minify: production });
mkdirSync(join('dist', 'wink-model'), { recursive: true });
for (const f of readdirSync(WINK_MODELS)) if (f.endsWith('.json')) copyFileSync(join(WINK_MODELS, f), join('dist', 'wink-model', f));
if (existsSync('webview/src/panel.css')) copyFileSync('webview/src/panel.css', 'dist/webview.css');
console.log('build: done');
