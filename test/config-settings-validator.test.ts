import assert from 'node:assert/strict';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { ValidateFunction } from 'ajv';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { compileSettingsSchema, SETTINGS_SCHEMA, type SchemaNode } from '../extension/src/engine/config/settings-schema';

// The build's settings validator (scripts/settings-validator.mjs: ajv's standalone code) against
// ajv 8 compiling loudword.schema.json at run time, as the engine does when running from source.
// Source of truth: ajv's own compile of the same schema; the two must accept the same values
// and report the same errors, or a built review and a test would judge settings differently.

/** Values that meet each node of the schema and values that break it, at every path. */
function probes(node: SchemaNode, valid: unknown): unknown[] {
  const out: unknown[] = [valid, null, 'x', '', 3, 2.5, -1, 1e9, true, [], [valid, valid], {}, { unknownKey: 1 }];
  if (node.enum !== undefined) out.push(...node.enum, `${String(node.enum[0])}!`);
  if (node.minimum !== undefined) out.push(node.minimum, node.minimum - 1, node.minimum - 0.5);
  if (node.maximum !== undefined) out.push(node.maximum, node.maximum + 1);
  if (node.exclusiveMinimum !== undefined) out.push(node.exclusiveMinimum, node.exclusiveMinimum + 1e-9);
  if (node.exclusiveMaximum !== undefined) out.push(node.exclusiveMaximum, node.exclusiveMaximum - 1e-9);
  if (node.items !== undefined) out.push([...probes(node.items, Array.isArray(valid) ? valid[0] : undefined)]);
  if (node.anyOf !== undefined) for (const branch of node.anyOf) if (branch.enum !== undefined) out.push(...branch.enum);
  return out;
}

/** The defaults with the value at `path` replaced (a fresh copy). */
function withValue(path: string[], value: unknown): unknown {
  const root = JSON.parse(JSON.stringify(DEFAULT_SETTINGS)) as Record<string, unknown>;
  let at = root;
  for (const key of path.slice(0, -1)) at = at[key] as Record<string, unknown>;
  at[path[path.length - 1]!] = value;
  return root;
}

function* everyPath(node: SchemaNode, path: string[] = []): Generator<{ path: string[]; node: SchemaNode }> {
  for (const [key, child] of Object.entries(node.properties ?? {})) {
    yield { path: [...path, key], node: child };
    yield* everyPath(child, [...path, key]);
  }
}

describe('the build\'s settings validator', function () {
  let dir: string;
  let built: ValidateFunction;
  let runtime: ValidateFunction;

  before(async function () {
    dir = mkdtempSync(join(tmpdir(), 'loudword-validator-'));
    // The build's own module (an .mjs with no type declarations, so imported by its URL).
    const script = pathToFileURL(join(__dirname, '..', 'scripts', 'settings-validator.mjs')).href;
    const { buildSettingsValidator } = (await import(script)) as { buildSettingsValidator(outfile: string): Promise<void> };
    await buildSettingsValidator(join(dir, 'settings-validator.js'));
    built = require(join(dir, 'settings-validator.js')) as ValidateFunction;
    runtime = compileSettingsSchema();
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('accepts and rejects what ajv compiling loudword.schema.json does, with the same errors, at every setting', () => {
    const defaults = DEFAULT_SETTINGS as unknown as Record<string, unknown>;
    let values = 0;
    let rejected = 0;
    for (const { path, node } of everyPath(SETTINGS_SCHEMA)) {
      let valid: unknown = defaults;
      for (const key of path) valid = (valid as Record<string, unknown> | undefined)?.[key];
      for (const value of probes(node, valid)) {
        const settings = withValue(path, value);
        const a = built(settings);
        const b = runtime(settings);
        assert.equal(a, b, `${path.join('.')} = ${JSON.stringify(value)}`);
        assert.deepEqual(built.errors ?? null, runtime.errors ?? null, `${path.join('.')} = ${JSON.stringify(value)}`);
        values++;
        if (!b) rejected++;
      }
    }
    // Both sides were exercised: most probes break a rule, the defaults meet them all.
    assert.ok(values > 300 && rejected > values / 2, `${values} values, ${rejected} rejected`);
    assert.equal(built(defaults), true);
    assert.equal(built({ ...defaults, notASetting: 1 }), false);
  });
});
