// The panel's what-if requests: a click goes out at once, clicks during a computation coalesce
// into one request for the last selection, stale answers are ignored. The contract is the
// issue's ("rapid toggles coalesce; the last one wins"); common practice, no source.
import { strict as assert } from 'node:assert';
import type { WhatIfRequestMessage } from '../extension/src/protocol';
import { WhatIfRequester } from '../webview/src/what-if-requester';

function setup() {
  const sent: WhatIfRequestMessage[] = [];
  return { sent, requester: new WhatIfRequester((m) => sent.push(m)) };
}

describe('WhatIfRequester', () => {
  it('schedule sends the first click at once, without waiting for a pause', () => {
    const { sent, requester } = setup();
    requester.schedule(['the']);
    assert.deepEqual(sent.map((m) => m.removed), [['the']]);
    assert.equal(requester.pending, true);
    assert.equal(requester.accept(sent[0]!.requestId), true);
    assert.equal(requester.pending, false);
  });

  it('schedule during a computation coalesces a burst into one request for the last selection', () => {
    const { sent, requester } = setup();
    requester.schedule(['the']);
    requester.schedule(['the', 'of']);
    requester.schedule(['of']);
    requester.schedule(['of', 'and']);
    assert.equal(sent.length, 1, 'nothing more is sent while the first is computed');
    // The first answer is stale (a newer selection exists) and releases the last one.
    assert.equal(requester.accept(sent[0]!.requestId), false);
    assert.deepEqual(sent.map((m) => m.removed), [['the'], ['of', 'and']]);
    assert.equal(requester.pending, true);
    assert.equal(requester.accept(sent[1]!.requestId), true);
    assert.equal(requester.pending, false);
  });

  it('cancel drops the waiting selection and ignores the answer in flight', () => {
    const { sent, requester } = setup();
    requester.schedule(['the']);
    requester.schedule(['of']);
    requester.cancel();
    assert.equal(requester.pending, false);
    assert.equal(requester.accept(sent[0]!.requestId), false);
    assert.equal(sent.length, 1);
    requester.schedule(['and']);
    assert.deepEqual(sent[1]!.removed, ['and'], 'the host is free again');
  });

  it('failed frees the requester after an error so the next click is sent', () => {
    const { sent, requester } = setup();
    requester.schedule(['the']);
    requester.failed();
    assert.equal(requester.pending, false);
    requester.schedule(['of']);
    assert.equal(sent.length, 2);
  });
});
