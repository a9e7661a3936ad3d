// Whole-review invariants and edge cases (issue "Robustness and security"): generated corpora
// must never crash the review, and the what-if must agree with the Report it came from.
// Invariants follow from the definitions in docs/methods.md §3 (shares of a total sum to at most 1) and
// from the what-if's contract (the suggested figures are what applying the suggestions gives).
// Common practice, no source.
import { strict as assert } from 'node:assert';
import { appendFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import fc from 'fast-check';
import { startReview } from '../extension/src/engine/review/start-review';
import type { Measures } from '../extension/src/protocol';
import { isUserError } from '../extension/src/engine/user-error';

const WORDS = ['alpha', 'beta', 'gamma', 'delta', 'the', 'and', 'of', 'river', 'stone', 'cloud', 'not', 'seven', 'blue', 'green'];

function headline(m: Measures) {
  return [m.backgroundSimilarity, m.neighborStandout, m.hubness?.skewness ?? null, m.labelPrecisionAtK, m.topTermsMassShare.top10, m.contrast?.median ?? null];
}

async function reviewText(text: string, extra: { label?: string; stopListText?: string } = {}) {
  return startReview({
    file: 'generated.jsonl',
    text,
    configPath: null,
    ...(extra.stopListText !== undefined ? { stopListText: extra.stopListText } : {}),
    // The stop list's text stands in for the named file's (as an unsaved editor buffer does).
    overrides: { format: 'jsonl', text: 'text', label: extra.label ?? null, stopList: extra.stopListText !== undefined ? 'stoplist.txt' : null, sample: { documents: 50, k: 3 } },
  });
}

describe('startReview invariants on generated corpora', function () {
  this.timeout(300_000);
  let cases = 0;
  after(() => console.log(`      generated review cases: ${cases}`));

  it('never fails with anything but a UserError; applying the suggestions gives the measures promised as suggested; shares ≤ 1', async () => {
    let appliedCases = 0;
    const doc = fc.array(fc.constantFrom(...WORDS), { minLength: 0, maxLength: 12 }).map((ws) => ws.join(' '));
    const corpus = fc.array(fc.record({ text: doc, label: fc.constantFrom('a', 'b', 'c') }), { minLength: 1, maxLength: 40 });
    await fc.assert(
      fc.asyncProperty(corpus, async (rows) => {
        cases++;
        const text = rows.map((r) => JSON.stringify(r)).join('\n') + '\n';
        let session;
        try {
          session = await reviewText(text, { label: 'label' });
        } catch (e) {
          assert.ok(isUserError(e), `unexpected ${(e as Error).stack}`);
          return;
        }
        const r = session.report;
        // A fresh review whose stop list holds the suggestions (what `loudword apply` writes) goes
        // through the stop-list loader and the tokenizer again: its baseline must be the Report's
        // `suggested`, or the panel promised figures the user will not get.
        if (r.suggestions.length > 0) {
          appliedCases++;
          const applied = await reviewText(text, { label: 'label', stopListText: r.suggestions.join('\n') + '\n' });
          assert.deepEqual(headline(applied.report.baseline), headline(r.suggested));
          assert.deepEqual(applied.report.terms.filter((t) => t.status === 'stopped').map((t) => t.term).sort(), [...r.suggestions].sort());
        }
        const kept = r.terms.filter((t) => t.status !== 'stopped');
        const total = kept.reduce((s, t) => s + t.pullShare, 0);
        assert.ok(total <= 1 + 1e-9, `pull shares sum to ${total}`);
        for (const t of r.terms) assert.ok(t.pullShare >= 0 && t.pullShare <= 1 + 1e-12);
        for (const h of r.hubs) assert.ok(h.line >= 1 && h.line <= rows.length);
        assert.ok(r.baseline.backgroundSimilarity >= 0 && r.baseline.backgroundSimilarity <= 1 + 1e-12);
      }),
      { numRuns: 60, seed: 20261202 },
    );
    assert.ok(appliedCases >= 10, `only ${appliedCases} generated corpora had suggestions to apply`);
  });

  it('all documents identical: a defined Report, no suggestion can separate them', async () => {
    const text = Array.from({ length: 30 }, () => JSON.stringify({ text: 'the same words in every row' })).join('\n');
    const r = (await reviewText(text)).report;
    assert.equal(r.input.documents, 30);
    assert.ok(Math.abs(r.baseline.backgroundSimilarity - 1) < 1e-9);
  });

  it('documents with no tokens at all: a UserError naming the file', async () => {
    const text = ['!!!', '...', '?'].map((t) => JSON.stringify({ text: t })).join('\n');
    await assert.rejects(reviewText(text), (e: unknown) => isUserError(e) && e.file === 'generated.jsonl');
  });

  it('a text field of URLs: the UserError names the field, why nothing was kept, and the other fields', async () => {
    const text = [1, 2, 3].map((i) => JSON.stringify({ url: `https://example.org/news/${i}/the-river-rose`, title: `the river rose ${i}` })).join('\n');
    const run = startReview({ file: 'n.jsonl', text, configPath: null, overrides: { format: 'jsonl', text: 'url', stopList: null } });
    await assert.rejects(run, (e: unknown) => {
      assert.ok(isUserError(e));
      assert.match(e.message, /of the text field "url": no token of a kind the settings keep was found \(URLs, e-mail addresses and punctuation are dropped by default\); another field may hold the text \(--text, "text" in loudword\.json\): title;/);
      return true;
    });
  });

  it('one document: measures that need pairs are null, nothing throws', async () => {
    const r = (await reviewText(JSON.stringify({ text: 'a single lonely document about rivers' }))).report;
    assert.equal(r.input.documents, 1);
    assert.equal(r.baseline.neighborStandout, null);
  });

  it('one document: nothing suggested, though its grammar words are in every document, and the verdict says why', async () => {
    const r = (await reviewText(JSON.stringify({ text: 'the cat sat on the mat and it was not happy' }))).report;
    assert.deepEqual(r.suggestions, []);
    assert.equal(r.verdict?.outcome, 'nothing suggested');
    assert.match(r.verdict!.headline, /a corpus of one document has no pairs of documents/);
    // Too few words to say anything about their language.
    assert.doesNotMatch(r.verdict!.headline, /rule 2 knows are English/);
  });

  it('stop-list entries go through the tokenizer: with stemming, "Running" stops the stem of "runs"', async () => {
    const text = ['runs along the river', 'running stones', 'the river runs'].map((t) => JSON.stringify({ text: t })).join('\n');
    const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-stem-'));
    const config = path.join(dir, 'loudword.json');
    writeFileSync(config, JSON.stringify({ tokens: { stem: true }, format: 'jsonl', text: 'text' }));
    try {
      const session = await startReview({ file: path.join(dir, 'c.jsonl'), text, configPath: config, stopListText: '# comment\nRunning\nNeverSeen\n' });
      const run = session.report.terms.find((t) => t.term === 'run');
      assert.equal(run?.status, 'stopped');
      assert.deepEqual(session.report.stopList.unused, ['NeverSeen']);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('an unused stop-list entry that the tokenizer reads as several terms, or none, is said to be one (wink: "Don\'t" is do + not)', async () => {
    const text = ['we do not cross the river in new york', 'the river does not run'].map((t) => JSON.stringify({ text: t })).join('\n');
    const session = await startReview({ file: 'c.jsonl', text, configPath: null, overrides: { format: 'jsonl', text: 'text' }, stopListText: "Don't\nnew york\n—\nNeverSeen\nriver\n" });
    assert.deepEqual(session.report.stopList.unused, ["Don't", 'new york', '—', 'NeverSeen']);
    assert.deepEqual(session.report.stopList.split, { "Don't": ['do', 'not'], 'new york': ['new', 'york'], '—': [] });
    // With pairs of words as terms, "new york" is one of them, and it occurs.
    const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-pairs-'));
    const config = path.join(dir, 'loudword.json');
    writeFileSync(config, JSON.stringify({ tokens: { ngrams: 2 }, format: 'jsonl', text: 'text' }));
    try {
      const pairs = await startReview({ file: path.join(dir, 'c.jsonl'), text, configPath: config, stopListText: 'new york\nnew jersey\n' });
      assert.deepEqual(pairs.report.stopList.unused, ['new jersey']);
      assert.equal(pairs.report.stopList.split, undefined, 'a pair kept whole simply never occurs');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('an aborted review rejects with AbortError', async () => {
    const controller = new AbortController();
    const text = Array.from({ length: 50 }, (_, i) => JSON.stringify({ text: `river stone ${i}` })).join('\n');
    const run = startReview(
      { file: 'g.jsonl', text, configPath: null, overrides: { format: 'jsonl', text: 'text', stopList: null } },
      { signal: controller.signal, onStage: (s) => s === 'tokenizing' && controller.abort() },
    );
    await assert.rejects(run, (e: unknown) => (e as Error).name === 'AbortError');
  });

  it('a file changed while it is read: the review refuses the mixed result with a UserError', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-snapshot-'));
    const file = path.join(dir, 'corpus.txt');
    writeFileSync(file, Array.from({ length: 200 }, (_, i) => `river stone cloud number ${i}`).join('\n') + '\n');
    try {
      const run = startReview(
        { file, configPath: null, overrides: { stopList: null } },
        { onStage: (s) => s === 'tokenizing' && appendFileSync(file, 'a late line written by another program\n') },
      );
      await assert.rejects(run, (e: unknown) => isUserError(e) && /changed while it was being read/.test(e.message));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
