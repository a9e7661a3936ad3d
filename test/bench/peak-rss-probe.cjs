// Preloaded into the Loudword CLI (NODE_OPTIONS=--require) when GNU time is missing: on exit
// the main thread writes the process's peak RSS and CPU time, which cover its worker threads
// too, to the file named by LOUDWORD_BENCH_RSS_FILE. Child processes the CLI might spawn are
// not counted.
'use strict';
const { isMainThread } = require('node:worker_threads');
const { writeFileSync } = require('node:fs');

const target = process.env.LOUDWORD_BENCH_RSS_FILE;
if (isMainThread && target) {
  process.on('exit', () => {
    const usage = process.resourceUsage();
    // maxRSS is in kilobytes and the CPU times in microseconds, as getrusage reports them.
    writeFileSync(target, JSON.stringify({ peakRss: usage.maxRSS * 1024, cpuSeconds: (usage.userCPUTime + usage.systemCPUTime) / 1e6 }));
  });
}
