// The check two scenarios share: the panel's header counts and headline tiles show the figures of
// the CLI's Report for the same corpus and loudword.json (each number as the panel formats it).
import { readFacts, readTiles, headlineMeasures } from './distance-review-panel.mjs';
import { assertShows } from './shown-number.mjs';

/** Every way the panel in `frame` differs from `report`, as messages; empty when it agrees. */
export async function headlineMismatches(frame, report) {
  const facts = await readFacts(frame);
  const tiles = await readTiles(frame);
  const problems = [];
  const check = (fn) => {
    try {
      fn();
    } catch (e) {
      problems.push(e.message);
    }
  };
  check(() => assertShows(facts.documents ?? '', report.input.documents, 'documents'));
  check(() => assertShows(facts.terms ?? '', report.vocabulary.terms, 'terms'));
  for (const [id, value] of Object.entries(headlineMeasures)) {
    const tile = tiles[id];
    if (!tile) {
      problems.push(`no tile for ${id}`);
      continue;
    }
    check(() => assertShows(tile.baseline ?? '', value(report.baseline), `${id} baseline`));
    check(() => assertShows(tile.suggested ?? '', value(report.suggested), `${id} with suggestions`));
  }
  return problems;
}
