import { strict as assert } from 'node:assert';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { isCancelled, ReviewWorkerClient, WorkerFailure } from '../extension/src/worker/review-worker-client';
import { UserError } from '../extension/src/engine/user-error';
import { isHostToWorker, isWorkerToHost } from '../extension/src/worker/worker-protocol';

// The bundled worker, as the extension runs it (npm test builds first).
const WORKER = path.resolve(__dirname, '..', 'dist', 'review-worker.js');

describe('worker-protocol guards', () => {
  it('isHostToWorker accepts the two requests and refuses malformed ones', () => {
    assert.equal(isHostToWorker({ type: 'review', runId: 1, input: { file: 'a.csv' } }), true);
    assert.equal(isHostToWorker({ type: 'whatIf', requestId: 2, removed: ['via'] }), true);
    assert.equal(isHostToWorker({ type: 'cancel', runId: 1 }), false, 'cancelling terminates the worker; there is no cancel message');
    assert.equal(isHostToWorker({ type: 'review', runId: 1, input: {} }), false);
    assert.equal(isHostToWorker({ type: 'whatIf', requestId: 2, removed: [3] }), false);
    assert.equal(isHostToWorker({ type: 'whatIf', requestId: 2, removed: ['via'], speculative: true }), true);
    assert.equal(isHostToWorker({ type: 'whatIf', requestId: 2, removed: ['via'], speculative: 'yes' }), false);
    assert.equal(isHostToWorker({ type: 'report', runId: 1 }), false);
    assert.equal(isHostToWorker(null), false);
  });

  it('isWorkerToHost accepts only worker message types', () => {
    assert.equal(isWorkerToHost({ type: 'stage', runId: 1, stage: 'reading', fraction: 0 }), true);
    assert.equal(isWorkerToHost({ type: 'review' }), false);
  });
});

// A tiny invented corpus: every document carries the same helpdesk footer ("sent via portal"),
// and two topics with their own words. Three footer words are in every document, so they
// carry similarity every pair shares (docs/methods.md "Names"); invented data, no source.
function corpusCsv(): string {
  const rows = ['id,message'];
  const topics = [
    ['battery', 'drains', 'charger', 'overnight'],
    ['invoice', 'refund', 'payment', 'twice'],
    ['sensor', 'display', 'cracked', 'screen'],
  ];
  for (let i = 0; i < 30; i++) {
    const words = topics[i % 3]!;
    const body = `${words[i % 4]} ${words[(i + 1) % 4]} ${words[(i + 2) % 4]} item${i}`;
    rows.push(`${i},"${body} sent via portal"`);
  }
  return rows.join('\n') + '\n';
}

