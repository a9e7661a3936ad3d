import * as path from 'node:path';
import type { SettingsProvenance } from '../../protocol';
import { loadSettings, type LoadedSettings } from '../config/load-settings';
import type { ReviewInput } from './review-api';

/**
 * The settings of a review, resolved the same way whether it runs in one process or in shards
 * (docs/architecture.md), so both see the same stop list and say the same about where each
 * setting came from.
 */
export async function loadReviewSettings(input: ReviewInput): Promise<LoadedSettings> {
  return loadSettings(input.configPath ?? null, input.overrides, {
    corpusFile: input.file,
    projectRoot: input.projectRoot ?? null,
    ...(input.editorSettings !== undefined ? { editor: input.editorSettings } : {}),
    ...(input.overridesFrom !== undefined ? { overridesFrom: input.overridesFrom } : {}),
  });
}

/** Report.provenance: which config was read, how it was found, and where each setting came from. */
export function provenanceOf(input: ReviewInput, sources: SettingsProvenance['sources']): SettingsProvenance {
  const configFile = input.configPath == null ? null : path.resolve(input.configPath);
  return { config: { file: configFile, how: input.configHow ?? (configFile === null ? 'none' : 'given') }, sources };
}
