import type { EffectiveSettings } from '../../protocol';
import schemaJson from '../../../../loudword.schema.json';

interface DefaultsNode {
  default?: unknown;
  properties?: Record<string, DefaultsNode>;
}

/** Every `default` of an object schema's properties, nested as the settings are. */
function defaultsOf(node: DefaultsNode): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, child] of Object.entries(node.properties ?? {})) {
    if (key === '$schema') continue;
    out[key] = child.properties !== undefined ? defaultsOf(child) : structuredClone(child.default);
  }
  return out;
}

function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null) for (const v of Object.values(value)) deepFreeze(v);
  return Object.freeze(value);
}

/**
 * What a review uses when loudword.json says nothing: the `default`s of loudword.schema.json,
 * so the editor's completion, the README and the engine cannot disagree (a test checks every
 * leaf has one). The weighting defaults match scikit-learn's TfidfVectorizer (raw tf, smooth
 * idf, l2), so figures compare with a notebook.
 */
export const DEFAULT_SETTINGS: EffectiveSettings = deepFreeze(defaultsOf(schemaJson as DefaultsNode) as unknown as EffectiveSettings);
