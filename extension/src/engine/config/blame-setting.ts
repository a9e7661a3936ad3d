import type { EffectiveSettings, SettingsProvenance } from '../../protocol';
import { UserError } from '../user-error';

/**
 * Rewrites an input error about a setting ("no label field "topic"") so it points at where the
 * setting was given: a parent folder's loudword.json and its line, a flag, an editor setting.
 * A setting left at its default, or an error about no setting, is returned unchanged.
 */
export function blameSetting(error: unknown, settings: EffectiveSettings, sources: SettingsProvenance['sources']): unknown {
  if (!(error instanceof UserError) || error.setting === null) return error;
  const source = sources[error.setting];
  if (source === undefined) return error;
  const value = (settings as unknown as Record<string, unknown>)[error.setting];
  const missing = /^no \w+ field "(?:[^"\\]|\\.)*"(.*)$/s.exec(error.message);
  const what = missing !== null ? `no such field in ${error.file ?? 'the corpus'}${missing[1]}` : error.describe();
  if (source.from === 'loudword.json') {
    const at = /^(.*):(\d+)$/.exec(source.where);
    const file = at !== null ? at[1]! : source.where;
    const line = at !== null ? Number(at[2]) : null;
    return new UserError(`${error.setting} ${JSON.stringify(value)}: ${what}`, file, line, error.setting);
  }
  return new UserError(`${source.where} ${JSON.stringify(value)} (${source.from}): ${what}`, error.file, error.line, error.setting);
}
