// A research probe, not part of the rule: would keeping the grammar words that "adapt" to the
// content neighbourhood lift precision@10? For each development corpus, Loudword's suggestions
// (made without labels) are written beside the texts, and adaptation_probe.py measures, with
// scikit-learn, each suggested grammar word's adaptation across content neighbours and the
// precision@10 of the list without the words above a limit (docs/methods.md §9, "adaptation").
//
//   npx tsx test/quality/adaptation-probe.ts [--form cohesion|cohesion-length] [corpus ...]
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { dumpSuggestions } from './dump-suggestions';

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const form = args[0] === '--form' ? args.splice(0, 2) : [];
  const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-adaptation-'));
  try {
    const names = await dumpSuggestions(dir, args);
    execFileSync('/usr/bin/python3', [path.join(__dirname, 'adaptation_probe.py'), ...form, dir, ...names], { stdio: 'inherit' });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  process.exit(0);
}
void main();
