import type { EffectiveSettings } from '../../protocol';
import { UserError } from '../user-error';
import { JsonSyntaxError, parseJsonWithPositions } from './json-with-positions';
import { checkSettings } from './settings-schema';

/** loudword.json as written: any key may be left out, nested objects too. */
export type PartialSettings = {
  [K in keyof EffectiveSettings]?: EffectiveSettings[K] extends readonly unknown[] | null | string | number | boolean
    ? EffectiveSettings[K]
    : Partial<EffectiveSettings[K]>;
};

export interface ParsedSettings {
  settings: PartialSettings;
  /** 1-based line of a key ("sample", "k"), for messages about a value found valid here but wrong later. */
  lineOf(path: ReadonlyArray<string | number>): number | null;
}

/**
 * Parses and checks the text of a loudword.json against loudword.schema.json. Syntax errors,
 * unknown keys and wrong values become UserErrors with the file and the line of the key.
 * "$schema" is accepted and dropped.
 */
export function parseSettingsWithLines(jsonText: string, file: string): ParsedSettings {
  let parsed;
  try {
    parsed = parseJsonWithPositions(jsonText);
  } catch (e) {
    if (e instanceof JsonSyntaxError) throw new UserError(`JSON syntax error at column ${e.column}: ${e.message}`, file, e.line);
    throw e;
  }
  const problem = checkSettings(parsed.value);
  if (problem !== null) throw new UserError(problem.message, file, parsed.lineOf(problem.path));
  const { $schema: _schema, ...settings } = parsed.value as Record<string, unknown>;
  void _schema;
  return { settings: settings as PartialSettings, lineOf: parsed.lineOf };
}

export function parseSettings(jsonText: string, file: string): PartialSettings {
  return parseSettingsWithLines(jsonText, file).settings;
}
