import type { EffectiveSettings } from '../../protocol';
import type { PartialSettings } from './parse-settings';

/** Layers partial settings over complete ones: nested objects merge key by key, lists replace. */
export function mergeSettings(base: EffectiveSettings, ...layers: PartialSettings[]): EffectiveSettings {
  const out = structuredClone(base) as unknown as Record<string, unknown>;
  for (const layer of layers) {
    for (const [key, value] of Object.entries(layer)) {
      if (value === undefined) continue;
      const current = out[key];
      if (isPlainObject(value) && isPlainObject(current)) {
        const merged: Record<string, unknown> = { ...current };
        for (const [k, v] of Object.entries(value)) if (v !== undefined) merged[k] = structuredClone(v);
        out[key] = merged;
      } else out[key] = structuredClone(value);
    }
  }
  return out as unknown as EffectiveSettings;
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}
