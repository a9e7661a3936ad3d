// What activating the extension costs the editor: require dist/extension.js with a stub
// 'vscode' module and time require() and activate() in fresh processes (cold, as VS Code pays
// it). Prints one JSON object; `--once` is the child that does a single measurement.
//
// usage: node test/bench/activation-cost.mjs [--runs 5] [--bundle dist/extension.js]
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const bundleArg = process.argv.indexOf('--bundle');
const bundle = bundleArg > 0 ? resolve(process.argv[bundleArg + 1]) : join(root, 'dist', 'extension.js');

/**
 * A stand-in for the whole vscode API: every property is another stand-in, calling or
 * constructing one returns a stand-in, and `then` is absent so awaiting one does not hang.
 * Registrations succeed and return disposables; activation cost is what we time, not behaviour.
 */
function stub(name) {
  const target = function () {};
  const assigned = new Map();
  return new Proxy(target, {
    set(_t, key, value) {
      assigned.set(key, value);
      return true;
    },
    get(_t, key) {
      if (assigned.has(key)) return assigned.get(key);
      if (key === 'then') return undefined;
      if (key === Symbol.toPrimitive) return () => name;
      if (key === Symbol.iterator) return function* () {};
      if (key === 'toString' || key === 'toJSON') return () => name;
      if (key === 'dispose') return () => {};
      if (typeof key === 'symbol') return undefined;
      return stub(`${name}.${key}`);
    },
    apply: () => stub(`${name}()`),
    construct: () => stub(`new ${name}`),
  });
}

function fakeContext() {
  const memento = { get: (_k, d) => d, update: async () => {}, keys: () => [], setKeysForSync: () => {} };
  const vscode = stub('vscode');
  const uri = vscode.Uri.file(root);
  return new Proxy(
    {
      subscriptions: [],
      extensionPath: root,
      extensionUri: uri,
      globalStorageUri: uri,
      storageUri: uri,
      logUri: uri,
      globalStoragePath: join(root, '.e2e', 'global'),
      storagePath: join(root, '.e2e', 'storage'),
      logPath: join(root, '.e2e', 'log'),
      extensionMode: 3,
      globalState: memento,
      workspaceState: memento,
      secrets: { get: async () => undefined, store: async () => {}, delete: async () => {}, onDidChange: stub('onDidChange') },
      asAbsolutePath: (p) => join(root, p),
    },
    { get: (t, key) => (key in t ? t[key] : typeof key === 'symbol' ? undefined : stub(`context.${String(key)}`)) },
  );
}

async function measureOnce() {
  const require = createRequire(import.meta.url);
  const Module = require('node:module');
  // Bundlers copy a CommonJS module's own keys into a namespace object whose prototype is the
  // module's prototype; a stand-in as the prototype keeps `import * as vscode` lookups working.
  const vscode = Object.create(stub('vscode'));
  const originalLoad = Module._load;
  Module._load = function (request, parent, isMain) {
    if (request === 'vscode') return vscode;
    return originalLoad.call(this, request, parent, isMain);
  };
  let t = performance.now();
  const extension = require(bundle);
  const requireMs = performance.now() - t;
  if (typeof extension.activate !== 'function') throw new Error('dist/extension.js exports no activate()');
  const context = fakeContext();
  t = performance.now();
  await extension.activate(context);
  const activateMs = performance.now() - t;
  return { requireMs, activateMs, subscriptions: context.subscriptions.length };
}

function median(values) {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Runs `runs` fresh child processes; returns medians in ms, or { error }. */
export function measureActivation(runs = 5) {
  if (!existsSync(bundle)) return { error: `${bundle} does not exist yet (run npm run build)` };
  const samples = [];
  for (let i = 0; i < runs; i++) {
    const child = spawnSync(process.execPath, [fileURLToPath(import.meta.url), '--once', '--bundle', bundle], { encoding: 'utf8' });
    if (child.status !== 0) {
      const lines = (child.stderr || child.stdout).trim().split('\n');
      const at = lines.findIndex((l) => /^\w*Error\b/.test(l));
      return { error: (at >= 0 ? lines.slice(at, at + 2) : lines.slice(-3)).join(' | ') };
    }
    samples.push(JSON.parse(child.stdout.trim().split('\n').pop()));
  }
  const requireMs = median(samples.map((s) => s.requireMs));
  const activateMs = median(samples.map((s) => s.activateMs));
  const totalMs = median(samples.map((s) => s.requireMs + s.activateMs));
  return { runs, requireMs, activateMs, totalMs, subscriptions: samples[0].subscriptions };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  if (process.argv.includes('--once')) {
    const result = await measureOnce();
    // The extension may leave timers or watchers behind; this child only reports.
    process.stdout.write(JSON.stringify(result) + '\n', () => process.exit(0));
  } else {
    const i = process.argv.indexOf('--runs');
    const result = measureActivation(i > 0 ? Number(process.argv[i + 1]) : 5);
    console.log(JSON.stringify(result));
    if (result.error) process.exitCode = 1;
  }
}
