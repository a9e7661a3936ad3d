/** Per-term scores behind the ranked term table (docs/methods.md "Names"). */
export interface TermScores {
  /** P(t) / Σ P: the term's share of the all-pairs similarity mass (docs/methods.md §3). */
  pullShare: Float64Array;
  /** (share of the similarity inside k-NN pairs) ÷ pullShare; NaN where the term has no mass. */
  neighborLift: Float64Array;
  /**
   * pullShare × (1 − neighborLift): the similarity a term adds to every pair beyond what it adds
   * to neighbour pairs. Positive = loud (pulls all pairs together more than neighbours),
   * negative = signal (concentrates in neighbour pairs).
   */
  loudness: Float64Array;
}

export function termScores(pairMass: Float64Array, knnMass: Float64Array): TermScores {
  const terms = pairMass.length;
  let pairTotal = 0;
  let knnTotal = 0;
  for (let t = 0; t < terms; t++) {
    pairTotal += pairMass[t]!;
    knnTotal += knnMass[t]!;
  }
  const pullShare = new Float64Array(terms);
  const neighborLift = new Float64Array(terms);
  const loudness = new Float64Array(terms);
  for (let t = 0; t < terms; t++) {
    const share = pairTotal > 0 ? pairMass[t]! / pairTotal : 0;
    pullShare[t] = share;
    if (share > 0 && knnTotal > 0) {
      const lift = knnMass[t]! / knnTotal / share;
      neighborLift[t] = lift;
      loudness[t] = share * (1 - lift);
    } else {
      neighborLift[t] = Number.NaN;
      loudness[t] = 0;
    }
  }
  return { pullShare, neighborLift, loudness };
}
