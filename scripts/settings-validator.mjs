// Writes the settings schema's validator as a module of its own (ajv's standalone code, bundled
// with the few ajv helpers it calls), so that the CLI and the review worker load a finished
// function instead of loading ajv and compiling loudword.schema.json at every start: ~0.1 s of
// CPU on the review's thread before the first document can be tokenised (the tokens settings
// must be checked first). engine/config/settings-schema.ts loads it from beside its bundle and
// compiles the schema itself where it is missing (running from source).
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Ajv from 'ajv';
import standaloneCode from 'ajv/dist/standalone/index.js';
import { build } from 'esbuild';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

/** The options settings-schema.ts compiles with (compileSettingsSchema): the same rules either way. */
export const SCHEMA_OPTIONS = { allowUnionTypes: true };

/** Writes the validator of loudword.schema.json to `outfile` (CommonJS, `module.exports` = the function). */
export async function buildSettingsValidator(outfile, { minify = false } = {}) {
  const schema = JSON.parse(readFileSync(join(root, 'loudword.schema.json'), 'utf8'));
  const ajv = new Ajv({ ...SCHEMA_OPTIONS, code: { source: true } });
  const code = standaloneCode(ajv, ajv.compile(schema));
  await build({
    stdin: { contents: code, resolveDir: root, sourcefile: 'settings-validator.js', loader: 'js' },
    bundle: true,
    minify,
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    outfile,
    logLevel: 'warning',
  });
}
