import { readRegularFile } from '../read/regular-file';
import * as path from 'node:path';
import type { EffectiveSettings, SettingSourceKind, SettingsProvenance } from '../../protocol';
import type { SettingsOverrides } from './settings-overrides';
import { UserError } from '../user-error';
import { DEFAULT_SETTINGS } from './default-settings';
import { mergeSettings } from './merge-settings';
import { parseSettingsWithLines, type PartialSettings } from './parse-settings';
import { checkSettings } from './settings-schema';
import { confineConfigPath, isWithin, realPathAllowingMissing } from './confine-to-workspace';

/** A config is a few hundred bytes; past this it is not a config (common practice, no source). */
export const MAX_CONFIG_BYTES = 1024 * 1024;

export interface LoadedSettings {
  settings: EffectiveSettings;
  /** The folder of loudword.json (relative settings paths start there), or null without one. */
  configDir: string | null;
  /** The stop list file as an absolute path, or null when no stop list is set. */
  stopListPath: string | null;
  /** Where each setting not at its default came from (Report.provenance.sources). */
  sources: SettingsProvenance['sources'];
}

/** A layer of settings from outside loudword.json, and what its keys are called there. */
export interface SettingsLayer {
  values: SettingsOverrides;
  from: Exclude<SettingSourceKind, 'default' | 'loudword.json'>;
  /** "sample.k" → "--k" or "loudword.neighbors"; a key without a name is called by its own. */
  names?: Readonly<Record<string, string>>;
}

export interface LoadOptions {
  /** Where a relative stopList of a layer starts (default: the working directory). */
  baseDir?: string;
  /** The corpus: without a config, the default stop list lies beside it. */
  corpusFile?: string;
  /** Editor settings standing in for loudword.json keys: above the defaults, below the config. */
  editor?: SettingsLayer;
  /**
   * The workspace folder in the editor: paths loudword.json names must stay inside it. Without
   * it (the CLI) they must stay inside the config's own folder.
   */
  projectRoot?: string | null;
  /** Who gives `overrides` (default: command-line flags) and their names. */
  overridesFrom?: Omit<SettingsLayer, 'values'>;
}

/**
 * Defaults, then the editor's settings, then loudword.json, then overrides (command-line flags)
 * win. The stop list resolves against the folder of whoever named it: a flag's against the
 * working directory, an editor setting's as the host made it (absolute), loudword.json's
 * against the config's folder, and the default `stoplist.txt` against the config's folder, or
 * the corpus's folder without a config.
 */
