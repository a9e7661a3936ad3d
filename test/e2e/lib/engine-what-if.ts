// Prints the engine's what-if Measures for a corpus with extra terms stopped, straight from the
// review API (the panel gets the same numbers through the worker). Run with tsx:
//   node --import tsx engine-what-if.ts <corpus> <config> < removed-terms.json
import { readFileSync } from 'node:fs';
import { startReview } from '../../../extension/src/engine/review/start-review';

async function main(): Promise<void> {
  const [file, configPath] = process.argv.slice(2);
  if (file === undefined || configPath === undefined) throw new Error('usage: engine-what-if.ts <corpus> <config> < removed.json');
  const removed = JSON.parse(readFileSync(0, 'utf8')) as string[];
  const session = await startReview({ file, configPath });
  process.stdout.write(JSON.stringify(await session.whatIf(removed)));
}

main().catch((e: unknown) => {
  process.stderr.write(`${e instanceof Error ? e.stack ?? e.message : String(e)}\n`);
  process.exit(1);
});