describe('review worker round trip (dist/review-worker.js)', function () {
  let dir = '';
  let client: ReviewWorkerClient;

  before(function () {
    assert.ok(existsSync(WORKER), `${WORKER} is missing: run npm run build first`);
    dir = mkdtempSync(path.join(tmpdir(), 'loudword-host-'));
    writeFileSync(path.join(dir, 'tickets.csv'), corpusCsv());
    writeFileSync(path.join(dir, 'stoplist.txt'), '# none yet\nnevermentioned\n');
    client = new ReviewWorkerClient(WORKER);
  });

  after(async function () {
    await client.terminate();
    rmSync(dir, { recursive: true, force: true });
  });

  it('ReviewWorkerClient.review reports stages in order and returns the Report', async () => {
    const stages: string[] = [];
    const report = await client.review(
      { file: path.join(dir, 'tickets.csv'), configPath: null, overrides: { text: 'message', stopList: path.join(dir, 'stoplist.txt'), sample: { documents: 30, k: 3 } } },
      (stage) => stages.push(stage),
    );
    assert.equal(report.input.documents, 30);
    assert.deepEqual(report.stopList.unused, ['nevermentioned']);
    assert.equal(stages[0], 'reading');
    assert.ok(stages.includes('measuring'));
    // Footer words occur in all 30 documents; a loud-term review should put one of them first.
    // Source: docs/methods.md "Names" (a loud term has a large share of all-pairs similarity, little neighbour signal).
    assert.ok(['sent', 'via', 'portal'].includes(report.terms[0]!.term), `first term was ${report.terms[0]!.term}`);
    assert.equal(client.hasSession, true);
  });

  it('ReviewWorkerClient.whatIf with nothing removed gives the baseline, with the suggestions gives "suggested"', async function () {
    const report = await client.review({ file: path.join(dir, 'tickets.csv'), configPath: null, overrides: { text: 'message', stopList: null, sample: { documents: 30, k: 3 } } });
    // Source: README.md "The Report" — baseline is the current stop list, suggested is
    // current + suggestions; what-if masks terms on the same session, so both must match.
    const none = await client.whatIf([]);
    assert.equal(none.backgroundSimilarity, report.baseline.backgroundSimilarity);
    const withSuggestions = await client.whatIf(report.suggestions);
    assert.ok(Math.abs(withSuggestions.backgroundSimilarity - report.suggested.backgroundSimilarity) < 1e-12);
    if (report.suggestions.length > 0) assert.ok(withSuggestions.backgroundSimilarity < none.backgroundSimilarity);
  });

  it('ReviewWorkerClient.speculativeWhatIf (a hover\'s prefetch) answers what the click on that selection then answers, bit for bit, and leaves the plain what-ifs as they were', async function () {
    const report = await client.review({ file: path.join(dir, 'tickets.csv'), configPath: null, overrides: { text: 'message', stopList: null, sample: { documents: 30, k: 3 } } });
    const opening = [...report.suggestions];
    assert.ok(opening.length > 0 && !opening.includes('battery'), `suggestions: ${opening.join(', ')}`);
    // Unticking the first suggestion (the hovered term), ticking a topic word (elsewhere).
    const hovered = opening.slice(1);
    const other = [...opening, 'battery'];
    await client.whatIf(opening);
    // A hover elsewhere, then on the clicked term: the click adopts the second prefetch.
    const elsewhere = await client.speculativeWhatIf(other);
    const prefetch = await client.speculativeWhatIf(hovered);
    assert.ok(elsewhere !== null && prefetch !== null, 'the review worker did not speculate (no what-if thread?)');
    const click = await client.timedWhatIf(hovered);
    assert.deepStrictEqual(click.measures, prefetch.measures);
    // The hover elsewhere did not move the state: its selection clicked now (from the hovered
    // click's state) equals the prefetch's to rounding (the incremental answer is held to a full
    // recompute in what-if-incremental.test.ts).
    const later = await client.whatIf(other);
    assert.ok(Math.abs(later.backgroundSimilarity - elsewhere.measures.backgroundSimilarity) < 1e-12);
  });

  it('ReviewWorkerClient.timedWhatIf says when the request passed each hop between host and worker, in order', async function () {
    await client.review({ file: path.join(dir, 'tickets.csv'), configPath: null, overrides: { text: 'message', stopList: null, sample: { documents: 30, k: 3 } } });
    // Common practice, no source: one clock (Date.now()) on both sides, so the hops follow each other.
    const before = Date.now();
    const { hops } = await client.timedWhatIf(['via']);
    const after = Date.now();
    const order = [before, hops.hostToWorker, hops.workerReceived, hops.engineStarted, hops.engineEnded, hops.hostAnswered, after];
    assert.ok(order.every((t) => typeof t === 'number'), JSON.stringify(hops));
    for (let i = 1; i < order.length; i++) assert.ok(order[i]! >= order[i - 1]!, `hop ${i} before hop ${i - 1}: ${JSON.stringify(hops)}`);
  });

  // Common practice, no source: stopping a prefetch for the selection the click asks for would
  // throw away work the click then does again; a click or a prefetch for anything else goes first.
  it('a computing prefetch is stopped (the shared count moves) by a click or a newer prefetch, unless it is for the prefetch\'s selection', async () => {
    // A stand-in worker: it holds each prefetch (as a computing one would be) until the next
    // message, except one for ["now"], and answers each request with the count it saw then.
    const script = path.join(dir, 'counting-worker.js');
    writeFileSync(
      script,
      `const { parentPort, workerData } = require('node:worker_threads');
const held = [];
const answer = (m) => parentPort.postMessage({ type: 'whatIfResult', requestId: m.requestId, removed: m.removed, measures: { count: Atomics.load(workerData.clicks, 0) }, engineMs: 0, hops: { workerReceived: 0, engineStarted: 0, engineEnded: 0 } });
parentPort.on('message', (m) => {
  if (m.type === 'review') return parentPort.postMessage({ type: 'report', runId: m.runId, report: {} });
  for (const h of held.splice(0)) answer(h);
  if (m.speculative && m.removed.join() !== 'now') held.push(m);
  else answer(m);
});
`,
    );
    const counting = new ReviewWorkerClient(script);
    const seen = async (p: Promise<{ measures: unknown } | null>) => ((await p)?.measures as { count: number } | undefined)?.count;
    try {
      await counting.review({ file: path.join(dir, 'tickets.csv'), configPath: null });
      const ahead = counting.speculativeWhatIf(['the', 'via']);
      const same = counting.timedWhatIf(['via', 'the']);
      assert.deepEqual([await seen(ahead), await seen(same)], [0, 0], 'a click for the prefetched selection lets it finish');
      const other = counting.speculativeWhatIf(['the']);
      const newer = counting.speculativeWhatIf(['via']);
      assert.equal(await seen(other), 1, 'a newer prefetch for another selection stops it');
      const elsewhere = counting.timedWhatIf(['the', 'x']);
      assert.deepEqual([await seen(newer), await seen(elsewhere)], [2, 2], 'a click for another selection stops it');
      // Once a prefetch is answered, a click for its selection is an ordinary click.
      assert.equal(await seen(counting.speculativeWhatIf(['now'])), 2, 'a prefetch with none in flight stops nothing');
      assert.equal(await seen(counting.timedWhatIf(['now'])), 3);
    } finally {
      await counting.terminate();
    }
  });

  it('ReviewWorkerClient.review turns a broken loudword.json into a user failure with file and line', async () => {
    const config = path.join(dir, 'loudword.json');
    writeFileSync(config, '{\n  "text": "message",\n  "sample": { "documents": "many" }\n}\n');
    await assert.rejects(client.review({ file: path.join(dir, 'tickets.csv'), configPath: config }), (e: unknown) => {
      assert.ok(e instanceof UserError, String(e));
      assert.equal(e.file, config);
      assert.equal(e.line, 3);
      return true;
    });
    // A failed review leaves the previous session answering what-ifs.
    assert.equal(typeof (await client.whatIf([])).backgroundSimilarity, 'number');
  });

  it('ReviewWorkerClient.review rejects a missing corpus as a user failure naming it', async () => {
    const missing = path.join(dir, 'missing.csv');
    await assert.rejects(client.review({ file: missing, configPath: null }), (e: unknown) => e instanceof UserError && e.file === missing);
  });

  it('ReviewWorkerClient.review rejects as cancelled and stops the worker when aborted', async () => {
    const controller = new AbortController();
    const pending = client.review({ file: path.join(dir, 'tickets.csv'), configPath: null, overrides: { text: 'message' } }, () => controller.abort(), controller.signal);
    await assert.rejects(pending, (e: unknown) => isCancelled(e) && !(e instanceof UserError));
    assert.equal(client.hasSession, false);
    await assert.rejects(client.whatIf([]), (e: unknown) => e instanceof UserError);
  });

  // Common practice, no source: a cancel stops one worker, not the client; the next review
  // starts a new worker, and what was rejected with the old one stays out of the new one's way.
  it('after a cancel, the same client reviews again on a new worker and answers what-ifs there', async () => {
    const input = { file: path.join(dir, 'tickets.csv'), configPath: null, overrides: { text: 'message', stopList: null, sample: { documents: 30, k: 3 } } };
    const controller = new AbortController();
    await assert.rejects(
      client.review(input, () => controller.abort(), controller.signal),
      (e: unknown) => isCancelled(e),
    );
    const stages: string[] = [];
    const report = await client.review(input, (stage) => stages.push(stage));
    assert.equal(report.input.documents, 30);
    assert.equal(stages[0], 'reading');
    assert.equal((await client.whatIf([])).backgroundSimilarity, report.baseline.backgroundSimilarity);
  });

  // Common practice, no source: a worker that dies fails what waits on it with the exit code,
  // as the engine's failure (not the user's, not a cancel).
  it('a worker that exits rejects the waiting review as a WorkerFailure naming the exit code', async () => {
    const dying = path.join(dir, 'dying-worker.js');
    writeFileSync(dying, "require('node:worker_threads').parentPort.on('message', () => process.exit(3));\n");
    const doomed = new ReviewWorkerClient(dying);
    try {
      await assert.rejects(doomed.review({ file: path.join(dir, 'tickets.csv'), configPath: null }), (e: unknown) => {
        assert.ok(e instanceof WorkerFailure, String(e));
        assert.match(e.message, /exit code 3/);
        return true;
      });
    } finally {
      await doomed.terminate();
    }
  });
});
