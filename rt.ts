import { reviewShardsInThreads } from './extension/src/engine/shards/review-in-threads';
(async () => {
  const t = Date.now();
  const s = await reviewShardsInThreads({ file: process.argv[2]!, configPath: null, overrides: {} } as any, {}, require('path').join(__dirname, 'dist', 'shard-thread.js'));
  console.log('wall', Date.now() - t, JSON.stringify(s.report.timings));
  await s.close();
})();
