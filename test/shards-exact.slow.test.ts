// A review in shards equals the review in one process over the same files (issue 11 point 4).
// Slow (two whole reviews of each corpus, the shard one reading every shard three times).
// Corpora: Debian's `fortunes` package (package data, labelled by category), and generated
// documents (seeded, no outside source). The reference is our own one-process review: the check
// is that map (per shard) + merge gives the same Report — same sample, same suggestions, every
// figure equal to 1e-12 (only the order in which shard subtotals are added differs).
import { strict as assert } from 'node:assert';
import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { parquetWriteBuffer } from 'hyparquet-writer';
import type { Report } from '../extension/src/protocol';
import { loadReviewSettings, provenanceOf } from '../extension/src/engine/review/review-settings';
import { startReview } from '../extension/src/engine/review/start-review';
import { reviewShards } from '../extension/src/engine/shards/review-shards';
import { reportDifferences } from './support/report-diff';
import { fortuneDocs, generatedDocs, writeGzipJsonl, writeShards } from './support/shard-corpora';
import { scratchFolder } from './support/scratch-folder';

const OVERRIDES = { label: 'label', stopList: null, sample: { documents: 400 } };

async function bothWays(corpus: string): Promise<{ one: Report; shards: Report }> {
  const input = { file: corpus, configPath: null, overrides: OVERRIDES };
  const one = (await startReview(input)).report;
  const { settings, configDir, sources } = await loadReviewSettings(input);
  const shards = await reviewShards({ corpus, settings, configDir, provenance: provenanceOf(input, sources) });
  return { one, shards };
}

function assertSame(one: Report, shards: Report, name: string): void {
  const { differences, largest } = reportDifferences(one, shards);
  console.log(`      ${name}: ${one.input.documents} documents, ${one.suggestions.length} suggestions, largest relative difference ${largest.toExponential(1)}`);
  assert.deepEqual(differences, []);
  assert.deepEqual(shards.suggestions, one.suggestions);
  assert.deepEqual(shards.hubs.map((h) => h.doc), one.hubs.map((h) => h.doc));
}

describe('review in shards = review in one process', function () {
  this.timeout(300_000);
  const dir = scratchFolder('loudword-shards-');

  it('Debian fortunes in 8 JSON Lines shards: the same Report', async () => {
    const shardDir = path.join(dir(), 'fortunes');
    mkdirSync(shardDir);
    writeShards(shardDir, fortuneDocs(150), 8);
    const { one, shards } = await bothWays(path.join(shardDir, '*.jsonl'));
    assert.ok(one.suggestions.length > 0, 'a corpus with loud terms to find');
    assertSame(one, shards, 'fortunes');
  });

  it('documents repeated across shards, more distinct than the duplicates sketch keeps: the same duplicates estimate', async () => {
    const shardDir = path.join(dir(), 'duplicates');
    mkdirSync(shardDir);
    const docs = generatedDocs(5000, 9);
    // Copies land in other shards than their originals (writeShards deals documents round robin).
    const withCopies = [...docs, ...docs.slice(0, 900).map((d, i) => (i % 3 === 0 ? docs[i * 5]! : d))];
    writeShards(shardDir, withCopies, 3);
    const { one, shards } = await bothWays(path.join(shardDir, '*.jsonl'));
    assert.equal(one.vocabulary.duplicates?.exact, false);
    assert.ok(one.vocabulary.duplicates!.documents > 0);
    assert.deepEqual(shards.vocabulary.duplicates, one.vocabulary.duplicates);
    assertSame(one, shards, 'duplicates');
  });

  it('definitions whose formula opens with a grammar word, in 4 shards: the same Report, the head kept in both', async () => {
    // Generated (seeded) definitions: a third open "someone who …", the rest "the …" or a topic
    // word, so "someone" opens most of the documents it is in; the shards must add up the counts.
    const shardDir = path.join(dir(), 'formula');
    mkdirSync(shardDir);
    const docs = generatedDocs(600, 5).map((d, i) => ({ text: `${i % 3 === 0 ? 'someone who' : i % 3 === 1 ? 'the' : ''} ${d.text}`, label: d.label }));
    docs[1] = { text: `${docs[1]!.text} for someone`, label: docs[1]!.label };
    writeShards(shardDir, docs, 4);
    const { one, shards } = await bothWays(path.join(shardDir, '*.jsonl'));
    for (const report of [one, shards]) {
      const row = report.terms.find((t) => t.term === 'someone');
      assert.ok(row !== undefined && row.status === 'kept' && /open a document/.test(row.why), `someone: ${row?.status} ${row?.why}`);
    }
    assertSame(one, shards, 'formula');
  });

  it('generated data in 8 shards of three formats (JSON Lines, .jsonl.gz, Parquet): the same Report', async () => {
    const shardDir = path.join(dir(), 'generated');
    mkdirSync(shardDir);
    const docs = generatedDocs(2400, 11);
    // One document with a run far over the tokenizer's limit, so both paths must carry its note.
    docs[5] = { text: `${'x'.repeat(3000)} t0w1 com2`, label: docs[5]!.label };
    const files = writeShards(shardDir, docs, 8);
    // Shard 6 as gzip, shard 7 as Parquet: the same documents in the same order.
    const part6 = docs.filter((_, i) => i % 8 === 6);
    writeGzipJsonl(path.join(shardDir, 'part-6.jsonl.gz'), part6);
    rmSync(files[6]!);
    const part7 = docs.filter((_, i) => i % 8 === 7);
    const parquet = parquetWriteBuffer({
      columnData: [
        { name: 'text', data: part7.map((d) => d.text), type: 'STRING' },
        { name: 'label', data: part7.map((d) => d.label), type: 'STRING' },
      ],
      rowGroupSize: 100,
    });
    writeFileSync(path.join(shardDir, 'part-7.parquet'), Buffer.from(parquet));
    rmSync(files[7]!);
    const { one, shards } = await bothWays(shardDir);
    assert.equal(one.input.documents, 2400);
    // The note names the file and the line (the document is the first of part-5.jsonl).
    assert.ok(
      (one.input.notes ?? []).some((n) => /^part-5\.jsonl: 1 run of text without spaces longer than 1,000 characters in 1 document \(line 1\)/.test(n)),
      `a note on the over-long run naming file and line: ${JSON.stringify(one.input.notes)}`,
    );
    assertSame(one, shards, 'generated');
  });

});