export async function loadSettings(configPath: string | null, overrides: SettingsOverrides = {}, options: LoadOptions = {}): Promise<LoadedSettings> {
  const baseDir = path.resolve(options.baseDir ?? process.cwd());
  const sources: LoadedSettings['sources'] = {};
  const layers: PartialSettings[] = [];

  const addLayer = (layer: SettingsLayer): void => {
    const values = layerValues(layer.values, baseDir);
    const name = (p: ReadonlyArray<string | number>): string => layer.names?.[p.filter((k) => typeof k === 'string').join('.')] ?? `"${p.join('.')}"`;
    const problem = checkSettings(values, name);
    if (problem !== null) throw new UserError(`${problem.message} (${layer.from})`, null, null);
    for (const key of leafKeys(values)) sources[key] = { from: layer.from, where: layer.names?.[key] ?? key };
    layers.push(values);
  };

  if (options.editor !== undefined) addLayer(options.editor);

  let configDir: string | null = null;
  let lineOf: ((p: readonly string[]) => number | null) | null = null;
  let file: string | null = null;
  let configText: string | null = null;
  if (configPath !== null) {
    file = path.resolve(baseDir, configPath);
    let text: string;
    try {
      // Regular files only, size checked first (a FIFO used to block forever): safety hook.
      text = (await readRegularFile(file, 'the config file', MAX_CONFIG_BYTES)).bytes.toString('utf8');
    } catch (e) {
      if (e instanceof UserError) throw e;
      const code = (e as NodeJS.ErrnoException).code;
      throw new UserError(code === 'ENOENT' ? 'config file not found' : `cannot read the config file (${code ?? (e as Error).message})`, file, null);
    }
    const parsed = parseSettingsWithLines(text, file);
    configText = text;
    configDir = path.dirname(file);
    lineOf = parsed.lineOf;
    for (const key of leafKeys(parsed.settings)) {
      const line = parsed.lineOf(key.split('.'));
      sources[key] = { from: 'loudword.json', where: line === null ? file : `${file}:${line}` };
    }
    layers.push(parsed.settings);
  }

  addLayer({ values: overrides, from: options.overridesFrom?.from ?? 'command-line flag', ...(options.overridesFrom?.names ? { names: options.overridesFrom.names } : {}) });

  const settings = mergeSettings(DEFAULT_SETTINGS, ...layers);
  if (settings.sample.k >= settings.sample.documents) {
    const where = (key: string): string => (sources[key] === undefined ? `"${key}" (default)` : sources[key]!.from === 'loudword.json' ? `"${key}"` : sources[key]!.where);
    const kFromFile = sources['sample.k']?.from === 'loudword.json';
    const docsFromFile = sources['sample.documents']?.from === 'loudword.json';
    const line = lineOf !== null && (kFromFile || docsFromFile) ? lineOf(kFromFile ? ['sample', 'k'] : ['sample', 'documents']) : null;
    throw new UserError(
      `${where('sample.k')} (${settings.sample.k}) must be smaller than ${where('sample.documents')} (${settings.sample.documents})`,
      kFromFile || docsFromFile ? file : null,
      line,
    );
  }
  // A stop list named by loudword.json must stay inside the project (confine-to-workspace.ts).
  if (configDir !== null && file !== null && sources.stopList?.from === 'loudword.json' && typeof settings.stopList === 'string') {
    confineConfigPath(file, configText, 'stopList', settings.stopList, projectFolder(configDir, options.projectRoot));
  }
  const stopListBase = sources.stopList?.from === 'loudword.json' || sources.stopList === undefined ? configDir ?? defaultDir(options.corpusFile, baseDir) : baseDir;
  const stopListPath = settings.stopList === null ? null : path.resolve(stopListBase, settings.stopList);
  return { settings, configDir, stopListPath, sources };
}

/** The workspace when the config lies inside it (the editor), else the config's own folder. */
function projectFolder(configDir: string, projectRoot: string | null | undefined): string {
  if (projectRoot == null) return configDir;
  return isWithin(realPathAllowingMissing(projectRoot), realPathAllowingMissing(configDir)) ? path.resolve(projectRoot) : configDir;
}

function defaultDir(corpusFile: string | undefined, baseDir: string): string {
  return corpusFile === undefined ? baseDir : path.dirname(path.resolve(baseDir, corpusFile));
}

function layerValues(overrides: SettingsOverrides, baseDir: string): PartialSettings {
  const layer: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(overrides)) if (value !== undefined) layer[key] = value;
  if (typeof layer.stopList === 'string' && layer.stopList !== '') layer.stopList = path.resolve(baseDir, layer.stopList);
  // A section with nothing set adds nothing (and names no source).
  for (const section of ['sample', 'suggest'] as const) {
    const given = overrides[section];
    if (given === undefined) continue;
    const values: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(given)) if (v !== undefined) values[k] = v;
    if (Object.keys(values).length > 0) layer[section] = values;
    else delete layer[section];
  }
  return layer as PartialSettings;
}

/** "text", "sample.k", … for every value a partial settings object sets (lists are leaves). */
function leafKeys(value: object, prefix = ''): string[] {
  return Object.entries(value).flatMap(([k, v]) => {
    if (v === undefined) return [];
    const key = prefix + k;
    return typeof v === 'object' && v !== null && !Array.isArray(v) ? leafKeys(v as object, `${key}.`) : [key];
  });
}
