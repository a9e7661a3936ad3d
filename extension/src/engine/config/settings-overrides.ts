import type { EffectiveSettings } from '../../protocol';

/** Settings given on the command line or by the editor; they win over loudword.json. */
export type SettingsOverrides = Partial<Pick<EffectiveSettings, 'format' | 'text' | 'label' | 'stopList'>> & {
  sample?: Partial<EffectiveSettings['sample']>;
  suggest?: Partial<Pick<EffectiveSettings['suggest'], 'useLabels'>>;
};
