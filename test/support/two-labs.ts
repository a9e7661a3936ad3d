import { DistanceLab } from '../../extension/src/engine/what-if/distance-lab';
import { mulberry32 } from '../../extension/src/engine/random/seeded-random';
import { textLikeRows } from './text-like-rows';

/**
 * Two DistanceLabs on the same 600 text-like rows (one for each side of a comparison: the one
 * under test and a one-thread reference), both measured at the baseline and then at an opening
 * mask (columns 0 and 3 stopped), as a review leaves them before the first what-if. `random`
 * continues the seeded stream, for the caller's clicks.
 */
export function twoLabs(seed: number) {
  const random = mulberry32(seed);
  const X = textLikeRows(600, 50, random);
  const sample = Uint32Array.from({ length: 120 }, (_, i) => i * 5);
  const labels = Int32Array.from(sample, () => Math.floor(random() * 3));
  const k = 5;
  const lab = new DistanceLab(X, sample, k, seed, labels);
  const reference = new DistanceLab(X, sample, k, seed, labels);
  const baseline = reference.measure(new Uint8Array(X.cols), null);
  lab.measure(new Uint8Array(X.cols), null);
  const opening = new Uint8Array(X.cols);
  opening[0] = 1;
  opening[3] = 1;
  reference.measure(opening, baseline.neighbors);
  lab.measure(opening, baseline.neighbors);
  return { X, lab, reference, baseline, opening, random };
}
