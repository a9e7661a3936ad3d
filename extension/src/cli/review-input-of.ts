import * as path from 'node:path';
import type { SettingsOverrides } from '../engine/config/settings-overrides';
import type { ReviewInput } from '../engine/review/review-api';
import { findConfig } from '../engine/config/find-config';
import { FLAG_OF_SETTING, type CliOptions } from './parse-args';

/** What the review options on the command line ask for: the corpus, the config and the overrides. */
export function reviewInputOf(o: CliOptions): ReviewInput {
  const file = o.file!;
  const overrides: SettingsOverrides = { sample: {} };
  if (o.text !== null) overrides.text = o.text;
  if (o.label !== null) overrides.label = o.label;
  if (o.inputFormat !== null) overrides.format = o.inputFormat;
  // A stop list named on the command line is relative to where the command runs.
  if (o.stopList !== null) overrides.stopList = path.resolve(o.stopList);
  if (o.sample !== null) overrides.sample!.documents = o.sample;
  if (o.k !== null) overrides.sample!.k = o.k;
  if (o.seed !== null) overrides.sample!.seed = o.seed;
  if (o.useLabels) overrides.suggest = { useLabels: true };
  // One rule with the editor: the nearest loudword.json from the corpus's folder up (engine/config/find-config.ts).
  const configPath = o.noConfig ? null : o.config ?? findConfig(file);
  const configHow = o.noConfig ? 'ignored' : o.config !== null ? 'given' : configPath !== null ? 'nearest' : 'none';
  return { file, configPath, configHow, overrides, overridesFrom: { from: 'command-line flag', names: FLAG_OF_SETTING } };
}

