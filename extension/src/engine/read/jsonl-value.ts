/**
 * Reads one JSON Lines line (jsonlines.org: each line is one JSON value, UTF-8). A document must
 * be an object; its text and label are strings, numbers or booleans (converted to text).
 */
export type JsonlLine =
  | { ok: true; object: Record<string, unknown> }
  | { ok: false; reason: string; brokenJson: boolean };

export function parseJsonlLine(text: string): JsonlLine {
  const parsed = parseJsonValue(text);
  if (!parsed.ok) return parsed;
  const { value } = parsed;
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    return { ok: false, reason: `a JSON ${describeJson(value)}, not an object`, brokenJson: false };
  }
  return { ok: true, object: value as Record<string, unknown> };
}

/** One JSON value (a line, an array's element), or why it is not valid JSON. */
export function parseJsonValue(text: string): { ok: true; value: unknown } | { ok: false; reason: string; brokenJson: true } {
  try {
    return { ok: true, value: JSON.parse(text) as unknown };
  } catch (e) {
    return { ok: false, reason: `not valid JSON (${shorten((e as Error).message)})`, brokenJson: true };
  }
}

/** How deep dotted keys reach into nested objects ("meta.topic", "doc.body.text"). */
export const MAX_KEY_DEPTH = 3;

/**
 * A record's value at `key`: its own key of that name, or else, for a dotted key, the path
 * through nested objects ({"meta": {"topic": "x"}} has "meta.topic"). Own keys only at every step:
 * a record without "constructor" must not read Object.prototype's.
 */
export function valueAt(record: Record<string, unknown>, key: string): unknown {
  if (Object.hasOwn(record, key)) return record[key];
  let value: unknown = record;
  for (const part of key.split('.')) {
    if (typeof value !== 'object' || value === null || Array.isArray(value) || !Object.hasOwn(value, part)) return undefined;
    value = (value as Record<string, unknown>)[part];
  }
  return value;
}

/**
 * A record's fields as dotted keys: each top-level key, and the keys of nested objects (not of
 * arrays) down to MAX_KEY_DEPTH, so that the text and label settings, the text field's detection
 * and the column picker can name "meta.topic".
 */
export function flattenRecord(record: Record<string, unknown>, into: Map<string, unknown> = new Map(), prefix = '', depth = 1): Map<string, unknown> {
  for (const [k, v] of Object.entries(record)) {
    const key = prefix === '' ? k : `${prefix}.${k}`;
    into.set(key, v);
    if (depth < MAX_KEY_DEPTH && typeof v === 'object' && v !== null && !Array.isArray(v)) flattenRecord(v as Record<string, unknown>, into, key, depth + 1);
  }
  return into;
}

/** A field's value as document text, or why it cannot be one. */
export function scalarText(value: unknown): { text: string } | { reason: string } {
  if (typeof value === 'string') return { text: value };
  if (typeof value === 'number' || typeof value === 'boolean') return { text: String(value) };
  if (value === null || value === undefined) return { reason: value === null ? 'is null' : 'is missing' };
  return { reason: Array.isArray(value) ? 'is an array, not text' : 'is an object, not text: name one of its keys with a dot ("field.key")' };
}

/**
 * A text field's value as document text: a scalar as scalarText reads it, or a list of strings
 * (a document kept as its sentences, paragraphs or tokens, as many NLP data sets hold it) as its
 * strings joined by line breaks, which tokenise as the strings do one by one.
 */
export function documentText(value: unknown): { text: string } | { reason: string } {
  if (isStringList(value)) return { text: value.join('\n') };
  if (Array.isArray(value)) return { reason: value.length === 0 ? 'is an empty list' : 'is a list that holds more than strings, not text' };
  return scalarText(value);
}

/** A non-empty array whose elements are all strings. */
export function isStringList(value: unknown): value is string[] {
  return Array.isArray(value) && value.length > 0 && value.every((v) => typeof v === 'string');
}

/** A JSON value's kind as a message names it: null, array, number, string, … */
export function describeJson(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'array';
  return typeof value;
}

function shorten(message: string): string {
  return message.length > 120 ? message.slice(0, 117) + '...' : message;
}
