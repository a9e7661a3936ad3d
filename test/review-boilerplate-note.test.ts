// Lines repeated across documents — signatures, disclaimers, form footers, licence headers — add
// the same similarity to every pair that holds them, and a stop list cannot remove a line. The
// Report names them (engine/matrix/repeated-lines.ts, engine/review/boilerplate-note.ts). The
// bundled sample (our own invented tickets) carries such lines; Python's csv module and str
// methods (Debian's python3) count, for each line, the tickets that hold it: the figures the note
// must give.
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import * as path from 'node:path';
import { RepeatedLineCounter, mergeRepeatedLines } from '../extension/src/engine/matrix/repeated-lines';
import { boilerplateNote } from '../extension/src/engine/review/boilerplate-note';
import { startReview } from '../extension/src/engine/review/start-review';

const SAMPLE = path.join(__dirname, '..', 'samples', 'support-tickets.csv');

/** Per line of at least 4 words or 24 characters (trimmed, in tickets of two lines or more): the tickets holding it, most first, as Python counts them. */
function pythonLineCounts(): { documents: number; lines: Array<[string, number]> } {
  const script = [
    'import csv, json, sys, collections',
    'rows = list(csv.DictReader(open(sys.argv[1], newline="", encoding="utf-8")))',
    'count = collections.Counter()',
    'for r in rows:',
    '    lines = [l.strip() for l in r["message"].split("\\n") if l.strip()]',
    '    if len(lines) < 2: continue',
    '    count.update(set(l for l in lines if len(l) >= 24 or len(l.split()) >= 4))',
    'print(json.dumps({"documents": len(rows), "lines": sorted(count.items(), key=lambda kv: (-kv[1], kv[0]))}))',
  ].join('\n');
  return JSON.parse(execFileSync('/usr/bin/python3', ['-c', script, SAMPLE], { encoding: 'utf8', maxBuffer: 64 << 20 })) as { documents: number; lines: Array<[string, number]> };
}

describe('lines repeated across documents: named in a note', function () {
  this.timeout(120_000);

  it('the sample: the lines in at least 5% of the tickets, with the shares Python counts, most first', async () => {
    const python = pythonLineCounts();
    const expected = python.lines.filter(([, n]) => n >= 10 && n / python.documents >= 0.05);
    assert.ok(expected.length >= 4, `the sample's signatures and disclaimers: ${JSON.stringify(expected)}`);
    const { report } = await startReview({ file: SAMPLE, configPath: null, overrides: { stopList: null } }, { reportOnly: true });
    const note = (report.input.notes ?? []).find((n) => n.includes('same lines recur')) ?? '';
    const shown = expected.slice(0, 3).map(([line, n], i) => `"${line}" (${Math.round((100 * n) / python.documents)}%${i === 0 ? ' of the documents' : ''})`);
    assert.ok(note.includes(`${shown.join(', ')} and ${expected.length - 3} more.`), note);
    assert.doesNotMatch(note, /counted on/, 'every ticket is checked');
  });

  it('one-line documents hold no repeated line (a repeated document is a duplicate), and short greetings do not count', () => {
    const counter = new RepeatedLineCounter();
    for (let d = 0; d < 100; d++) counter.add(d, d % 2 === 0 ? 'the same one-line document, over and over' : 'Hi,\nThanks\nplain words of its own ' + d);
    const result = counter.result();
    assert.equal(result.checked, 100);
    assert.deepEqual(result.lines, []);
    assert.equal(boilerplateNote(result, 100), null);
  });

  it('past 4,000 documents a seeded share is checked: a footer in every tenth document reads about 10%, not an alias of the stride', () => {
    const counter = new RepeatedLineCounter();
    const n = 100_000;
    for (let d = 0; d < n; d++) counter.add(d, `document ${d} says its own words\n${d % 10 === 0 ? 'This message was sent from the web form' : `and a line of its own, number ${d}`}`);
    const { checked, lines } = counter.result();
    assert.ok(checked > 2000 && checked <= 4000, `checked ${checked}`);
    const footer = lines.find(([line]) => line === 'This message was sent from the web form');
    assert.ok(footer !== undefined);
    const share = footer[1] / checked;
    assert.ok(share > 0.08 && share < 0.12, `share ${share}`);
    assert.match(boilerplateNote({ checked, lines }, n) ?? '', new RegExp(`"This message was sent from the web form" \\(${Math.round(100 * share)}% of the documents\\) \\(counted on ${checked.toLocaleString('en-US')} documents drawn from the 100,000\\)`));
  });

  it('parts (files, shards) add up; a long document is read at its two ends', () => {
    const long = `Licence header line for every file\n${'middle words of the body\n'.repeat(2000)}Signature line at the very end\n`;
    const counter = new RepeatedLineCounter();
    for (let d = 0; d < 20; d++) counter.add(d, long.replace('middle words', `middle words ${d}`));
    const lines = new Map(counter.result().lines);
    assert.equal(lines.get('Licence header line for every file'), 20);
    assert.equal(lines.get('Signature line at the very end'), 20);
    const merged = mergeRepeatedLines([counter.result(), counter.result()]);
    assert.equal(merged.checked, 40);
    assert.equal(new Map(merged.lines).get('Signature line at the very end'), 40);
  });
});
