// Runs engine-what-if.ts through tsx (the engine is TypeScript; the CLI has no what-if option).
import { execFile } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const script = path.join(path.dirname(fileURLToPath(import.meta.url)), 'engine-what-if.ts');

export function engineWhatIf(repo, corpus, config, removed) {
  return new Promise((resolve, reject) => {
    const child = execFile(process.execPath, ['--import', 'tsx', script, corpus, config],
      { cwd: repo, maxBuffer: 64 * 1024 * 1024, timeout: 180000 },
      (error, stdout, stderr) => {
        if (error) reject(new Error(`engine what-if failed: ${stderr.trim().split('\n')[0] || error.message}`));
        else resolve(JSON.parse(stdout));
      });
    child.stdin.end(JSON.stringify(removed));
  });
}
