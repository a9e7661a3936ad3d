// The merge of a review in shards: what it refuses and how errors name their shard (issue 11).
// Corpus: generated documents (seeded; common practice, no source).
import { strict as assert } from 'node:assert';
import { mkdirSync, utimesSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { loadSettings } from '../extension/src/engine/config/load-settings';
import { countShard, countShardKeeping } from '../extension/src/engine/shards/count-shard';
import { parsePartial, settingsKey } from '../extension/src/engine/shards/partials';
import { readShardCounts, shardCountsOrigin, writeShardCounts } from '../extension/src/engine/shards/shard-counts';
import { planReview } from '../extension/src/engine/shards/plan-review';
import { reviewShards } from '../extension/src/engine/shards/review-shards';
import { finishReview } from '../extension/src/engine/shards/finish-review';
import { sumShard } from '../extension/src/engine/shards/sum-shard';
import { SumsTotals } from '../extension/src/engine/shards/sums-totals';
import { isUserError, type UserError } from '../extension/src/engine/user-error';
import { generatedDocs, writeShards } from './support/shard-corpora';
import { scratchFolder } from './support/scratch-folder';

const OVERRIDES = { label: 'label', stopList: null, sample: { documents: 400 } };

describe('review in shards: merge checks and errors', function () {
  this.timeout(300_000);
  const dir = scratchFolder('loudword-shards-');

  it('planReview refuses partials from other settings, and a partial from another version, naming the file', async () => {
    const shardDir = path.join(dir(), 'settings');
    mkdirSync(shardDir);
    const [a, b] = writeShards(shardDir, generatedDocs(60, 3), 2);
    const one = await loadSettings(null, OVERRIDES);
    const other = await loadSettings(null, { ...OVERRIDES, sample: { documents: 400, seed: 2 } });
    const pa = await countShard({ file: a!, key: 'a' }, one.settings);
    const pb = await countShard({ file: b!, key: 'b' }, other.settings);
    await assert.rejects(
      planReview({ corpus: shardDir, settings: one.settings, configDir: null, partials: [{ partial: pa, file: 'a.count.json' }, { partial: pb, file: 'b.count.json' }] }),
      (e: unknown) => isUserError(e) && (e as UserError).file === 'b.count.json' && /other settings/.test(e.message),
    );
    const older = JSON.stringify({ ...pa, toolVersion: '0.0.1' });
    assert.throws(() => parsePartial(older, 'old.json', 'count'), (e: unknown) => isUserError(e) && /written by Loudword 0\.0\.1/.test(e.message));
    assert.throws(() => parsePartial(JSON.stringify(pa), 'x.json', 'sums'), /a "count" partial where a "sums" partial was expected/);
  });

  it('the merge does not depend on the order the partials arrive in', async () => {
    const shardDir = path.join(dir(), 'order');
    mkdirSync(shardDir);
    const files = writeShards(shardDir, generatedDocs(300, 5), 4);
    const { settings } = await loadSettings(null, OVERRIDES);
    const partials = await Promise.all(files.map(async (file) => ({ partial: await countShard({ file, key: path.basename(file) }, settings), file })));
    const forward = await planReview({ corpus: shardDir, settings, configDir: null, partials });
    const backward = await planReview({ corpus: shardDir, settings, configDir: null, partials: [...partials].reverse() });
    assert.deepEqual(backward, forward);
  });

  it('planReview refuses to guess when pruning empties most sample candidates (the sample could not be exact)', async () => {
    const shardDir = path.join(dir(), 'pruned');
    mkdirSync(shardDir);
    // Nine documents in ten hold only "filler", which maxDf 0.5 prunes: their rows are empty.
    const docs = Array.from({ length: 600 }, (_, i) => ({ text: i % 10 === 0 ? `rare${i} word${i % 7}` : 'filler filler', label: 'x' }));
    const files = writeShards(shardDir, docs, 2);
    const { settings } = await loadSettings(null, { ...OVERRIDES, sample: { documents: 40 } });
    settings.prune.maxDf = 0.5;
    const partials = await Promise.all(files.map(async (file) => ({ partial: await countShard({ file, key: path.basename(file) }, settings), file })));
    await assert.rejects(planReview({ corpus: shardDir, settings, configDir: null, partials }), (e: unknown) => isUserError(e) && /pruning emptied too many/.test(e.message));
  });

  it('SumsTotals refuses a second partial for a shard and names a shard whose sums are missing', async () => {
    const shardDir = path.join(dir(), 'totals');
    mkdirSync(shardDir);
    const files = writeShards(shardDir, generatedDocs(120, 8), 2);
    const { settings } = await loadSettings(null, OVERRIDES);
    const partials = await Promise.all(files.map(async (file) => ({ partial: await countShard({ file, key: path.basename(file) }, settings), file })));
    const plan = await planReview({ corpus: shardDir, settings, configDir: null, partials });
    const first = await sumShard({ file: files[0]!, key: 'part-0.jsonl' }, plan, settings);
    const totals = new SumsTotals(plan, settings);
    totals.add(first, 'sums-0.json');
    assert.throws(() => totals.add(first, 'again.json'), (e: unknown) => isUserError(e) && (e as UserError).file === 'again.json' && /two sums partials for shard "part-0.jsonl"/.test(e.message));
    assert.throws(() => finishReview(plan, settings, totals), /no sums partial for shard "part-1.jsonl"/);
  });

  it('an unparsable shard fails the review naming the shard and the line', async () => {
    const shardDir = path.join(dir(), 'broken');
    mkdirSync(shardDir);
    writeShards(shardDir, generatedDocs(80, 9), 3);
    writeFileSync(path.join(shardDir, 'part-3.csv'), 'text,label\nfine words here,a\nmore words,b\n"an open quote that never closes,c\n');
    const { settings } = await loadSettings(null, OVERRIDES);
    await assert.rejects(
      reviewShards({ corpus: shardDir, settings, configDir: null }),
      (e: unknown) => isUserError(e) && (e as UserError).file === path.join(shardDir, 'part-3.csv') && (e as UserError).line === 4,
    );
  });

  it('counts kept by round 1 give the sums of a second tokenisation, bit for bit, and are ignored once the shard changes', async () => {
    const shardDir = path.join(dir(), 'kept');
    mkdirSync(shardDir);
    const files = writeShards(shardDir, generatedDocs(300, 12), 2);
    const { settings } = await loadSettings(null, OVERRIDES);
    const shard = { file: files[0]!, key: 'part-0.jsonl' };
    const origin = await shardCountsOrigin(shard.file, shard.key, settingsKey(settings));
    const { partial, kept } = await countShardKeeping(shard, settings);
    const countsFile = path.join(dir(), 'kept-0.bin');
    await writeShardCounts(countsFile, kept, origin);
    const other = await countShard({ file: files[1]!, key: 'part-1.jsonl' }, settings);
    const plan = await planReview({ corpus: shardDir, settings, configDir: null, partials: [{ partial, file: 'c0' }, { partial: other, file: 'c1' }] });
    const reread = await readShardCounts(countsFile, origin);
    assert.ok(reread !== null);
    assert.deepEqual(reread.counts.terms, kept.counts.terms);
    assert.deepEqual(reread.counts.firstTerms, kept.counts.firstTerms);
    assert.deepEqual(await sumShard(shard, plan, settings, reread), await sumShard(shard, plan, settings));
    // Another settings key, or the file touched since round 1: the kept counts are not used.
    assert.equal(await readShardCounts(countsFile, { ...origin, settingsKey: 'another' }), null);
    utimesSync(shard.file, new Date(), new Date(Date.now() + 5000));
    assert.equal(await readShardCounts(countsFile, await shardCountsOrigin(shard.file, shard.key, settingsKey(settings))), null);
    assert.equal(await readShardCounts(path.join(dir(), 'missing.bin'), origin), null);
    writeFileSync(countsFile, 'not counts');
    await assert.rejects(readShardCounts(countsFile, origin), (e: unknown) => isUserError(e) && /not a file of Loudword shard counts/.test(e.message));
  });
});
