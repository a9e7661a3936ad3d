// PendingReplies: requests that wait for a thread's replies by number (engine/threads/). Facts of
// the trade, no source: a reply settles only its own request; a thread that is gone fails every
// waiting and later request; a request that could not be posted waits for nothing.
import { strict as assert } from 'node:assert';
import { PendingReplies } from '../extension/src/engine/threads/pending-replies';

describe('PendingReplies', () => {
  it('posts each request under its number (1, 2, ...) and settles it with its own reply, in any order', async () => {
    const replies = new PendingReplies<string>();
    const posted: number[] = [];
    const a = replies.request((id) => posted.push(id));
    const b = replies.request((id) => posted.push(id));
    assert.deepEqual(posted, [1, 2]);
    assert.equal(replies.size, 2);
    assert.equal(replies.resolve(2, 'second'), true);
    assert.equal(replies.resolve(1, 'first'), true);
    assert.deepEqual(await Promise.all([a, b]), ['first', 'second']);
    assert.equal(replies.size, 0);
    assert.equal(replies.resolve(1, 'again'), false);
  });

  it("takes a caller's own number, and rejects one request alone", async () => {
    const replies = new PendingReplies<number>();
    let posted = -1;
    const mine = replies.request((id) => (posted = id), 7);
    const other = replies.request(() => undefined, 8);
    assert.equal(posted, 7);
    assert.equal(replies.reject(7, new Error('bad input')), true);
    await assert.rejects(mine, /bad input/);
    replies.resolve(8, 42);
    assert.equal(await other, 42);
    assert.equal(replies.failure, null);
  });

  it('refuses a second request under a number that still waits, and keeps the first', async () => {
    const replies = new PendingReplies<number>();
    const first = replies.request(() => undefined, 0);
    let postedAgain = false;
    await assert.rejects(replies.request(() => (postedAgain = true), 0), /already waiting/);
    assert.equal(postedAgain, false);
    replies.resolve(0, 5);
    assert.equal(await first, 5);
  });

  it('a post that throws drops its request; the next one goes on', async () => {
    const replies = new PendingReplies<number>();
    await assert.rejects(
      replies.request(() => {
        throw new Error('could not be cloned');
      }),
      /could not be cloned/,
    );
    assert.equal(replies.size, 0);
    assert.equal(replies.resolve(1, 1), false);
    const next = replies.request(() => undefined);
    replies.resolve(2, 9);
    assert.equal(await next, 9);
    assert.equal(replies.failure, null);
  });

  it('a failure rejects the waiting requests and every later one with the first failure, posting nothing more', async () => {
    const replies = new PendingReplies<number>();
    const waiting = replies.request(() => undefined);
    replies.fail(new Error('thread exited with code 1'));
    replies.fail(new Error('closed'));
    await assert.rejects(waiting, /exited with code 1/);
    let posted = false;
    await assert.rejects(
      replies.request(() => (posted = true)),
      /exited with code 1/,
    );
    assert.equal(posted, false);
    assert.equal(replies.size, 0);
    assert.match(String(replies.failure), /exited with code 1/);
  });
});
