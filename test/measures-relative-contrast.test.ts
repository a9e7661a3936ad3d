import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { relativeContrast, relativeContrastPerQuery } from '../extension/src/engine/measures/relative-contrast';
import { allValid, euclideanDistances, gaussianPoints } from './measures-fixtures';

describe('measures/relative-contrast', () => {
  it('relativeContrast median falls as the dimension grows (iid normal, d = 2, 10, 100)', () => {
    // Source: Beyer, Goldstein, Ramakrishnan & Shaft (1999), ICDT — (Dmax − Dmin)/Dmin → 0 as
    // dimensionality grows for iid attributes (docs/methods.md §4).
    const n = 300;
    const medians = [2, 10, 100].map((d) => relativeContrast(euclideanDistances(gaussianPoints(mulberry32(d), n, d), n, d), n, allValid(n))!.median);
    assert.ok(medians[0]! > medians[1]! && medians[1]! > medians[2]!, `medians ${medians.join(', ')}`);
    assert.ok(medians[2]! < 1, `d = 100 median ${medians[2]}`);
  });

  it('relativeContrastPerQuery on a hand-checked line, duplicates excluded', () => {
    // Points 0, 1, 4, 4: query 0 → Dmin 1, Dmax 4 → RC 3; query 1 → Dmin 1, Dmax 3 → RC 2;
    // queries at 4 have an exact duplicate (Dmin = 0) → left out.
    const x = [0, 1, 4, 4];
    const dist = Float64Array.from(x.flatMap((a) => x.map((b) => Math.abs(a - b))));
    const rc = relativeContrastPerQuery(dist, 4, allValid(4));
    assert.deepEqual(Array.from(rc.slice(0, 2)), [3, 2]);
    assert.ok(Number.isNaN(rc[2]!) && Number.isNaN(rc[3]!));
    const summary = relativeContrast(dist, 4, allValid(4))!;
    // Type-7 quantiles of [2, 3]: median 2.5, p10 2.1, p90 2.9.
    assert.ok(Math.abs(summary.median - 2.5) < 1e-12);
    assert.ok(Math.abs(summary.p10 - 2.1) < 1e-12);
    assert.ok(Math.abs(summary.p90 - 2.9) < 1e-12);
  });

  it('relativeContrast is null when every query has a duplicate', () => {
    const dist = new Float64Array(4);
    assert.equal(relativeContrast(dist, 2, allValid(2)), null);
  });
});
