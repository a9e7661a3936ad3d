import assert from 'node:assert/strict';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { confineToWorkspace } from '../extension/src/engine/config/confine-to-workspace';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { loadSettings } from '../extension/src/engine/config/load-settings';
import { parseSettings } from '../extension/src/engine/config/parse-settings';
import { SETTINGS_SPEC, type SettingSpec } from '../extension/src/engine/config/settings-spec';
import { UserError } from '../extension/src/engine/user-error';

let badInputCases = 0;

function userError(fn: () => unknown, file: string | null, line: number | null, words: RegExp): void {
  badInputCases++;
  assert.throws(fn, (e: unknown) => {
    assert.ok(e instanceof UserError, `expected UserError, got ${String(e)}`);
    assert.equal(e.file, file);
    assert.equal(e.line, line);
    assert.match(e.message, words);
    return true;
  });
}

after(() => console.log(`      config bad-input cases run: ${badInputCases}`));

describe('parseSettings', () => {
  it('parseSettings accepts a partial file with $schema and nested keys', () => {
    const s = parseSettings('{\n  "$schema": "./loudword.schema.json",\n  "text": "body",\n  "tokens": { "stem": true },\n  "prune": { "maxDf": 0.5 }\n}', 'loudword.json');
    assert.deepEqual(s, { text: 'body', tokens: { stem: true }, prune: { maxDf: 0.5 } });
  });

  it('parseSettings: a JSON syntax error names the file and line', () => {
    userError(() => parseSettings('{\n  "text": "body",\n  "label": \n}', 'cfg.json'), 'cfg.json', 4, /syntax error.*expected a value/);
    userError(() => parseSettings('{\n  "text": "body",\n}', 'cfg.json'), 'cfg.json', 3, /trailing comma/);
    userError(() => parseSettings('{\r\n  "text": "body"\r\n  "label": "x"\r\n}', 'cfg.json'), 'cfg.json', 3, /expected ',' or '}'/);
    userError(() => parseSettings('', 'cfg.json'), 'cfg.json', 1, /empty/);
    userError(() => parseSettings('{"a": "unterminated\n}', 'cfg.json'), 'cfg.json', 1, /string/);
  });

  it('parseSettings: an unknown key is named with its line', () => {
    userError(() => parseSettings('{\n  "txet": "body"\n}', 'cfg.json'), 'cfg.json', 2, /unknown setting "txet"/);
    userError(() => parseSettings('{\n  "tokens": {\n    "lowercase": true,\n    "stemming": true\n  }\n}', 'cfg.json'), 'cfg.json', 4, /unknown setting "tokens.stemming"/);
  });

  it('parseSettings: wrong types and out-of-range values name the key and what it expects', () => {
    userError(() => parseSettings('{\n "sample": {\n  "k": "ten"\n }\n}', 'c.json'), 'c.json', 3, /"sample.k" must be an integer from 1 to 100/);
    userError(() => parseSettings('{"sample": {"documents": 5}}', 'c.json'), 'c.json', 1, /"sample.documents" must be an integer from 10/);
    userError(() => parseSettings('{"format": "xlsx"}', 'c.json'), 'c.json', 1, /"format" must be one of/);
    userError(() => parseSettings('{"tokens": {"kinds": ["word", "words"]}}', 'c.json'), 'c.json', 1, /"tokens.kinds"\[1\]/);
    userError(() => parseSettings('{"prune": {"minDf": 1.5}}', 'c.json'), 'c.json', 1, /"prune.minDf" must be a document count/);
    userError(() => parseSettings('{"tokens": true}', 'c.json'), 'c.json', 1, /"tokens" must be an object/);
    userError(() => parseSettings('[1]', 'c.json'), 'c.json', null, /the settings must be an object/);
    userError(() => parseSettings('{"text": "a", "text": "b"}', 'c.json'), 'c.json', 1, /duplicate key "text"/);
  });
});

