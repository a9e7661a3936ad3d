import { strict as assert } from 'node:assert';
import { isWebviewToHost, isWhatIfHopsOrAbsent } from '../extension/src/protocol';

// The panel is untrusted (its page renders corpus text): the hop times it sends and receives are
// checked like every other field. Common practice, no source.
describe('protocol: what-if hop times (WhatIfHops)', () => {
  it('isWhatIfHopsOrAbsent takes no hops or known hop names with numbers, nothing else', () => {
    assert.equal(isWhatIfHopsOrAbsent(undefined), true);
    assert.equal(isWhatIfHopsOrAbsent({}), true);
    assert.equal(isWhatIfHopsOrAbsent({ panelPosted: 1, hostReceived: 2, engineEnded: 3 }), true);
    assert.equal(isWhatIfHopsOrAbsent({ panelPosted: '1' }), false);
    assert.equal(isWhatIfHopsOrAbsent({ somethingElse: 1 }), false);
    assert.equal(isWhatIfHopsOrAbsent(null), false);
    assert.equal(isWhatIfHopsOrAbsent(5), false);
  });

  it('isWebviewToHost takes a what-if request with or without a numeric panelPosted', () => {
    assert.equal(isWebviewToHost({ type: 'whatIf', removed: ['the'], requestId: 1 }), true);
    assert.equal(isWebviewToHost({ type: 'whatIf', removed: ['the'], requestId: 1, panelPosted: 1764000000000 }), true);
    assert.equal(isWebviewToHost({ type: 'whatIf', removed: ['the'], requestId: 1, panelPosted: 'soon' }), false);
  });
});
