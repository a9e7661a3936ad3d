// Which editor settings reach a review, as a layer the engine puts below loudword.json. Where
// the config and stop list are is the engine's rule (engine/config/find-config.ts), shared with
// the CLI. Node's path only, so it is unit-tested without the editor.
import * as path from 'node:path';
import type { SettingsLayer } from '../../engine/config/load-settings';
import type { SettingsOverrides } from '../../engine/config/settings-overrides';

export { CONFIG_FILE_NAME, isInsideFolder } from '../../engine/config/find-config';

/** The VS Code settings that stand in for loudword.json keys (see package.json), where the user set them. */
export interface EditorDefaults {
  sampleSize?: number | undefined;
  neighbors?: number | undefined;
  stopListFile?: string | undefined;
}

/** "sample.k" → "loudword.neighbors": how messages and Report.provenance name an editor setting. */
export const EDITOR_SETTING_OF: Readonly<Record<string, string>> = {
  'sample.documents': 'loudword.sampleSize',
  'sample.k': 'loudword.neighbors',
  stopList: 'loudword.stopListFile',
};

/**
 * The editor settings the user set, as the layer below loudword.json: each reaches the review
 * only where loudword.json says nothing, so a project's committed config gives the same figures
 * in the editor and in CI. A setting left at its default is not passed at all, so the engine's
 * own default applies (the stop list beside the config, as on the command line). A relative
 * stop list file is made absolute against `baseDir` (the workspace folder).
 */
export function editorSettingsLayer(editor: EditorDefaults, baseDir: string): SettingsLayer {
  const values: SettingsOverrides = {};
  const sample: NonNullable<SettingsOverrides['sample']> = {};
  if (editor.sampleSize !== undefined) sample.documents = editor.sampleSize;
  if (editor.neighbors !== undefined) sample.k = editor.neighbors;
  if (Object.keys(sample).length > 0) values.sample = sample;
  const stop = editor.stopListFile?.trim();
  if (stop !== undefined && stop !== '') values.stopList = path.resolve(baseDir, stop);
  return { values, from: 'editor setting', names: EDITOR_SETTING_OF };
}
