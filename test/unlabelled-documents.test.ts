// Documents whose label cell is empty: label precision does not score them and counts them as
// misses when they are neighbours (engine/measures/label-precision.ts), which a user with a
// partly labelled corpus would not expect. The Report counts them (input.unlabelled) and says so
// in a note; a label field with no value at all cannot judge the list, and the verdict says that
// instead of "too few sampled documents have neighbours". The corpus is the bundled sample (our
// own invented tickets) with labels blanked by Python's csv module (Debian's python3), which also
// counts the blanks: the count the Report must give.
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import * as path from 'node:path';
import { unlabelledCount, unlabelledNote } from '../extension/src/engine/review/unlabelled-note';
import { blindLabels } from '../extension/src/engine/terms/judge-suggestions';
import { startReview } from '../extension/src/engine/review/start-review';
import { loadSettings } from '../extension/src/engine/config/load-settings';
import { reviewShards } from '../extension/src/engine/shards/review-shards';
import { scratchFolder } from './support/scratch-folder';

const SAMPLE = path.join(__dirname, '..', 'samples', 'support-tickets.csv');

/**
 * Writes the sample to `out` with the "topic" of every row whose position (from 0) is a multiple
 * of `every` made empty (every = 1: all of them); returns how many Python's csv module blanked.
 */
function blankLabels(out: string, every: number): number {
  const script = [
    'import csv, sys',
    'src, out, every = sys.argv[1], sys.argv[2], int(sys.argv[3])',
    'rows = list(csv.DictReader(open(src, newline="", encoding="utf-8")))',
    'blank = 0',
    'for i, r in enumerate(rows):',
    '    if i % every == 0:',
    '        r["topic"] = ""',
    '    blank += r["topic"] == ""',
    'w = csv.DictWriter(open(out, "w", newline="", encoding="utf-8"), fieldnames=list(rows[0].keys()))',
    'w.writeheader()',
    'w.writerows(rows)',
    'print(blank)',
  ].join('\n');
  return Number(execFileSync('/usr/bin/python3', ['-c', script, SAMPLE, out, String(every)], { encoding: 'utf8' }).trim());
}

describe('documents without a label: counted, said, and never judged as if labelled', function () {
  this.timeout(180_000);
  const dir = scratchFolder('loudword-unlabelled-');

  it('unlabelledCount and unlabelledNote: counts, plural, none, all', () => {
    assert.equal(unlabelledCount(null), 0);
    assert.equal(unlabelledCount(['a', null, 'b', null]), 2);
    assert.equal(unlabelledNote(0, 10, 'topic'), null, 'every document labelled');
    assert.equal(unlabelledNote(3, 10, null), null, 'no label field');
    assert.match(unlabelledNote(1, 1200, 'topic') ?? '', /^1 of 1,200 documents \(<1%\) has no label in "topic"/);
    assert.match(unlabelledNote(600, 1200, 'meta.class') ?? '', /^600 of 1,200 documents \(50%\) have no label in "meta\.class" .*counts as a miss/);
    assert.match(unlabelledNote(5, 5, 'topic') ?? '', /^None of the 5 documents has a label in "topic".*no label precision can be measured/);
  });

  it('blindLabels: a sample with no label at all cannot judge, whatever the figures', () => {
    const nan = Float64Array.from([Number.NaN, Number.NaN]);
    assert.match(blindLabels(nan, nan, Int32Array.from([-1, -1])) ?? '', /no sampled document has a label/);
    assert.equal(blindLabels(nan, nan, null), null, 'without a label field the caller judges by standout anyway');
  });

  it('the sample with every third topic blanked: the Report counts what Python blanked, the note says it, precision judges the rest', async () => {
    const file = path.join(dir(), 'third-blank.csv');
    const blanked = blankLabels(file, 3);
    assert.ok(blanked > 900 && blanked < 1100, `the sample's 3,000 tickets, a third blanked: ${blanked}`);
    const { report } = await startReview({ file, configPath: null, overrides: { label: 'topic', stopList: null } }, { reportOnly: true });
    assert.equal(report.input.unlabelled, blanked);
    assert.ok(report.input.notes?.some((n) => n.startsWith(`${blanked.toLocaleString('en-US')} of ${report.input.documents.toLocaleString('en-US')} documents`)), JSON.stringify(report.input.notes));
    assert.equal(report.verdict.estimate?.measure, 'label precision@10');
  });

  it('every topic blanked: no precision anywhere, the verdict by standout says why, and the shards say the same', async () => {
    const folder = path.join(dir(), 'all-blank');
    mkdirSync(folder);
    const file = path.join(folder, 'all-blank.csv');
    const blanked = blankLabels(file, 1);
    const { report } = await startReview({ file, configPath: null, overrides: { label: 'topic', stopList: null } }, { reportOnly: true });
    assert.equal(report.input.unlabelled, blanked);
    assert.equal(report.input.unlabelled, report.input.documents);
    assert.equal(report.baseline.labelPrecisionAtK ?? null, null);
    assert.equal(report.verdict.estimate?.measure, 'neighbour standout');
    assert.match(report.verdict.headline, /no sampled document has a label/);
    assert.doesNotMatch(report.verdict.headline, /too few sampled documents have neighbours/);
    assert.ok(report.input.notes?.some((n) => /^None of the .* documents has a label in "topic"/.test(n)), JSON.stringify(report.input.notes));

    const { settings } = await loadSettings(null, { label: 'topic', stopList: null });
    const sharded = await reviewShards({ corpus: folder, settings, configDir: null });
    assert.equal(sharded.input.unlabelled, blanked);
    assert.deepEqual(sharded.input.notes?.filter((n) => /label/.test(n)), report.input.notes?.filter((n) => /label/.test(n)));
    assert.match(sharded.verdict.headline, /no sampled document has a label/);
  });
});
