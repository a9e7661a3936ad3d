import { strict as assert } from 'node:assert';
import { stageProgress } from '../extension/src/host/pure/stage-progress';

// Six stages in the order review-api.ts lists them; percentages by hand (common practice, no source).
describe('stageProgress', () => {
  it('stageProgress spreads the six stages evenly over 0–100', () => {
    assert.equal(stageProgress('reading', 0), 0);
    assert.equal(stageProgress('tokenizing', 0.5), 25);
    assert.equal(stageProgress('writing report', 1), 100);
  });

  it('stageProgress clamps the fraction and treats NaN as 0', () => {
    assert.equal(stageProgress('weighting', 2), 50);
    assert.equal(stageProgress('weighting', Number.NaN), 33);
  });
});
