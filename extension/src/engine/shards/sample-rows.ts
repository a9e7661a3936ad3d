import type { EffectiveSettings } from '../../protocol';
import type { Csr } from '../matrix/csr';
import { weighWithIdf } from '../matrix/weigh';
import { decodeFloat64, type PlanPartial } from './partials';

/**
 * The plan's sampled documents weighed with the merged idf and l2-normalised, as one process
 * weighs them: the finish measures them, and each shard seeks their neighbours among its
 * documents, so both must weigh them alike.
 */
export function planSampleRows(plan: PlanPartial, settings: EffectiveSettings): Csr {
  const s = plan.sample;
  const counts: Csr = {
    rows: s.docs.length,
    cols: plan.terms.length,
    indptr: Uint32Array.from(s.indptr),
    indices: Uint32Array.from(s.indices),
    data: Float64Array.from(s.counts),
  };
  return weighWithIdf(counts, decodeFloat64(plan.idf), { ...settings.weighting, norm: 'l2' });
}
