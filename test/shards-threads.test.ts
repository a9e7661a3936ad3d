// The editor's review of a shards folder (issue 11 point 6): the built review worker
// (dist/review-worker.js, as the extension runs it) reviews a folder in shards on worker threads
// (dist/shard-thread.js) and must give the one-process Report, and what-ifs equal to one
// process's. Corpus: generated documents (seeded; common practice, no source). The reference is
// our own one-process review (startReview): the check is that map + merge on threads changes nothing.
import { strict as assert } from 'node:assert';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { startReview } from '../extension/src/engine/review/start-review';
import { reviewShardsInThreads } from '../extension/src/engine/shards/review-in-threads';
import { ReviewWorkerClient } from '../extension/src/worker/review-worker-client';
import { isUserError, type UserError } from '../extension/src/engine/user-error';
import { reportDifferences } from './support/report-diff';
import { generatedDocs, writeShards } from './support/shard-corpora';

const DIST = path.resolve(__dirname, '..', 'dist');
const OVERRIDES = { label: 'label', stopList: null, sample: { documents: 300 } };

describe('a shards folder reviewed in the editor: shard steps on worker threads', function () {
  this.timeout(300_000);
  let dir = '';
  before(() => {
    assert.ok(existsSync(path.join(DIST, 'shard-thread.js')), 'dist/shard-thread.js is missing: run npm run build first');
    dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-shard-threads-'));
    writeShards(dir, generatedDocs(1200, 17), 5);
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('the review worker gives the one-process Report and the same what-ifs', async () => {
    const one = await startReview({ file: dir, configPath: null, overrides: OVERRIDES });
    assert.ok(one.report.suggestions.length > 0, 'a corpus with loud terms to find');
    // 1,200 labelled documents, 300 sampled: the verdict's neighbours come from the whole corpus.
    assert.equal(one.report.verdict?.estimate?.neighborsAmong, one.report.input.documents);
    const client = new ReviewWorkerClient(path.join(DIST, 'review-worker.js'));
    const stages: string[] = [];
    try {
      const report = await client.review({ file: dir, configPath: null, overrides: OVERRIDES }, (stage) => stages.push(stage));
      const { differences, largest } = reportDifferences(one.report, report);
      console.log(`      ${one.report.input.documents} documents in 5 shards: largest relative difference ${largest.toExponential(1)}; stages ${[...new Set(stages)].join(' → ')}`);
      assert.deepEqual(differences, []);
      assert.deepEqual(report.suggestions, one.report.suggestions);
      // A stop list no round has summed yet (its sums need one more round on the threads), then one it has.
      for (const removed of [one.report.suggestions.slice(0, 2), one.report.suggestions]) {
        const got = await client.whatIf(removed);
        const want = await one.whatIf(removed);
        assert.deepEqual(reportDifferences(want, got).differences, [], `what-if ${JSON.stringify(removed)}`);
      }
    } finally {
      await client.terminate();
    }
  });

  it('threads that are closed remove the folder of kept counts, and a new pool removes folders of ended processes', async () => {
    // Only the folders are checked here, so a small corpus and the pattern tokenizer (wink's model
    // is loaded afresh for every file, ~0.5 s each) keep the two reviews cheap.
    const small = mkdtempSync(path.join(os.tmpdir(), 'loudword-shard-threads-small-'));
    const shards = path.join(small, 'shards');
    mkdirSync(shards);
    writeShards(shards, generatedDocs(150, 17), 3);
    const config = path.join(small, 'loudword.json');
    writeFileSync(config, JSON.stringify({ tokens: { tokenizer: 'pattern' } }));
    const input = { file: shards, configPath: config, overrides: OVERRIDES };
    try {
      const before = new Set(readdirSync(os.tmpdir()).filter((n) => n.startsWith('loudword-shards-')));
      const session = await reviewShardsInThreads(input, {}, path.join(DIST, 'shard-thread.js'));
      const during = readdirSync(os.tmpdir()).filter((n) => n.startsWith('loudword-shards-') && !before.has(n));
      assert.equal(during.length, 1, 'one folder of kept counts while the session lives');
      assert.ok(readdirSync(path.join(os.tmpdir(), during[0]!)).length === 3, 'the counts of each of the 3 shards');
      await session.close();
      assert.equal(existsSync(path.join(os.tmpdir(), during[0]!)), false);
      // A folder left by a process that has ended is removed when the next pool starts.
      const orphan = path.join(os.tmpdir(), 'loudword-shards-999999999-test');
      mkdirSync(orphan, { recursive: true });
      const next = await reviewShardsInThreads(input, {}, path.join(DIST, 'shard-thread.js'));
      await next.close();
      assert.equal(existsSync(orphan), false, 'the orphan folder is removed');
    } finally {
      rmSync(small, { recursive: true, force: true });
    }
  });

  it('a shard that cannot be parsed fails the review naming shard and line, and a cancel stops it; neither leaves kept counts', async () => {
    const broken = mkdtempSync(path.join(os.tmpdir(), 'loudword-shard-threads-broken-'));
    try {
      writeShards(broken, generatedDocs(300, 5), 3);
      writeFileSync(path.join(broken, 'part-3.csv'), 'text,label\nfine words here,a\nmore words,b\n"an open quote that never closes,c\n');
      const ours = (): string[] => readdirSync(os.tmpdir()).filter((n) => n.startsWith(`loudword-shards-${process.pid}-`));
      const before = ours().length;
      await assert.rejects(
        reviewShardsInThreads({ file: broken, configPath: null, overrides: OVERRIDES }, {}, path.join(DIST, 'shard-thread.js')),
        (e: unknown) => isUserError(e) && (e as UserError).file === path.join(broken, 'part-3.csv') && (e as UserError).line === 4,
      );
      assert.equal(ours().length, before, 'the failed review removed its kept counts');
      const controller = new AbortController();
      const cancelled = reviewShardsInThreads({ file: dir, configPath: null, overrides: OVERRIDES }, { signal: controller.signal, onStage: (stage) => stage === 'tokenizing' && controller.abort() }, path.join(DIST, 'shard-thread.js'));
      await assert.rejects(cancelled, (e: unknown) => (e as Error).name === 'AbortError');
      assert.equal(ours().length, before, 'the cancelled review removed its kept counts');
    } finally {
      rmSync(broken, { recursive: true, force: true });
    }
  });
});
