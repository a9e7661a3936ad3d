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

/** Each term's pair mass as a share of the total: the pull share (0 everywhere when there is no mass). */
export function pullShares(pairMass: Float64Array): Float64Array {
  let pairTotal = 0;
  for (let t = 0; t < pairMass.length; t++) pairTotal += pairMass[t]!;
  const out = new Float64Array(pairMass.length);
  if (pairTotal > 0) for (let t = 0; t < pairMass.length; t++) out[t] = pairMass[t]! / pairTotal;
  return out;
}

export function termScores(pairMass: Float64Array, knnMass: Float64Array): TermScores {
  const terms = pairMass.length;
  let knnTotal = 0;
  for (let t = 0; t < terms; t++) knnTotal += knnMass[t]!;
  const pullShare = pullShares(pairMass);
  const neighborLift = new Float64Array(terms);
  const loudness = new Float64Array(terms);
  for (let t = 0; t < terms; t++) {
    const share = pullShare[t]!;
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
