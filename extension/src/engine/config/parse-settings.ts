import type { EffectiveSettings } from '../../protocol';
import { UserError } from '../user-error';
import { JsonSyntaxError, parseJsonWithLines } from './json-with-lines';
import { SETTINGS_SPEC } from './settings-spec';
import { validateSettings } from './validate-settings';

/** loudword.json as written: any key may be left out, nested objects too. */
export type PartialSettings = {
  [K in keyof EffectiveSettings]?: EffectiveSettings[K] extends readonly unknown[] | null | string | number | boolean
    ? EffectiveSettings[K]
    : Partial<EffectiveSettings[K]>;
};

/**
 * Parses and checks the text of a loudword.json. Syntax errors, unknown keys and wrong types
 * become UserErrors with the file and line. "$schema" is accepted and dropped.
 */
export function parseSettings(jsonText: string, file: string): PartialSettings {
  let parsed;
  try {
    parsed = parseJsonWithLines(jsonText);
  } catch (e) {
    if (e instanceof JsonSyntaxError) throw new UserError(`JSON syntax error at column ${e.column}: ${e.message}`, file, e.line);
    throw e;
  }
  validateSettings(parsed.value, SETTINGS_SPEC, { file, keyLines: parsed.keyLines });
  const { $schema: _schema, ...settings } = parsed.value as Record<string, unknown>;
  void _schema;
  return settings as PartialSettings;
}
