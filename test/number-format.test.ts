// Counts are grouped by hand where every digit is exact, so that a review does not load ICU's
// locale data for them: the text must be what toLocaleString('en-US') writes, for every integer.
import { strict as assert } from 'node:assert';
import { formatCount, formatNumber, groupedInteger } from '../extension/src/number-format';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';

describe('number-format', () => {
  it('groupedInteger writes what toLocaleString("en-US") writes: both signs, −0, every group length, 2^53 and past it', () => {
    const values = [0, -0, Number.MAX_SAFE_INTEGER, -Number.MAX_SAFE_INTEGER, 2 ** 53 + 2, -(2 ** 53 + 2), 1e21, 1e300, -1e300];
    for (let e = 0; e <= 22; e++) values.push(10 ** e, 10 ** e - 1, -(10 ** e), 1 - 10 ** e);
    const random = mulberry32(12);
    for (let i = 0; i < 5000; i++) {
      const magnitude = 10 ** Math.floor(random() * 17);
      values.push(Math.round((random() - 0.5) * 2 * magnitude));
    }
    for (const n of values) assert.equal(groupedInteger(n), n.toLocaleString('en-US'), String(n));
  });

  it('formatCount and formatNumber group counts as before, with a real minus', () => {
    assert.equal(formatCount(1234567.4), '1,234,567');
    assert.equal(formatCount(-1234.5), '−1,234');
    assert.equal(formatCount(999), '999');
    assert.equal(formatCount(Number.NaN), '—');
    assert.equal(formatNumber(123456.7), '123,457');
    assert.equal(formatNumber(-100), '−100');
    assert.equal(formatNumber(12.34), '12.3');
    // rounding left over from equal values prints as 0 (common practice, no source); small figures keep their digits
    assert.equal(formatNumber(1.6e-16), '0');
    assert.equal(formatNumber(-2e-15), '0');
    assert.equal(formatNumber(2.5e-7), '2.5e-7');
  });
});
