// Writes development corpora and Loudword's suggestions for them, made without the labels, for
// research probes in Python that read them many times (adaptation_probe.py, split_half_probe.py):
// DIR/NAME.jsonl (text and label) and DIR/NAME.json (role, the suggested list as `apply` writes it,
// and rule 2's grammar words).
//
//   npx tsx test/quality/dump-suggestions.ts DIR [corpus ...]
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { suggestionLines } from '../../extension/src/engine/terms/stop-list-spelling';
import { corporaNamed } from '../corpora/dev-corpora';
import { reviewWithoutLabels } from './quality-row';

/** Dumps the named corpora (all when none) that are available to `dir`; returns their names. */
export async function dumpSuggestions(dir: string, names: string[]): Promise<string[]> {
  const dumped: string[] = [];
  for (const corpus of corporaNamed(names)) {
    if (!corpus.available()) {
      console.error(`${corpus.name}: its source is missing, skipped`);
      continue;
    }
    const { report } = await reviewWithoutLabels(corpus, dir, null);
    // Rule 2's words: the grammar words suggested below half of the documents.
    const grammar = report.terms.filter((t) => t.status === 'suggested' && !/more than half/.test(t.why)).map((t) => t.term);
    writeFileSync(path.join(dir, `${corpus.name}.json`), JSON.stringify({ role: corpus.role, suggestions: suggestionLines(report), grammar }));
    dumped.push(corpus.name);
  }
  return dumped;
}

if (require.main === module) {
  const [dir, ...names] = process.argv.slice(2);
  if (dir === undefined) throw new Error('usage: dump-suggestions.ts DIR [corpus ...]');
  void dumpSuggestions(dir, names).then((dumped) => {
    console.log(dumped.join(' '));
    process.exit(0);
  });
}
