import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { parseSettings } from '../extension/src/engine/config/parse-settings';
import { SETTINGS_SCHEMA, schemaAt, type SchemaNode } from '../extension/src/engine/config/settings-schema';
import { OPTIONS } from '../extension/src/cli/parse-args';
import { CORPUS_FORMATS } from '../extension/src/protocol';

// loudword.schema.json is the one source of the settings rules; these checks hold everything
// that repeats a part of it (defaults, package.json, the README, the samples) equal to it.
const repo = path.join(__dirname, '..');
const read = (file: string): string => readFileSync(path.join(repo, file), 'utf8');

function leaves(node: SchemaNode, at: string[] = []): Array<{ path: string[]; node: SchemaNode }> {
  if (node.properties === undefined) return [{ path: at, node }];
  return Object.entries(node.properties).flatMap(([k, sub]) => (k === '$schema' ? [] : leaves(sub, [...at, k])));
}

function get(value: unknown, p: readonly string[]): unknown {
  return p.reduce<unknown>((v, k) => (v as Record<string, unknown> | undefined)?.[k], value);
}

describe('loudword.schema.json as the one source of settings', () => {
  it('every leaf setting has a default the schema itself accepts, and DEFAULT_SETTINGS holds exactly those', () => {
    const all = leaves(SETTINGS_SCHEMA);
    assert.ok(all.length >= 20, `only ${all.length} settings`);
    for (const { path: p, node } of all) {
      assert.ok('default' in node, `${p.join('.')} has no default`);
      assert.deepEqual(get(DEFAULT_SETTINGS, p), node.default, p.join('.'));
    }
    // The full defaults are a valid loudword.json.
    assert.doesNotThrow(() => parseSettings(JSON.stringify(DEFAULT_SETTINGS), 'defaults'));
  });

  it("the formats a corpus can be read in are CORPUS_FORMATS, the schema's enum (with auto) and --input-format's choices", () => {
    assert.deepEqual(schemaAt(['format'])?.enum, ['auto', ...CORPUS_FORMATS]);
    const option = OPTIONS.find((o) => o.flag === 'input-format');
    assert.deepEqual(option?.check, { kind: 'choice', choices: [...CORPUS_FORMATS] });
  });

  it('package.json contributes.configuration uses the schema’s type, bounds and default for the settings that stand in for loudword.json keys', () => {
    const pkg = JSON.parse(read('package.json')) as { contributes: { configuration: { properties: Record<string, Record<string, unknown>> } } };
    const props = pkg.contributes.configuration.properties;
    const standIns: Record<string, string[]> = {
      'loudword.sampleSize': ['sample', 'documents'],
      'loudword.neighbors': ['sample', 'k'],
      'loudword.stopListFile': ['stopList'],
    };
    for (const [setting, key] of Object.entries(standIns)) {
      const editor = props[setting];
      const schema = schemaAt(key)!;
      assert.ok(editor !== undefined, `${setting} is declared`);
      assert.deepEqual(editor.default, schema.default, `${setting} default`);
      for (const bound of ['minimum', 'maximum'] as const) assert.equal(editor[bound], schema[bound], `${setting} ${bound}`);
      const types = Array.isArray(schema.type) ? schema.type : [schema.type];
      assert.ok(types.includes(editor.type as string), `${setting} type ${String(editor.type)} in ${types.join('|')}`);
    }
  });

  it('the README configuration example is a valid loudword.json that shows every setting at its default', () => {
    const readme = read('README.md');
    const section = readme.slice(readme.indexOf('## Configuration'));
    const block = /```jsonc?\n([\s\S]*?)```/.exec(section);
    assert.ok(block !== null, 'README has a json block under "## Configuration"');
    const example = parseSettings(block[1]!, 'README.md');
    const shownOtherwise = new Set(['text', 'label']); // defaults are "detect" and "none"; the example names fields
    for (const { path: p, node } of leaves(SETTINGS_SCHEMA)) {
      const key = p.join('.');
      assert.notEqual(get(example, p), undefined, `README example lacks ${key}`);
      if (!shownOtherwise.has(key)) assert.deepEqual(get(example, p), node.default, `README example ${key}`);
    }
  });

  it('samples/loudword.json, the README example and open-config never point $schema at a file a user’s folder lacks', () => {
    // VS Code then reports "Unable to load schema" and turns validation off; the extension's
    // jsonValidation applies the schema by file name, so no $schema is needed at all.
    const readme = read('README.md');
    const section = readme.slice(readme.indexOf('## Configuration'));
    for (const [name, text] of [['samples/loudword.json', read('samples/loudword.json')], ['README example', /```jsonc?\n([\s\S]*?)```/.exec(section)![1]!]] as const) {
      assert.doesNotMatch(text, /"\$schema"/, name);
      assert.doesNotThrow(() => parseSettings(text, name));
    }
    const pkg = JSON.parse(read('package.json')) as { contributes: { jsonValidation: Array<{ fileMatch: string; url: string }> } };
    assert.deepEqual(pkg.contributes.jsonValidation, [{ fileMatch: 'loudword.json', url: './loudword.schema.json' }]);
    assert.doesNotMatch(read('extension/src/host/open-config.ts'), /\$schema:/);
  });
});
