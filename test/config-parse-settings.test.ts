import assert from 'node:assert/strict';
import { parseSettings } from '../extension/src/engine/config/parse-settings';
import { checkSettings, expected, schemaAt } from '../extension/src/engine/config/settings-schema';
import { UserError } from '../extension/src/engine/user-error';

/** The parser builds objects without a prototype (a "__proto__" key stays a key); compare plainly. */
const plain = (v: unknown): unknown => JSON.parse(JSON.stringify(v));

function userError(fn: () => unknown, file: string | null, line: number | null, words: RegExp): void {
  assert.throws(fn, (e: unknown) => {
    assert.ok(e instanceof UserError, `expected UserError, got ${String(e)}`);
    assert.equal(e.file, file);
    assert.equal(e.line, line, `line of: ${e.message}`);
    assert.match(e.message, words);
    return true;
  });
}

describe('parseSettings', () => {
  it('parseSettings accepts a partial file with $schema and nested keys', () => {
    const s = parseSettings('{\n  "$schema": "./loudword.schema.json",\n  "text": "body",\n  "tokens": { "stem": true },\n  "prune": { "maxDf": 0.5 }\n}', 'loudword.json');
    assert.deepEqual(plain(s), { text: 'body', tokens: { stem: true }, prune: { maxDf: 0.5 } });
  });

  it('parseSettings accepts a UTF-8 BOM and keeps its lines (Unicode 15 §23.8: U+FEFF at the start is a signature)', () => {
    assert.deepEqual(plain(parseSettings('\uFEFF{"text": "body"}', 'c.json')), { text: 'body' });
    userError(() => parseSettings('\uFEFF{\n  "text": 3\n}', 'c.json'), 'c.json', 2, /"text" must be a non-empty string or null, got 3/);
  });

  it('parseSettings accepts // and /* */ comments, as VS Code does in its own settings (jsonc)', () => {
    assert.deepEqual(plain(parseSettings('// project config\n{\n  /* sample */ "sample": { "k": 5 } // fewer neighbours\n}', 'c.json')), { sample: { k: 5 } });
  });

  it('parseSettings: a JSON syntax error names the file and line (RFC 8259 grammar)', () => {
    userError(() => parseSettings('{\n  "text": "body",\n  "label": \n}', 'cfg.json'), 'cfg.json', 4, /syntax error.*expected a value/);
    userError(() => parseSettings('{\n  "text": "body",\n}', 'cfg.json'), 'cfg.json', 3, /trailing comma/);
    userError(() => parseSettings('{"k": [1, 2,\n]}', 'cfg.json'), 'cfg.json', 2, /trailing comma/);
    userError(() => parseSettings('{\r\n  "text": "body"\r\n  "label": "x"\r\n}', 'cfg.json'), 'cfg.json', 3, /expected ','/);
    userError(() => parseSettings('', 'cfg.json'), 'cfg.json', 1, /empty/);
    userError(() => parseSettings('  \n', 'cfg.json'), 'cfg.json', 1, /empty/);
    userError(() => parseSettings('{"a": "unterminated\n}', 'cfg.json'), 'cfg.json', 1, /string/);
    userError(() => parseSettings('{"text": "a"} x', 'cfg.json'), 'cfg.json', 1, /unexpected 'x'/);
    userError(() => parseSettings('{"text": "a"} {}', 'cfg.json'), 'cfg.json', 1, /after the end/);
    userError(() => parseSettings('{\n"text": "a" /* open', 'cfg.json'), 'cfg.json', 2, /comment is never closed/);
  });

  it('parseSettings: 10,000-deep nesting is one clear error, not a stack overflow (issue 13 case)', () => {
    const deep = '{"suggest":' + '['.repeat(10_000) + ']'.repeat(10_000) + '}';
    userError(() => parseSettings(deep, 'cfg.json'), 'cfg.json', 1, /nested more than 32 levels/);
    const deepLines = '{\n"a":\n' + '{"b":\n'.repeat(40) + '1' + '}'.repeat(41);
    userError(() => parseSettings(deepLines, 'cfg.json'), 'cfg.json', 34, /nested more than 32 levels/);
  });

  it('parseSettings: duplicate keys are refused at the second one (RFC 8259 §4 leaves them undefined)', () => {
    userError(() => parseSettings('{"text": "a",\n "text": "b"}', 'c.json'), 'c.json', 2, /duplicate key "text"/);
    userError(() => parseSettings('{"sample": {"k": 1,\n\n "k": 2}}', 'c.json'), 'c.json', 3, /duplicate key "sample.k"/);
  });

  it('parseSettings: an unknown key is named with its line and the keys known there', () => {
    userError(() => parseSettings('{\n  "txet": "body"\n}', 'cfg.json'), 'cfg.json', 2, /unknown setting "txet"; known here: format, text, label/);
    userError(() => parseSettings('{\n  "tokens": {\n    "lowercase": true,\n    "stemming": true\n  }\n}', 'cfg.json'), 'cfg.json', 4, /unknown setting "tokens.stemming"; known here: tokens.lowercase/);
  });

  it('parseSettings: wrong types and out-of-range values name the key, what it expects and the line', () => {
    userError(() => parseSettings('{\n "sample": {\n  "k": "ten"\n }\n}', 'c.json'), 'c.json', 3, /^"sample.k" must be an integer from 1 to 100, got "ten"$/);
    userError(() => parseSettings('{"sample": {"documents": 5}}', 'c.json'), 'c.json', 1, /"sample.documents" must be an integer from 10 to 50000, got 5/);
    userError(() => parseSettings('{"format": "xlsx"}', 'c.json'), 'c.json', 1, /"format" must be one of "auto", "csv", "tsv", "jsonl", "json", "text", "parquet", "files", got "xlsx"/);
    userError(() => parseSettings('{"tokens": {"kinds": [\n"word",\n "words"]}}', 'c.json'), 'c.json', 3, /"tokens.kinds"\[1\] must be one of "word"/);
    userError(() => parseSettings('{"tokens": {"kinds": ["word", "word"]}}', 'c.json'), 'c.json', 1, /"tokens.kinds" lists "word" twice/);
    userError(() => parseSettings('{"tokens": {"kinds": []}}', 'c.json'), 'c.json', 1, /"tokens.kinds" must be a non-empty list of "word", "number"/);
    userError(() => parseSettings('{"prune": {"minDf": 1.5}}', 'c.json'), 'c.json', 1, /"prune.minDf" must be an integer ≥ 1 or a number above 0 and below 1, got 1.5/);
    userError(() => parseSettings('{"prune": {"maxDf": 0}}', 'c.json'), 'c.json', 1, /"prune.maxDf" must be a number above 0 and up to 1 or an integer ≥ 2, got 0/);
    userError(() => parseSettings('{"tokens": true}', 'c.json'), 'c.json', 1, /"tokens" must be an object, got true/);
    userError(() => parseSettings('{"suggest": {"protect": ["not", " "]}}', 'c.json'), 'c.json', 1, /"suggest.protect"\[1\] must be a non-empty string, got " "/);
    userError(() => parseSettings('{"text": ""}', 'c.json'), 'c.json', 1, /"text" must be a non-empty string or null, got ""/);
    userError(() => parseSettings('[1]', 'c.json'), 'c.json', 1, /the settings must be an object, got a list/);
  });

  it('parseSettings: the inclusive and exclusive bounds of the schema hold exactly (JSON Schema draft-07 §6.2)', () => {
    assert.deepEqual(plain(parseSettings('{"sample": {"k": 100, "documents": 50000}}', 'c.json')), { sample: { k: 100, documents: 50000 } });
    userError(() => parseSettings('{"sample": {"k": 101}}', 'c.json'), 'c.json', 1, /sample.k/);
    assert.deepEqual(plain(parseSettings('{"prune": {"maxDf": 1, "minDf": 0.999}}', 'c.json')), { prune: { maxDf: 1, minDf: 0.999 } });
    userError(() => parseSettings('{"prune": {"minDf": 0}}', 'c.json'), 'c.json', 1, /prune.minDf/);
  });
});

describe('checkSettings', () => {
  it('checkSettings words the setting with the caller’s name (a flag, an editor setting)', () => {
    const problem = checkSettings({ sample: { k: 1000 } }, (p) => (p.join('.') === 'sample.k' ? '--k' : '?'));
    assert.deepEqual(problem, { path: ['sample', 'k'], message: '--k must be an integer from 1 to 100, got 1000' });
    assert.equal(checkSettings({ sample: { k: 100 } }), null);
  });

  it('expected() words every leaf of the schema without falling back to "a valid value"', () => {
    const walk = (path: string[]): void => {
      const node = schemaAt(path)!;
      if (node.properties !== undefined) for (const k of Object.keys(node.properties)) walk([...path, k]);
      else assert.doesNotMatch(expected(node), /valid value/, path.join('.'));
    };
    walk([]);
  });
});
