import type { TermCountStats } from './term-count-stats';

/**
 * Label-free signals of one term from exact corpus statistics (docs/methods.md §9).
 *
 * The model: a term's count in document d is Poisson with mean μ_d = p·L_d (p = cf / Σ L, its
 * share of all tokens, L_d the document's length). Function words follow that model closely;
 * content words are bursty — once a document is about the topic the word recurs (Church & Gale
 * 1995, "Poisson mixtures"; Church 2000, adaptation). A Gamma mixture of Poissons (the negative
 * binomial) has Var(c_d) = μ_d + μ_d²/r, so
 *   burstiness  b = 1/r̂ = (Σ_d (c_d − μ_d)² − Σ_d μ_d) / Σ_d μ_d²   (method of moments),
 * 0 for a Poisson term, larger the more the term clusters in some documents; it does not grow
 * with the term's frequency. Its standard error under the Poisson model,
 *   se(b) = √(Σ μ_d + 2 Σ μ_d²) / Σ μ_d²,
 * says how much the corpus can tell: huge for a word with a count of 0 or 1 in short documents.
 * residual IDF (Church & Gale 1995, "Inverse document frequency (IDF): a measure of deviations
 * from Poisson"): log2 of the df a Poisson model predicts over the df observed, with the
 * documents' own lengths: predicted df = Σ_d (1 − e^(−μ_d)) — computed on the per-length
 * histogram, so the cost is one pass over distinct lengths, not over documents.
 */
export interface TermSignal {
  /** df / documents. */
  docFraction: number;
  burstiness: number;
  burstinessSe: number;
}

export function termSignal(stats: TermCountStats, t: number): TermSignal {
  const n = stats.documents;
  const cf = stats.cf[t]!;
  const p = stats.totalTokens > 0 ? cf / stats.totalTokens : 0;
  // Σ (c − pL)² = Σc² − 2pΣcL + p²ΣL²  (the zeros contribute p²L² each, included in ΣL²).
  const sumMuSq = p * p * stats.sumLengthSq;
  const sumSqDev = stats.sumCountSq[t]! - 2 * p * stats.sumCountLength[t]! + sumMuSq;
  const burstiness = sumMuSq > 0 ? (sumSqDev - cf) / sumMuSq : Number.NaN;
  const burstinessSe = sumMuSq > 0 ? Math.sqrt(cf + 2 * sumMuSq) / sumMuSq : Number.POSITIVE_INFINITY;
  return { docFraction: n > 0 ? stats.df[t]! / n : 0, burstiness, burstinessSe };
}

/**
 * Residual IDF in bits: log2(predicted df / observed df), the predicted df from a Poisson model
 * with each document's own length. `lengths` are the document lengths (any order).
 */
export function residualIdf(cf: number, df: number, lengths: ArrayLike<number>): number {
  let total = 0;
  for (let i = 0; i < lengths.length; i++) total += lengths[i]!;
  if (df <= 0 || total <= 0) return Number.NaN;
  const p = cf / total;
  let predicted = 0;
  for (let i = 0; i < lengths.length; i++) predicted += 1 - Math.exp(-p * lengths[i]!);
  return Math.log2(predicted / df);
}
