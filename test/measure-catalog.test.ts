// The one measure catalog (extension/src/measure-catalog.ts): every figure of Measures is shown,
// changes are judged by the declared direction, and the README's table is the catalog's own.
import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { betterWord, judgeChange, judgedChangeWord, measureCatalog, type MeasureSpec } from '../extension/src/measure-catalog';
import type { Measures } from '../extension/src/protocol';
import { distinctMeasures } from './reference/distinct-measures';

const root = path.join(__dirname, '..');

/** The README's "What is measured" table, written from the catalog. */
function readmeMeasureTable(): string {
  const rows = measureCatalog.map((s) => `| ${s.label} | ${s.meaning} | ${betterWord(s.better)} | §${s.methods} |`);
  return ['| measure | meaning | healthier | docs/methods.md |', '|---|---|---|---|', ...rows].join('\n');
}

const spec = (id: string): MeasureSpec => {
  const s = measureCatalog.find((x) => x.id === id);
  if (!s) throw new Error(`no measure ${id}`);
  return s;
};

describe('measure catalog', () => {
  it('shows every figure of Measures once (sample and chart data aside), under unique ids and labels', () => {
    const m = distinctMeasures();
    // The figures, listed from protocol.ts's Measures by hand (p10/p90 are the contrast detail line).
    const figures = [0.101, 1.02, 0.103, 1.06, 107, 1.08, 109, 110, 11.1, 11.2, 0.113, 0.114, 0.115, 0.116, 0.117];
    const shown = measureCatalog.map((s) => s.value(m));
    assert.deepEqual([...shown].sort(), [...figures].sort());
    assert.equal(new Set(measureCatalog.map((s) => s.id)).size, measureCatalog.length);
    assert.equal(new Set(measureCatalog.map((s) => s.label)).size, measureCatalog.length);
    assert.equal(spec('contrastMedian').detail?.(m), 'p10–p90 0.0104–0.105');
  });

  it('reads null where the Report has no answer', () => {
    const m: Measures = { ...distinctMeasures(), contrast: null, hubness: null, radiusSlack: null, labelPrecisionAtK: null };
    for (const id of ['contrastMedian', 'hubnessSkewness', 'hubs', 'orphans', 'radiusSlack', 'labelPrecisionAtK']) assert.equal(spec(id).value(m), null, id);
  });

  it('judges a change by the healthier direction, and not at all for figures shown for reference', () => {
    // Hand cases (common practice, no source): lower background similarity and higher standout are
    // the directions that went with better label precision in docs/methods.md §4.
    assert.equal(judgeChange(spec('backgroundSimilarity'), 0.154, 0.065), 'better');
    assert.equal(judgeChange(spec('backgroundSimilarity'), 0.065, 0.154), 'worse');
    assert.equal(judgeChange(spec('neighborStandout'), 5.9, 6.25), 'better');
    assert.equal(judgeChange(spec('hubs'), 249, 325), 'worse');
    // Values that print the same are unchanged, whatever the direction.
    assert.equal(judgeChange(spec('neighborStandout'), 5.901, 5.904), 'same');
    assert.equal(judgeChange(spec('iidEquivalentDimension'), 68.1, 77.2), 'neutral');
    assert.equal(judgeChange(spec('contrastMedian'), 1.33, 1.38), 'neutral');
    assert.equal(judgeChange(spec('neighborTurnover'), null, 0.5), 'unknown');
    assert.equal(judgedChangeWord(spec('contrastMedian'), 1.33, 1.38), '');
    assert.equal(judgedChangeWord(spec('hubs'), 249, 249), 'unchanged');
  });

  it('the concentration figures are shown, not judged (they fall or rise the wrong way on text, docs/methods.md §4)', () => {
    for (const id of ['iidEquivalentDimension', 'contrastMedian', 'meanToNearest', 'intrinsicTwoNN', 'intrinsicMle', 'neighborTurnover']) {
      assert.equal(spec(id).better, 'neither', id);
    }
  });

  it("the README's measure table is the catalog's", () => {
    const readme = readFileSync(path.join(root, 'README.md'), 'utf8').replace(/\r\n/g, '\n');
    const expected = readmeMeasureTable();
    assert.ok(readme.includes(expected), `README.md's "What is measured" table must read:\n\n${expected}\n`);
  });
});
