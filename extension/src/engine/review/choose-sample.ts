import type { Csr } from '../matrix/csr';
import { rowHasWeight } from '../matrix/rows-with-weight';
import { sampleIndices } from '../random/seeded-random';

export interface ReviewSample {
  /** Document index of each sample position, ascending. */
  positions: Uint32Array;
  /** Label id per sample position (−1 = no label); null when the corpus has no label field. */
  labels: Int32Array | null;
  /** How many documents had no terms left and so could not be sampled. */
  emptyDocuments: number;
}

/**
 * The seeded sample the quadratic measures run on. Documents with no terms left are not
 * sampled: they have no direction, so no distance to rank.
 */
export function chooseSample(weights: Csr, size: number, seed: number, labels: readonly (string | null)[] | null): ReviewSample {
  const nonEmpty: number[] = [];
  for (let r = 0; r < weights.rows; r++) if (rowHasWeight(weights, r)) nonEmpty.push(r);
  const picked = sampleIndices(nonEmpty.length, Math.min(size, nonEmpty.length), seed);
  const positions = new Uint32Array(picked.length);
  for (let i = 0; i < picked.length; i++) positions[i] = nonEmpty[picked[i]!]!;

  let labelIds: Int32Array | null = null;
  if (labels !== null) {
    const ids = new Map<string, number>();
    labelIds = new Int32Array(positions.length);
    for (let i = 0; i < positions.length; i++) {
      const label = labels[positions[i]!] ?? null;
      if (label === null || label === '') {
        labelIds[i] = -1;
        continue;
      }
      let id = ids.get(label);
      if (id === undefined) ids.set(label, (id = ids.size));
      labelIds[i] = id;
    }
  }
  return { positions, labels: labelIds, emptyDocuments: weights.rows - nonEmpty.length };
}
