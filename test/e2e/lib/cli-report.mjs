// The Report for a corpus as the CLI computes it (`loudword review --format json`): the
// independent side that the panel's figures are compared against.
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';

/** E2E_CLI (set by run.sh) is the CLI bundled in the installed extension: the same build. `flags` go before --config. */
export function cliReport(repo, corpus, config, flags = []) {
  const bin = process.env.E2E_CLI || path.join(repo, 'bin', 'loudword.js');
  return new Promise((resolve, reject) => {
    execFile(process.execPath, [bin, 'review', corpus, ...flags, '--config', config, '--format', 'json', '-q'],
      { maxBuffer: 256 * 1024 * 1024, timeout: 180000 },
      (error, stdout, stderr) => {
        if (error) reject(new Error(`loudword review ${path.basename(corpus)} failed: ${stderr.trim() || error.message}`));
        else resolve(JSON.parse(stdout));
      });
  });
}

export function sha256(file) {
  return createHash('sha256').update(readFileSync(file)).digest('hex');
}
