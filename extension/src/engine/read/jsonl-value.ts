/**
 * Reads one JSON Lines line (jsonlines.org: each line is one JSON value, UTF-8). A document must
 * be an object; its text and label are strings, numbers or booleans (converted to text).
 */
export type JsonlLine =
  | { ok: true; object: Record<string, unknown> }
  | { ok: false; reason: string; brokenJson: boolean };

export function parseJsonlLine(text: string): JsonlLine {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    return { ok: false, reason: `not valid JSON (${shorten((e as Error).message)})`, brokenJson: true };
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    return { ok: false, reason: `a JSON ${describe(value)}, not an object`, brokenJson: false };
  }
  return { ok: true, object: value as Record<string, unknown> };
}

/** A field's value as document text, or why it cannot be one. */
export function scalarText(value: unknown): { text: string } | { reason: string } {
  if (typeof value === 'string') return { text: value };
  if (typeof value === 'number' || typeof value === 'boolean') return { text: String(value) };
  if (value === null || value === undefined) return { reason: value === null ? 'is null' : 'is missing' };
  return { reason: `is ${Array.isArray(value) ? 'an array' : 'an object'}; nested values are not supported` };
}

function describe(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'array';
  return typeof value;
}

function shorten(message: string): string {
  return message.length > 120 ? message.slice(0, 117) + '...' : message;
}
