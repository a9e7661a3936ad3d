import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { threadId } from 'node:worker_threads';

const compiled = new Map<string, WebAssembly.Module | null>();

/**
 * One of the engine's hand-written WebAssembly modules, compiled once per thread, or null where it
 * cannot be had (its caller then runs the TypeScript it mirrors: the same bits). `embedded` is the
 * module's bytes in base64 as scripts/build.mjs defines them in the Node bundles (undefined when
 * running from source); `wat` is the text's path under extension/src/engine, from which the
 * module is assembled when running from source (tests, benchmarks under tsx).
 */
export function assembledModule(wat: string, embedded: string | undefined): WebAssembly.Module | null {
  let module = compiled.get(wat);
  if (module === undefined) {
    try {
      module = new WebAssembly.Module(embedded !== undefined ? Buffer.from(embedded, 'base64') : assembledFromSource(wat));
    } catch {
      module = null;
    }
    compiled.set(wat, module);
  }
  return module;
}

/**
 * Running from source: the module assembled from its text by scripts/assemble-wat.mjs (wabt's
 * assembler starts asynchronously, so in a process of its own), kept in node_modules/.cache under
 * a hash of the text so that each thread after the first reads a file.
 */
function assembledFromSource(wat: string): Buffer {
  const root = path.resolve(__dirname, '../../../..');
  const text = path.join(root, 'extension', 'src', 'engine', wat);
  const script = path.join(root, 'scripts', 'assemble-wat.mjs');
  const key = createHash('sha256').update(readFileSync(text)).update(readFileSync(script)).digest('hex').slice(0, 16);
  const cacheDir = path.join(root, 'node_modules', '.cache', 'loudword');
  const cached = path.join(cacheDir, `${path.basename(wat, '.wat')}-${key}.wasm`);
  try {
    return readFileSync(cached);
  } catch {
    const bytes = execFileSync(process.execPath, [script, text], { maxBuffer: 1 << 20 });
    mkdirSync(cacheDir, { recursive: true });
    // Written whole under another name, then renamed: another thread may be reading the cache.
    const part = `${cached}.${process.pid}.${threadId}`;
    writeFileSync(part, bytes);
    renameSync(part, cached);
    return bytes;
  }
}
