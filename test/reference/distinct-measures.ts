import type { Measures } from '../../extension/src/protocol';

/** A Measures value whose every figure is a different number, so a spec reading the wrong field shows. */
export function distinctMeasures(): Measures {
  return {
    sample: { documents: 2000, k: 10, seed: 1 },
    backgroundSimilarity: 0.101,
    neighborStandout: 1.02,
    contrast: { median: 0.103, p10: 0.0104, p90: 0.105 },
    meanToNearest: 1.06,
    iidEquivalentDimension: 107,
    hubness: { skewness: 1.08, hubs: 109, orphans: 110 },
    intrinsicDimension: { twoNN: 11.1, mle: 11.2 },
    radiusSlack: { median: 0.113 },
    topTermsMassShare: { top10: 0.114, top100: 0.115 },
    labelPrecisionAtK: 0.116,
    neighborTurnover: 0.117,
    distributions: { similarity: { start: 0, binWidth: 0.1, pairs: [], nearest: [] }, kOccurrence: [], cumulativeMass: [] },
  };
}
