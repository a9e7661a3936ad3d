// DistanceLab.whatIfExactSums: the exact half's measures read later (ParallelWhatIf reads them
// once its share of the sample's sweep is done) must be those of the sums the call reached, to
// the bit, whatever moves the exact state in between: another click, a prefetch, the idle-time
// settle (a full pass that changes the sums' rounding), a Report measure. Each is compared with
// whatIfExact of a reference lab walking the same masks.
import { strict as assert } from 'node:assert';
import type { ExactMeasures } from '../extension/src/engine/measures/measure-distances';
import { twoLabs } from './support/two-labs';

describe('what-if/distance-lab: the exact measures read later', () => {
  it('answer for the sums their call reached, whatever moved the exact state before they were read', () => {
    const { lab, reference, opening, baseline, random } = twoLabs(61);
    const mask = opening.slice();
    const moves: Array<[string, () => void]> = [
      ['another click', () => lab.whatIfExactSums(mask.slice())],
      ['a prefetch', () => lab.speculateExact(flip(mask, 2))],
      ['the idle-time settle', () => lab.settle()],
      ['a Report measure', () => lab.measure(flip(mask, 4), baseline.neighbors)],
    ];
    let settled = false;
    // Clicks on common columns (a walk that seldom comes back to a checkpoint's mask) pile
    // updates up until a settle is due and changes the sums.
    for (let i = 0; i < 200; i++) {
      const t = 1 + Math.floor(random() * 14);
      mask[t] = mask[t] === 0 ? 1 : 0;
      const later = lab.whatIfExactSums(mask.slice());
      const want = reference.whatIfExact(mask.slice());
      // A Report measure only twice: its full pass resets the updates piled up. The settle most
      // often, so that the click after which it comes due is often followed by it.
      const [what, move] = moves[i === 5 || i === 150 ? 3 : Math.min(2, i % 4)]!;
      move();
      assert.deepStrictEqual(later(), want, `click ${i}, read after ${what}`);
      // Read twice, the same object: the measures are computed once.
      assert.equal(later(), later());
      // The reference walks what the lab walked.
      if (what === 'another click') reference.whatIfExact(mask.slice());
      if (what === 'a prefetch') reference.speculateExact(flip(mask, 2));
      if (what === 'a Report measure') reference.measure(flip(mask, 4), baseline.neighbors);
      if (what === 'the idle-time settle') {
        reference.settle();
        settled ||= !same(lab.whatIfExactSums(mask.slice())(), want);
        reference.whatIfExact(mask.slice());
      }
    }
    assert.ok(settled, 'no settle changed the sums: the settle case was not exercised');
  });
});

function flip(mask: Uint8Array, t: number): Uint8Array {
  const next = mask.slice();
  next[t] = next[t] === 0 ? 1 : 0;
  return next;
}

function same(a: ExactMeasures, b: ExactMeasures): boolean {
  try {
    assert.deepStrictEqual(a, b);
    return true;
  } catch {
    return false;
  }
}
