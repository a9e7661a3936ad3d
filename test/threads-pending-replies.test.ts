// PendingReplies: requests that wait for a thread's replies by number (engine/threads/). Facts of
// the trade, no source: a reply settles only its own request; a thread that is gone fails every
// waiting and later request.
import { strict as assert } from 'node:assert';
import { PendingReplies } from '../extension/src/engine/threads/pending-replies';

describe('PendingReplies', () => {
  it('settles each request with its own reply, in any order, and numbers them 1, 2, ...', async () => {
    const replies = new PendingReplies<string>();
    const a = replies.expect();
    const b = replies.expect();
    assert.deepEqual([a.id, b.id], [1, 2]);
    assert.equal(replies.size, 2);
    assert.equal(replies.resolve(b.id, 'second'), true);
    assert.equal(replies.resolve(a.id, 'first'), true);
    assert.deepEqual(await Promise.all([a.reply, b.reply]), ['first', 'second']);
    assert.equal(replies.size, 0);
    assert.equal(replies.resolve(a.id, 'again'), false);
  });

  it('takes a caller\'s own number, and rejects one request alone', async () => {
    const replies = new PendingReplies<number>();
    const mine = replies.expect(7);
    const other = replies.expect(8);
    assert.equal(mine.id, 7);
    replies.reject(7, new Error('bad input'));
    await assert.rejects(mine.reply, /bad input/);
    replies.resolve(8, 42);
    assert.equal(await other.reply, 42);
    assert.equal(replies.failure, null);
  });

  it('a failure rejects the waiting requests and every later one with the first failure', async () => {
    const replies = new PendingReplies<number>();
    const waiting = replies.expect();
    replies.fail(new Error('thread exited with code 1'));
    replies.fail(new Error('closed'));
    await assert.rejects(waiting.reply, /exited with code 1/);
    await assert.rejects(replies.expect().reply, /exited with code 1/);
    assert.equal(replies.size, 0);
    assert.match(String(replies.failure), /exited with code 1/);
  });
});
