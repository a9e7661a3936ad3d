// Issue 13: "all-identical documents report 10 hubs". Every similarity ties, the k-NN lists
// break ties to the lower position, so the first k documents were everyone's neighbours. Ties at
// the k-th place now share their slots (expected N_k under a random tie-break), so identical
// documents have N_k = k each: no hubs, no orphans, skewness 0. Source: Radovanović et al. 2010
// (JMLR 11), N_k and the hub threshold N_k > 2k; the mean of N_k is k by construction.
import { strict as assert } from 'node:assert';
import { hubnessSummary, kOccurrence, tieAwareKOccurrence } from '../../extension/src/engine/measures/hubness';
import { knnFromSimilarities } from '../../extension/src/engine/measures/knn';
import { startReview } from '../../extension/src/engine/review/start-review';

function gramOf(vectors: number[][]): Float64Array {
  const m = vectors.length;
  const g = new Float64Array(m * m);
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) g[i * m + j] = vectors[i]!.reduce((s, v, d) => s + v * vectors[j]![d]!, 0);
  return g;
}

describe('bad input: identical documents are not hubs', () => {
  it('50 identical unit vectors, k = 10: every N_k is 10 (the order-based count had 10 hubs)', () => {
    const m = 50;
    const k = 10;
    const gram = gramOf(Array.from({ length: m }, () => [0.6, 0.8]));
    const valid = new Uint8Array(m).fill(1);
    const knn = knnFromSimilarities(gram, m, k, valid);
    assert.equal(hubnessSummary(kOccurrence(knn.neighbors, m, k), valid, k)!.hubs, 10); // the artefact
    const counts = tieAwareKOccurrence(gram, m, k, knn.neighbors, knn.sims, valid);
    for (const c of counts) assert.ok(Math.abs(c - k) < 1e-9, String(c));
    assert.deepEqual(hubnessSummary(counts, valid, k), { skewness: 0, hubs: 0, orphans: 0 });
  });

  it('without ties it is the plain k-occurrence', () => {
    const vectors = Array.from({ length: 30 }, (_, i) => {
      const a = (i * i * 0.37) % 6.28;
      return [Math.cos(a), Math.sin(a)];
    });
    const m = vectors.length;
    const gram = gramOf(vectors);
    const valid = new Uint8Array(m).fill(1);
    const knn = knnFromSimilarities(gram, m, 3, valid);
    assert.deepEqual([...tieAwareKOccurrence(gram, m, 3, knn.neighbors, knn.sims, valid)], [...kOccurrence(knn.neighbors, m, 3)]);
  });

  it('a review of 60 identical documents reports no hubs', async function () {
    this.timeout(60_000);
    const text = Array.from({ length: 60 }, () => 'the printer jams on every page').join('\n') + '\n';
    const session = await startReview({ file: 'same.txt', text, configPath: null, overrides: { format: 'text', stopList: null, sample: { documents: 60, k: 10 } } });
    assert.equal(session.report.baseline.hubness?.hubs, 0);
    assert.ok(session.report.hubs.every((h) => h.kOccurrence <= 20));
  });
});
