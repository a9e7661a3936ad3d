// Preloaded into the Loudword CLI (NODE_OPTIONS=--require) when GNU time is missing: on exit
// the main thread writes the process's peak RSS, which covers its worker threads too, to the
// file named by LOUDWORD_BENCH_RSS_FILE. Child processes the CLI might spawn are not counted.
'use strict';
const { isMainThread } = require('node:worker_threads');
const { writeFileSync } = require('node:fs');

const target = process.env.LOUDWORD_BENCH_RSS_FILE;
if (isMainThread && target) {
  process.on('exit', () => {
    // resourceUsage().maxRSS is in kilobytes, like getrusage.
    writeFileSync(target, String(process.resourceUsage().maxRSS * 1024));
  });
}
