import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { ValidateFunction } from 'ajv';
import schemaJson from '../../../../loudword.schema.json';

/** A node of loudword.schema.json (JSON Schema draft-07), as far as this module reads it. */
export interface SchemaNode {
  type?: string | string[];
  enum?: ReadonlyArray<string | number>;
  anyOf?: SchemaNode[];
  properties?: Record<string, SchemaNode>;
  items?: SchemaNode;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minLength?: number;
  minItems?: number;
  pattern?: string;
  default?: unknown;
  description?: string;
}

/**
 * loudword.schema.json is the one statement of the settings rules: the editor reads it for
 * completion (package.json jsonValidation), the engine validates with it here, and the CLI
 * takes its flag bounds from it.
 */
export const SETTINGS_SCHEMA = schemaJson as unknown as SchemaNode;

let compiled: ValidateFunction | null = null;

/**
 * The compiled schema, on first use: `loudword --help`, `--version` and a command-line mistake
 * need none. The build writes it beside the bundles (scripts/settings-validator.mjs, ajv's
 * standalone code for the same schema and options), since loading ajv and compiling the schema
 * cost ~0.1 s of CPU at every review's start, before the first document could be tokenised;
 * running from source (tests), ajv compiles it here.
 */
function validator(): ValidateFunction {
  if (compiled === null) {
    const built = join(__dirname, 'settings-validator.js');
    compiled = existsSync(built) ? (require(built) as ValidateFunction) : compileSettingsSchema();
  }
  return compiled;
}

/** loudword.schema.json compiled by ajv, with the options the build's standalone validator uses. */
export function compileSettingsSchema(): ValidateFunction {
  const Ajv = (require('ajv') as typeof import('ajv')).default;
  // allowUnionTypes: "type": ["string", "null"] is how the schema says "or null".
  return new Ajv({ allowUnionTypes: true }).compile(schemaJson);
}

/** One thing wrong with a settings value: where (keys and item indexes) and what, in words. */
export interface SettingsProblem {
  path: ReadonlyArray<string | number>;
  message: string;
}

/** The schema node that describes the value at `path`, or null where the schema has none. */
export function schemaAt(path: ReadonlyArray<string | number>): SchemaNode | null {
  let node: SchemaNode | undefined = SETTINGS_SCHEMA;
  for (const key of path) {
    node = typeof key === 'number' ? node?.items : node?.properties?.[key];
    if (node === undefined) return null;
  }
  return node ?? null;
}

/** "sample.k", or "tokens.kinds"[1] for a list item. */
export function settingName(path: ReadonlyArray<string | number>): string {
  const keys = path.filter((p): p is string => typeof p === 'string').join('.');
  const items = path.filter((p): p is number => typeof p === 'number').map((i) => `[${i}]`).join('');
  return path.length === 0 ? 'the settings' : `"${keys}"${items}`;
}

/**
 * The first problem with a (partial) settings value, or null when the schema accepts it.
 * `name` words the setting for the message (a key, a command-line flag, an editor setting).
 */
export function checkSettings(value: unknown, name: (path: ReadonlyArray<string | number>) => string = settingName): SettingsProblem | null {
  const validate = validator();
  if (validate(value)) return null;
  // Ajv stops at the first failing keyword; for anyOf it lists each branch, then the anyOf itself.
  const error = validate.errors![validate.errors!.length - 1]!;
  const path = error.instancePath === '' ? [] : error.instancePath.slice(1).split('/').map(decodePointer);
  const at = valueAt(value, path);
  switch (error.keyword) {
    case 'additionalProperties': {
      const key = (error.params as { additionalProperty: string }).additionalProperty;
      const prefix = path.length === 0 ? '' : `${path.join('.')}.`;
      const known = Object.keys(schemaAt(path)?.properties ?? {}).filter((k) => k !== '$schema').map((k) => prefix + k);
      return { path: [...path, key], message: `unknown setting "${prefix}${key}"; known here: ${known.join(', ')}` };
    }
    case 'uniqueItems': {
      const { i } = error.params as { i: number; j: number };
      return { path: [...path, i], message: `${name(path)} lists ${JSON.stringify((at as unknown[])[i])} twice` };
    }
    default:
      return { path, message: `${name(path)} must be ${expected(schemaAt(path) ?? {})}, got ${describeValue(at)}` };
  }
}

/** What a schema node accepts, in words: "an integer from 1 to 100", "one of "l2", "l1"". */
export function expected(s: SchemaNode): string {
  if (s.anyOf !== undefined) return s.anyOf.map(expected).join(' or ');
  if (s.enum !== undefined) return `one of ${s.enum.map((v) => JSON.stringify(v)).join(', ')}`;
  const types = s.type === undefined ? [] : Array.isArray(s.type) ? s.type : [s.type];
  const words = types.filter((t) => t !== 'null').map((t) => typeWords(t, s));
  if (types.includes('null')) words.push('null');
  return words.join(' or ') || 'a valid value';
}

function typeWords(type: string, s: SchemaNode): string {
  switch (type) {
    case 'integer':
      return `an integer${range(s)}`;
    case 'number':
      return `a number${range(s)}`;
    case 'string':
      return s.pattern !== undefined || (s.minLength ?? 0) > 0 ? 'a non-empty string' : 'a string';
    case 'boolean':
      return 'true or false';
    case 'array': {
      const list = (s.minItems ?? 0) > 0 ? 'a non-empty list' : 'a list';
      return s.items === undefined ? list : `${list} of ${plural(expected(s.items))}`;
    }
    case 'object':
      return 'an object';
    default:
      return type;
  }
}

function plural(itemWords: string): string {
  if (itemWords.startsWith('one of ')) return itemWords.slice('one of '.length);
  return itemWords.replace(/^an? (\S+)/, '$1s');
}

function range(s: SchemaNode): string {
  const low = s.minimum !== undefined ? { v: s.minimum, incl: true } : s.exclusiveMinimum !== undefined ? { v: s.exclusiveMinimum, incl: false } : null;
  const high = s.maximum !== undefined ? { v: s.maximum, incl: true } : s.exclusiveMaximum !== undefined ? { v: s.exclusiveMaximum, incl: false } : null;
  if (low?.incl && high?.incl) return ` from ${low.v} to ${high.v}`;
  const parts: string[] = [];
  if (low !== null) parts.push(low.incl ? `≥ ${low.v}` : `above ${low.v}`);
  if (high !== null) parts.push(high.incl ? `up to ${high.v}` : `below ${high.v}`);
  return parts.length === 0 ? '' : ` ${parts.join(' and ')}`;
}

function decodePointer(segment: string): string | number {
  const key = segment.replace(/~1/g, '/').replace(/~0/g, '~');
  return /^\d+$/.test(key) ? Number(key) : key;
}

function valueAt(value: unknown, path: ReadonlyArray<string | number>): unknown {
  let v = value;
  for (const key of path) v = (v as Record<string | number, unknown> | null)?.[key];
  return v;
}

/** A value as a message shows it: short strings quoted, containers named. */
export function describeValue(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'an object';
  if (typeof value === 'string') return JSON.stringify(value.length > 40 ? value.slice(0, 37) + '...' : value);
  return String(value);
}
