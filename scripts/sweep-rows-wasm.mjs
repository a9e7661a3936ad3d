// Assembles extension/src/engine/measures/sweep-rows.wat (the sampled measures' row sweep in
// WebAssembly) into its module with wabt's wat2wasm (wabt.js: no native build). scripts/build.mjs
// embeds the bytes in the Node bundles; run as a script it writes them to stdout, which is how
// the engine gets them when it runs from source under tsx (sweep-rows-wasm.ts).
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import wabt from 'wabt';

export const SWEEP_ROWS_WAT = fileURLToPath(new URL('../extension/src/engine/measures/sweep-rows.wat', import.meta.url));

/** The module's bytes, assembled from the text. */
export async function sweepRowsWasm(watPath = SWEEP_ROWS_WAT) {
  const w = await wabt();
  // Shared memory (both sweep threads read one), memory.fill, the saturating conversions.
  const features = { threads: true, bulk_memory: true, sat_float_to_int: true };
  const parsed = w.parseWat(watPath, readFileSync(watPath, 'utf8'), features);
  try {
    parsed.resolveNames();
    parsed.validate(features);
    return Uint8Array.from(parsed.toBinary({ log: false, write_debug_names: false }).buffer);
  } finally {
    parsed.destroy();
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) process.stdout.write(await sweepRowsWasm(process.argv[2]));
