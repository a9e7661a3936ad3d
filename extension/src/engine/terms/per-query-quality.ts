import { samplePrecision } from '../measures/label-precision';

/**
 * Per-query neighbour quality of one setting on the sample, for paired comparisons:
 * - standout: the z-score of the query's nearest-neighbour similarity against its similarities
 *   to all other valid rows (the per-query term of neighbour standout, docs/methods.md §4);
 * - precision: the share of its k neighbours with the query's label, a missing one counting the
 *   chance of a random document (measures/label-precision.ts, docs/methods.md §7).
 * NaN where a query has no value (no neighbours, no spread, no label).
 */
export interface PerQueryQuality {
  standout: Float64Array;
  precision: Float64Array | null;
}

/**
 * From a measured setting (DistanceLab.measure's neighbours and per-query standout), so the
 * verdict compares the very neighbours the Report's label precision counts, without computing
 * the sample's similarities again.
 */
export function perQueryQuality(measured: { neighbors: Uint32Array; neighborSims: Float64Array; standoutPerQuery: Float64Array }, k: number, labels: Int32Array | null): PerQueryQuality {
  const precision = labels === null ? null : samplePrecision({ neighbors: measured.neighbors, sims: measured.neighborSims }, labels, k);
  return { standout: measured.standoutPerQuery, precision };
}
