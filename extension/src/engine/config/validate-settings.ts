import { UserError } from '../user-error';
import type { SettingSpec } from './settings-spec';

/** Where a value came from, for messages: the file and the line of each key when known. */
export interface SettingsOrigin {
  file: string;
  keyLines?: ReadonlyMap<string, number>;
}

/**
 * Checks a (partial) settings value against the spec and throws a UserError naming the first
 * wrong key, what it expects, and the key's line. Objects may leave keys out (defaults fill
 * them); unknown keys are refused, except "$schema" at the top.
 */
export function validateSettings(value: unknown, spec: SettingSpec, origin: SettingsOrigin, path = ''): void {
  const fail = (message: string, at = path): never => {
    throw new UserError(message, origin.file, lineOf(origin, at));
  };
  const name = path === '' ? 'the settings' : `"${path}"`;
  switch (spec.kind) {
    case 'object': {
      if (typeof value !== 'object' || value === null || Array.isArray(value)) return fail(`${name} must be an object, got ${describe(value)}`);
      for (const [key, child] of Object.entries(value)) {
        const childPath = path === '' ? key : `${path}.${key}`;
        if (path === '' && key === '$schema') {
          if (typeof child !== 'string') fail('"$schema" must be a string', childPath);
          continue;
        }
        const childSpec = spec.properties[key];
        if (childSpec === undefined) {
          const known = Object.keys(spec.properties).map((k) => (path === '' ? k : `${path}.${k}`));
          fail(`unknown setting "${childPath}"; known here: ${known.join(', ')}`, childPath);
        } else validateSettings(child, childSpec, origin, childPath);
      }
      return;
    }
    case 'enum':
      if (!spec.values.includes(value as string | number)) fail(`${name} must be one of ${spec.values.map((v) => JSON.stringify(v)).join(', ')}, got ${JSON.stringify(value)}`);
      return;
    case 'string':
      if (value === null && spec.nullable) return;
      if (typeof value !== 'string' || value === '') fail(`${name} must be a non-empty string${spec.nullable ? ' or null' : ''}, got ${describe(value)}`);
      return;
    case 'boolean':
      if (typeof value !== 'boolean') fail(`${name} must be true or false, got ${describe(value)}`);
      return;
    case 'integer':
      if (typeof value !== 'number' || !Number.isInteger(value) || value < spec.minimum || value > spec.maximum) {
        fail(`${name} must be an integer from ${spec.minimum} to ${spec.maximum}, got ${describe(value)}`);
      }
      return;
    case 'df': {
      const upper = spec.fractionMaximumInclusive ? 'up to 1' : 'below 1';
      const ok =
        typeof value === 'number' &&
        Number.isFinite(value) &&
        ((Number.isInteger(value) && value >= spec.countMinimum) || (value > 0 && (spec.fractionMaximumInclusive ? value <= 1 : value < 1)));
      if (!ok) fail(`${name} must be a document count (an integer ≥ ${spec.countMinimum}) or a fraction of the documents (above 0, ${upper}), got ${describe(value)}`);
      return;
    }
    case 'enumList':
      if (!Array.isArray(value) || value.length === 0) return fail(`${name} must be a non-empty list, got ${describe(value)}`);
      value.forEach((item, i) => {
        if (!spec.values.includes(item as string)) fail(`${name}[${i}] must be one of ${spec.values.map((v) => `"${v}"`).join(', ')}, got ${JSON.stringify(item)}`);
        if (value.indexOf(item) !== i) fail(`${name} lists ${JSON.stringify(item)} twice`);
      });
      return;
    case 'stringList':
      if (!Array.isArray(value)) return fail(`${name} must be a list of strings, got ${describe(value)}`);
      value.forEach((item, i) => {
        if (typeof item !== 'string' || item.trim() === '') fail(`${name}[${i}] must be a non-empty string, got ${describe(item)}`);
      });
      return;
  }
}

function lineOf(origin: SettingsOrigin, path: string): number | null {
  // Array items have no key line of their own: report the list's key.
  const key = path.replace(/\[\d+\]$/, '');
  return origin.keyLines?.get(key) ?? null;
}

function describe(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'an object';
  if (typeof value === 'string') return JSON.stringify(value.length > 40 ? value.slice(0, 37) + '...' : value);
  return String(value);
}
