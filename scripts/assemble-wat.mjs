// Assembles the engine's hand-written WebAssembly (extension/src/engine/**/*.wat: the sampled
// measures' row sweep, the what-if's column gather and dot-product update) into modules with
// wabt's wat2wasm (wabt.js: no native build). scripts/build.mjs embeds the bytes in the Node
// bundles; run as a script with a .wat path it writes that module's bytes to stdout, which is
// how the engine gets them when it runs from source under tsx (engine/wasm/assembled-module.ts).
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import wabt from 'wabt';

const engine = (path) => fileURLToPath(new URL(`../extension/src/engine/${path}`, import.meta.url));

/** The engine's modules by the name of the constant the bundles carry each in (base64). */
export const ENGINE_WAT = {
  LOUDWORD_SWEEP_ROWS_WASM: engine('measures/sweep-rows.wat'),
  LOUDWORD_COLUMN_GATHER_WASM: engine('what-if/column-gather.wat'),
  LOUDWORD_GRAM_UPDATE_WASM: engine('what-if/gram-update.wat'),
};

/** A module's bytes, assembled from its text. */
export async function assembleWat(watPath) {
  const w = await wabt();
  // Shared memory (the threads of one sweep or gather read one), memory.fill, the saturating
  // conversions, and 128-bit SIMD (the sweep's rows two at a time).
  const features = { threads: true, bulk_memory: true, sat_float_to_int: true, simd: true };
  const parsed = w.parseWat(watPath, readFileSync(watPath, 'utf8'), features);
  try {
    parsed.resolveNames();
    parsed.validate(features);
    return Uint8Array.from(parsed.toBinary({ log: false, write_debug_names: false }).buffer);
  } finally {
    parsed.destroy();
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) process.stdout.write(await assembleWat(process.argv[2]));
