import { readRegularFile } from '../read/regular-file';
import * as path from 'node:path';
import type { EffectiveSettings } from '../../protocol';
import type { SettingsOverrides } from './settings-overrides';
import { UserError } from '../user-error';
import { DEFAULT_SETTINGS } from './default-settings';
import { mergeSettings } from './merge-settings';
import { parseSettings, type PartialSettings } from './parse-settings';
import { checkSettings } from './settings-schema';
import { confineConfigPath, isWithin, realPathAllowingMissing } from './confine-to-workspace';

/** A config is a few hundred bytes; past this it is not a config (common practice, no source). */
export const MAX_CONFIG_BYTES = 1024 * 1024;

export interface LoadedSettings {
  settings: EffectiveSettings;
  /** The folder of loudword.json (relative settings paths start there), or null without one. */
  configDir: string | null;
  /** settings.stopList as an absolute path, or null when no stop list is set. */
  stopListPath: string | null;
}

/**
 * Defaults, then loudword.json, then overrides (command line or editor) win. A stopList given
 * as an override is resolved against `baseDir` (default: the working directory) and returned
 * absolute; one from loudword.json stays as written and is relative to the config's folder.
 */
export async function loadSettings(
  configPath: string | null,
  overrides: SettingsOverrides = {},
  options: { baseDir?: string; projectRoot?: string | null } = {},
): Promise<LoadedSettings> {
  const baseDir = path.resolve(options.baseDir ?? process.cwd());
  let fromFile: PartialSettings = {};
  let configDir: string | null = null;
  let origin = '(overrides)';
  let configText: string | null = null;
  if (configPath !== null) {
    const file = path.resolve(baseDir, configPath);
    let text: string;
    try {
      // Regular files only, size checked first (a FIFO used to block forever): safety hook.
      text = (await readRegularFile(file, 'the config file', MAX_CONFIG_BYTES)).bytes.toString('utf8');
    } catch (e) {
      if (e instanceof UserError) throw e;
      const code = (e as NodeJS.ErrnoException).code;
      throw new UserError(code === 'ENOENT' ? 'config file not found' : `cannot read the config file (${code ?? (e as Error).message})`, file, null);
    }
    fromFile = parseSettings(text, file);
    configText = text;
    configDir = path.dirname(file);
    origin = file;
  }

  const layer = overridesLayer(overrides, baseDir);
  const problem = checkSettings(layer);
  if (problem !== null) throw new UserError(problem.message, '(overrides)', null);
  const settings = mergeSettings(DEFAULT_SETTINGS, fromFile, layer);
  if (settings.sample.k >= settings.sample.documents) {
    throw new UserError(`"sample.k" (${settings.sample.k}) must be smaller than "sample.documents" (${settings.sample.documents})`, origin, null);
  }
  // A stop list named by loudword.json must stay inside the project (confine-to-workspace.ts).
  if (configDir !== null && layer.stopList === undefined && typeof fromFile.stopList === 'string') {
    confineConfigPath(origin, configText, 'stopList', fromFile.stopList, projectFolder(configDir, options.projectRoot));
  }
  const stopListPath = settings.stopList === null ? null : path.resolve(configDir ?? baseDir, settings.stopList);
  return { settings, configDir, stopListPath };
}

/** The workspace when the config lies inside it (the editor), else the config's own folder. */
function projectFolder(configDir: string, projectRoot: string | null | undefined): string {
  if (projectRoot == null) return configDir;
  return isWithin(realPathAllowingMissing(projectRoot), realPathAllowingMissing(configDir)) ? path.resolve(projectRoot) : configDir;
}

function overridesLayer(overrides: SettingsOverrides, baseDir: string): PartialSettings {
  const layer: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(overrides)) if (value !== undefined) layer[key] = value;
  if (typeof layer.stopList === 'string' && layer.stopList !== '') layer.stopList = path.resolve(baseDir, layer.stopList);
  if (overrides.sample !== undefined) {
    const sample: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(overrides.sample)) if (v !== undefined) sample[k] = v;
    layer.sample = sample;
  }
  return layer as PartialSettings;
}
