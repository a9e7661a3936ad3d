// Where a corpus's loudword.json and stop list are, and which editor settings reach the
// review. Node's path only, so it is unit-tested without the editor.
import * as path from 'node:path';
import type { SettingsOverrides } from '../../engine/config/settings-overrides';

export const CONFIG_FILE_NAME = 'loudword.json';

/**
 * loudword.json candidates for `corpusFile`, nearest first: its folder, then each parent up
 * to and including `workspaceRoot`. Without a workspace root only the corpus's own folder is
 * looked at, so a stray file far up the disk is never picked up.
 */
export function configCandidates(corpusFile: string, workspaceRoot: string | null): string[] {
  let dir = path.dirname(path.resolve(corpusFile));
  const out = [path.join(dir, CONFIG_FILE_NAME)];
  if (workspaceRoot === null || !isInsideFolder(workspaceRoot, dir)) return out;
  const root = path.resolve(workspaceRoot);
  while (dir !== root) {
    const parent = path.dirname(dir);
    if (parent === dir) break;
    dir = parent;
    out.push(path.join(dir, CONFIG_FILE_NAME));
  }
  return out;
}

/** True when `file` is `folder` or lies below it (after resolving `..`). */
export function isInsideFolder(folder: string, file: string): boolean {
  const rel = path.relative(path.resolve(folder), path.resolve(file));
  return rel === '' || (!rel.startsWith('..') && !path.isAbsolute(rel));
}

/** The VS Code settings that stand in for loudword.json keys (see package.json). */
export interface EditorDefaults {
  sampleSize: number;
  neighbors: number;
  stopListFile: string;
}

/** The parts of a parsed loudword.json the host looks at; anything else is the engine's business. */
interface ConfigKeys { stopList?: unknown; sample?: { documents?: unknown; k?: unknown } }

function keysOf(configJson: unknown): ConfigKeys {
  return typeof configJson === 'object' && configJson !== null && !Array.isArray(configJson) ? (configJson as ConfigKeys) : {};
}

/**
 * The editor settings are defaults: each reaches the review only where loudword.json says
 * nothing, so a project's committed config gives the same figures in the editor and in CI.
 * The stop list path is made absolute against `baseDir` (the workspace folder), because the
 * worker's working directory is not the project's.
 */
export function editorOverrides(editor: EditorDefaults, configJson: unknown, baseDir: string): SettingsOverrides {
  const config = keysOf(configJson);
  const sample = typeof config.sample === 'object' && config.sample !== null ? config.sample : {};
  const overrides: SettingsOverrides = {};
  const sampleOverrides: NonNullable<SettingsOverrides['sample']> = {};
  if (sample.documents === undefined) sampleOverrides.documents = editor.sampleSize;
  if (sample.k === undefined) sampleOverrides.k = editor.neighbors;
  if (Object.keys(sampleOverrides).length > 0) overrides.sample = sampleOverrides;
  if (config.stopList === undefined && editor.stopListFile.trim() !== '') overrides.stopList = path.resolve(baseDir, editor.stopListFile.trim());
  return overrides;
}

/**
 * The stop list file a review will use, before it runs (to hand the worker an unsaved buffer):
 * loudword.json's `stopList` relative to the config's folder, else the override. Null when
 * the config turns the stop list off (`"stopList": null`).
 */
export function expectedStopListPath(configPath: string | null, configJson: unknown, overrides: SettingsOverrides): string | null {
  const config = keysOf(configJson);
  if (configPath !== null && config.stopList !== undefined) {
    return typeof config.stopList === 'string' ? path.resolve(path.dirname(configPath), config.stopList) : null;
  }
  return overrides.stopList ?? null;
}