describe('loadSettings', () => {
  let dir: string;
  before(() => {
    dir = mkdtempSync(path.join(tmpdir(), 'loudword-config-'));
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('loadSettings without a file gives the defaults', async () => {
    const { settings, configDir } = await loadSettings(null);
    assert.deepEqual(settings, DEFAULT_SETTINGS);
    assert.equal(configDir, null);
  });

  it('loadSettings layers file over defaults and overrides over the file; stopList relative to the config folder', async () => {
    const sub = path.join(dir, 'project');
    mkdirSync(sub);
    writeFileSync(path.join(sub, 'loudword.json'), '{"stopList": "lists/stop.txt", "sample": {"k": 5, "seed": 9}, "text": "body"}');
    const loaded = await loadSettings(path.join(sub, 'loudword.json'), { text: 'title', sample: { seed: 3 } });
    assert.equal(loaded.configDir, sub);
    assert.equal(loaded.settings.text, 'title');
    assert.deepEqual(loaded.settings.sample, { documents: 2000, k: 5, seed: 3 });
    assert.equal(loaded.settings.stopList, 'lists/stop.txt');
    assert.equal(loaded.stopListPath, path.join(sub, 'lists', 'stop.txt'));
    assert.deepEqual(loaded.settings.weighting, DEFAULT_SETTINGS.weighting);
  });

  it('loadSettings: a missing config file, and k not below the sample size, are UserErrors', async () => {
    const missing = path.join(dir, 'none.json');
    await assert.rejects(loadSettings(missing), (e: unknown) => e instanceof UserError && e.file === missing && /not found/.test(e.message));
    badInputCases++;
    await assert.rejects(loadSettings(null, { sample: { documents: 10, k: 10 } }), (e: unknown) => e instanceof UserError && /sample.k/.test(e.message));
    badInputCases++;
    await assert.rejects(loadSettings(null, { sample: { k: 0 } }), (e: unknown) => e instanceof UserError && e.file === '(overrides)');
    badInputCases++;
  });
});

describe('confineToWorkspace', () => {
  it('confineToWorkspace resolves inside paths and refuses ones that escape, also through a symlink', () => {
    const root = mkdtempSync(path.join(tmpdir(), 'loudword-ws-'));
    const outside = mkdtempSync(path.join(tmpdir(), 'loudword-out-'));
    try {
      assert.equal(confineToWorkspace(root, 'a/../stop.txt'), path.join(root, 'stop.txt'));
      assert.equal(confineToWorkspace(root, '..stop.txt'), path.join(root, '..stop.txt'));
      userError(() => confineToWorkspace(root, '../x.txt'), null, null, /outside the workspace/);
      userError(() => confineToWorkspace(root, '/etc/passwd'), null, null, /outside the workspace/);
      writeFileSync(path.join(outside, 'secret.txt'), 'x');
      symlinkSync(outside, path.join(root, 'link'));
      userError(() => confineToWorkspace(root, 'link/secret.txt'), null, null, /symbolic link/);
    } finally {
      rmSync(root, { recursive: true, force: true });
      rmSync(outside, { recursive: true, force: true });
    }
  });
});

// ---- loudword.schema.json and the validator say the same thing ----

type Schema = Record<string, unknown>;
const schema = JSON.parse(readFileSync(path.join(__dirname, '..', 'loudword.schema.json'), 'utf8')) as Schema;

/**
 * The JSON Schema draft-07 keywords the schema uses, evaluated as the spec defines them
 * (Source: JSON Schema Validation, draft-07, §6). Enough to compare decisions, not a validator.
 */
function schemaAccepts(s: Schema, v: unknown): boolean {
  const typeOf = (x: unknown): string[] => {
    if (x === null) return ['null'];
    if (Array.isArray(x)) return ['array'];
    if (typeof x === 'number') return Number.isInteger(x) ? ['integer', 'number'] : ['number'];
    return [typeof x];
  };
  if (s.anyOf !== undefined) return (s.anyOf as Schema[]).some((sub) => schemaAccepts(sub, v));
  if (s.type !== undefined) {
    const types = Array.isArray(s.type) ? (s.type as string[]) : [s.type as string];
    if (!typeOf(v).some((t) => types.includes(t))) return false;
  }
  if (s.enum !== undefined && !(s.enum as unknown[]).some((e) => e === v)) return false;
  if (typeof v === 'number') {
    if (typeof s.minimum === 'number' && v < s.minimum) return false;
    if (typeof s.maximum === 'number' && v > s.maximum) return false;
    if (typeof s.exclusiveMinimum === 'number' && v <= s.exclusiveMinimum) return false;
    if (typeof s.exclusiveMaximum === 'number' && v >= s.exclusiveMaximum) return false;
  }
  if (typeof v === 'string') {
    if (typeof s.minLength === 'number' && [...v].length < s.minLength) return false;
    if (typeof s.pattern === 'string' && !new RegExp(s.pattern, 'u').test(v)) return false;
  }
  if (Array.isArray(v)) {
    if (typeof s.minItems === 'number' && v.length < s.minItems) return false;
    if (s.uniqueItems === true && new Set(v.map((x) => JSON.stringify(x))).size !== v.length) return false;
    if (s.items !== undefined && !v.every((x) => schemaAccepts(s.items as Schema, x))) return false;
  }
  if (typeof v === 'object' && v !== null && !Array.isArray(v)) {
    const props = (s.properties ?? {}) as Record<string, Schema>;
    for (const [k, x] of Object.entries(v)) {
      if (props[k] === undefined) {
        if (s.additionalProperties === false) return false;
      } else if (!schemaAccepts(props[k] as Schema, x)) return false;
    }
  }
  return true;
}

function validatorAccepts(json: unknown): boolean {
  try {
    parseSettings(JSON.stringify(json), 'loudword.json');
    return true;
  } catch (e) {
    if (e instanceof UserError) return false;
    throw e;
  }
}

function nest(pathParts: readonly string[], value: unknown): unknown {
  return pathParts.reduceRight<unknown>((inner, key) => ({ [key]: inner }), value);
}

/** Probe values for a leaf: its default and enum members, bounds and just past them, wrong types. */
function probes(s: Schema): unknown[] {
  const out: unknown[] = [s.default, null, true, 'text', '', '  ', 0, -1, 0.5, 1, 1.5, 2, 2.5, [], ['word'], ['word', 'word'], ['x'], [''], {}];
  for (const e of (s.enum as unknown[] | undefined) ?? []) out.push(e);
  const ranges = [s, ...((s.anyOf as Schema[] | undefined) ?? [])];
  for (const r of ranges) {
    for (const key of ['minimum', 'maximum', 'exclusiveMinimum', 'exclusiveMaximum']) {
      const b = r[key];
      if (typeof b === 'number') out.push(b, b - 1, b + 1, b - 0.5, b + 0.5);
    }
  }
  const items = s.items as Schema | undefined;
  for (const e of (items?.enum as unknown[] | undefined) ?? []) out.push([e]);
  return out;
}

function leaves(s: Schema, at: string[] = []): Array<{ path: string[]; schema: Schema }> {
  if (s.type === 'object' && s.properties !== undefined) {
    return Object.entries(s.properties as Record<string, Schema>).flatMap(([k, sub]) => (k === '$schema' ? [] : leaves(sub, [...at, k])));
  }
  return [{ path: at, schema: s }];
}

function specLeaves(s: SettingSpec, at: string[] = []): string[] {
  return s.kind === 'object' ? Object.entries(s.properties).flatMap(([k, sub]) => specLeaves(sub, [...at, k])) : [at.join('.')];
}

describe('loudword.schema.json agrees with the validator', () => {
  let probesRun = 0;
  after(() => console.log(`      schema/validator probes compared: ${probesRun}`));

  it('the schema and SETTINGS_SPEC describe the same keys', () => {
    assert.deepEqual(leaves(schema).map((l) => l.path.join('.')).sort(), specLeaves(SETTINGS_SPEC).sort());
  });

  it('the schema defaults equal DEFAULT_SETTINGS', () => {
    const defaults: Record<string, unknown> = {};
    for (const { path: p, schema: s } of leaves(schema)) {
      let node = defaults;
      for (const key of p.slice(0, -1)) node = (node[key] ??= {}) as Record<string, unknown>;
      node[p[p.length - 1] as string] = s.default;
    }
    assert.deepEqual(defaults, JSON.parse(JSON.stringify(DEFAULT_SETTINGS)));
  });

  it('every schema property is accepted at its default, and schema and validator decide every probe alike', () => {
    for (const { path: p, schema: s } of leaves(schema)) {
      assert.ok(validatorAccepts(nest(p, s.default)), `default of ${p.join('.')}`);
      for (const value of probes(s)) {
        probesRun++;
        const doc = nest(p, value);
        assert.equal(validatorAccepts(doc), schemaAccepts(schema, doc), `${p.join('.')} = ${JSON.stringify(value)}`);
      }
    }
    assert.ok(probesRun > 300);
  });

  it('an unknown key is rejected by both, at every level, and every object forbids extra keys', () => {
    const objects = [[], ...leaves(schema).map((l) => l.path.slice(0, -1))].filter((p, i, all) => all.findIndex((q) => q.join('.') === p.join('.')) === i);
    for (const p of objects) {
      const doc = nest(p, { notASetting: 1 });
      assert.equal(validatorAccepts(doc), false, p.join('.'));
      assert.equal(schemaAccepts(schema, doc), false, p.join('.'));
    }
    assert.equal(validatorAccepts({ $schema: './loudword.schema.json' }), true);
    assert.equal(schemaAccepts(schema, { $schema: './loudword.schema.json' }), true);
  });
});
