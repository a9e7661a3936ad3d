// The duplicates sketch (engine/matrix/duplicate-sketch.ts): exact counts against counting equal
// rows one by one (the definition), the merge of parts equal to the sketch of the whole (what
// makes a review in shards report what one process reports), the estimate beyond the sketch's
// size, and the note a review then carries. Bottom-k sketches: Cohen & Kaplan, PODC 2007; the
// KMV estimate of distinct values: Bar-Yossef et al., RANDOM 2002 (both cited from memory).
import { strict as assert } from 'node:assert';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { DUPLICATE_SKETCH_SIZE, duplicatesOf, mergeSketches, sketchRows } from '../extension/src/engine/matrix/duplicate-sketch';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { startReview } from '../extension/src/engine/review/start-review';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { scratchFolder } from './support/scratch-folder';

/** A matrix of `rows` (each a list of [column, value], columns ascending). */
function csr(rows: Array<Array<[number, number]>>, cols = 1000): Csr {
  const indptr = new Uint32Array(rows.length + 1);
  rows.forEach((r, i) => (indptr[i + 1] = indptr[i]! + r.length));
  const flat = rows.flat();
  return { rows: rows.length, cols, indptr, indices: Uint32Array.from(flat, (e) => e[0]), data: Float64Array.from(flat, (e) => e[1]) };
}

/** Random distinct rows, then `copies` of randomly chosen ones, shuffled. */
function rowsWithCopies(distinct: number, copies: number, seed: number): Array<Array<[number, number]>> {
  const random = mulberry32(seed);
  const base = Array.from({ length: distinct }, (_, i) => {
    const cols = new Set<number>([i % 1000]);
    while (cols.size < 2 + Math.floor(random() * 6)) cols.add(Math.floor(random() * 1000));
    return [...cols].sort((a, b) => a - b).map((c): [number, number] => [c, Math.round(random() * 1e6) / 1e6 + 0.001]);
  });
  const all = [...base, ...Array.from({ length: copies }, () => base[Math.floor(random() * distinct)]!)];
  for (let i = all.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [all[i], all[j]] = [all[j]!, all[i]!];
  }
  return all;
}

/** Documents that repeat an earlier one, by the definition: rows equal entry for entry. */
function bruteForce(rows: Array<Array<[number, number]>>): number {
  const seen = new Set<string>();
  let repeats = 0;
  for (const r of rows) {
    if (r.length === 0) continue;
    const key = JSON.stringify(r);
    if (seen.has(key)) repeats++;
    else seen.add(key);
  }
  return repeats;
}

describe('the duplicates sketch', () => {
  it('counts exactly the rows that repeat another, as the definition does, up to its size', () => {
    for (const [distinct, copies, seed] of [[50, 0, 1], [300, 120, 2], [2000, 900, 3]] as const) {
      const rows = rowsWithCopies(distinct, copies, seed);
      rows.push([]); // an empty row is no document's duplicate
      rows.push([]);
      const got = duplicatesOf(sketchRows(csr(rows)));
      assert.deepEqual(got, { documents: bruteForce(rows), exact: true });
    }
  });

  it('tells rows apart that differ in one value or one column', () => {
    const got = duplicatesOf(sketchRows(csr([[[1, 0.5], [2, 0.5]], [[1, 0.5], [2, 0.5000000000000001]], [[1, 0.5], [3, 0.5]], [[1, 0.5], [2, 0.5]]])));
    assert.deepEqual(got, { documents: 1, exact: true });
  });

  it('merges parts into exactly the sketch of the whole, within its size and beyond it', () => {
    for (const k of [DUPLICATE_SKETCH_SIZE, 64]) {
      const rows = rowsWithCopies(3000, 1000, 4);
      const whole = sketchRows(csr(rows), k);
      const cuts = [0, 700, 701, 2500, rows.length];
      const parts = cuts.slice(1).map((end, i) => sketchRows(csr(rows.slice(cuts[i], end)), k));
      assert.deepEqual(mergeSketches(parts, k), whole);
      assert.equal(whole.truncated, k === 64);
    }
  });

  it('estimates beyond its size within 10% (20,000 distinct documents, 5,000 repeats)', () => {
    const rows = rowsWithCopies(20000, 5000, 5);
    const got = duplicatesOf(sketchRows(csr(rows)));
    assert.equal(got.exact, false);
    const truth = bruteForce(rows);
    assert.ok(Math.abs(got.documents - truth) <= 0.1 * truth, `estimated ${got.documents}, truly ${truth}`);
    console.log(`      20,000 distinct + 5,000 copies: ${truth} repeats, estimated ${got.documents}`);
  });

  describe('in a review', function () {
    this.timeout(60_000);
    const dir = scratchFolder('loudword-duplicates-');

    it('a corpus with planted copies reports them, exactly, with a note; one without has no note', async () => {
      // Letters, not digits, tell the tickets apart: the default tokens keep words only.
      const word = (n: number): string => String.fromCharCode(97 + (n % 26), 97 + (Math.floor(n / 26) % 26), 97 + (Math.floor(n / 676) % 26));
      const texts = Array.from({ length: 400 }, (_, i) => `ticket ${word(i)} about the boiler ${word(i * 7 + 3)} and valve ${word(i % 11)}`);
      const copies = texts.slice(0, 60);
      const file = path.join(dir(), 'tickets.jsonl');
      writeFileSync(file, [...texts, ...copies].map((text) => JSON.stringify({ text })).join('\n') + '\n');
      const r = (await startReview({ file, configPath: null, overrides: { text: 'text', label: null, stopList: null } })).report;
      assert.deepEqual(r.vocabulary.duplicates, { documents: 60, exact: true });
      assert.match((r.input.notes ?? []).join(' '), /^60 documents \(13%\) repeat another document exactly/m);
      const clean = path.join(dir(), 'clean.jsonl');
      writeFileSync(clean, texts.map((text) => JSON.stringify({ text })).join('\n') + '\n');
      const c = (await startReview({ file: clean, configPath: null, overrides: { text: 'text', label: null, stopList: null } })).report;
      assert.deepEqual(c.vocabulary.duplicates, { documents: 0, exact: true });
      assert.doesNotMatch((c.input.notes ?? []).join(' '), /repeat another document/);
    });
  });
});
