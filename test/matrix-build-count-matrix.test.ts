import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { buildCountMatrix, partsOfAtMost } from '../extension/src/engine/matrix/build-count-matrix';
import type { CountMatrix } from '../extension/src/engine/matrix/csr';
import type { CorpusRow } from '../extension/src/engine/read/corpus-source';
import { createTokenizer, type TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';
import { arrayCorpusSource } from './reference/array-corpus-source';
import { readFortunes } from './reference/read-fortunes';
import { termCountStats } from '../extension/src/engine/terms/term-count-stats';
import { maskedTermSums } from '../extension/src/engine/measures/masked-term-sums';
import type { MaskedTermSumsWork } from '../extension/src/engine/measures/start-masked-term-sums';
import { matrixPassThreads, sameMatrix } from '../extension/src/engine/threads/matrix-pass-threads';
import { startOneShot } from '../extension/src/engine/threads/one-shot-thread';
import { weighInPlace, type WeightingSettings } from '../extension/src/engine/matrix/weigh';
import { weighingAhead } from '../extension/src/engine/review/prepare-weights';

const tokens: TokenSettings = { lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams: 1 };

function assertCsrInvariants(m: CountMatrix): void {
  assert.equal(m.indptr.length, m.rows + 1);
  assert.equal(m.indptr[0], 0);
  assert.equal(m.indices.length, m.indptr[m.rows]);
  assert.equal(m.data.length, m.indptr[m.rows]);
  assert.equal(m.terms.length, m.cols);
  assert.equal(m.tokensPerDoc.length, m.rows);
  for (let r = 0; r < m.rows; r++) {
    assert.ok(m.indptr[r]! <= m.indptr[r + 1]!);
    let sum = 0;
    for (let k = m.indptr[r]!; k < m.indptr[r + 1]!; k++) {
      assert.ok(m.indices[k]! < m.cols);
      if (k > m.indptr[r]!) assert.ok(m.indices[k - 1]! < m.indices[k]!, 'column ids ascend within a row');
      assert.ok(m.data[k]! >= 1);
      sum += m.data[k]!;
    }
    assert.equal(sum, m.tokensPerDoc[r]);
  }
}

describe('matrix/build-count-matrix', () => {
  it('partsOfAtMost cuts a batch of long documents into runs of at most the limit, in order', () => {
    // So that a corpus of a few hundred long documents is not one batch for one tokenising thread.
    const texts = ['aaaa', 'bb', 'cccccc', 'd', 'eeeeeeeeee', 'ff'];
    assert.deepEqual(partsOfAtMost(texts, 7), [['aaaa', 'bb'], ['cccccc', 'd'], ['eeeeeeeeee'], ['ff']]);
    assert.deepEqual(partsOfAtMost(texts, 100), [texts]);
    assert.deepEqual(partsOfAtMost(texts, 1), texts.map((t) => [t]));
    assert.deepEqual(partsOfAtMost([], 5), [[]]);
  });

  it('buildCountMatrix counts each document\'s tokens, with lines, labels and previews', async () => {
    const rows: CorpusRow[] = [
      { text: 'the cat sat on the mat', label: 'pets', line: 2 },
      { text: '', label: null, line: 3 },
      { text: '  Dogs   chase\n\tcats. The end  ', label: 'pets', line: 7 },
    ];
    const built = await buildCountMatrix(arrayCorpusSource(rows, 'topic'), tokens, { workers: 0, batchSize: 2 });
    const m = built.counts;
    assertCsrInvariants(m);
    // Expected by hand from the texts above (common practice, no source): sorted distinct terms.
    assert.deepEqual(m.terms, ['cat', 'cats', 'chase', 'dogs', 'end', 'mat', 'on', 'sat', 'the']);
    const row0 = new Map<string, number>();
    for (let k = m.indptr[0]!; k < m.indptr[1]!; k++) row0.set(m.terms[m.indices[k]!]!, m.data[k]!);
    assert.deepEqual([...row0], [['cat', 1], ['mat', 1], ['on', 1], ['sat', 1], ['the', 2]]);
    assert.equal(m.indptr[2]! - m.indptr[1]!, 0, 'the empty document is an empty row');
    assert.deepEqual([...built.lines], [2, 3, 7]);
    assert.deepEqual(built.labels, ['pets', null, 'pets']);
    assert.deepEqual(built.previews, ['the cat sat on the mat', '', 'Dogs chase cats. The end']);
    // Each document's first token: "the", none, "dogs".
    assert.deepEqual([...m.firstTerms].map((c) => (c < 0 ? null : m.terms[c])), ['the', null, 'dogs']);
  });

  it('buildCountMatrix gives null labels when the source has no label field, and cuts previews at 120', async () => {
    const long = 'word '.repeat(100);
    const built = await buildCountMatrix(arrayCorpusSource([{ text: long, label: null, line: 1 }]), tokens, { workers: 0 });
    assert.equal(built.labels, null);
    assert.equal(built.previews[0]!.length, 119); // 120 characters cut after "word", trailing space trimmed
    assert.ok(long.startsWith(built.previews[0]!));
  });

  it('buildCountMatrix orders terms by code point, like Python\'s sorted()', async () => {
    // U+FF21 (full-width A) sorts before U+1F600 (emoji) by code point, after it by UTF-16 unit.
    // Source: Python 3 str ordering compares code points (Python language reference, "Value comparisons").
    const built = await buildCountMatrix(arrayCorpusSource([{ text: '😀 ＡＢ zz Ab ab', label: null, line: 1 }]), tokens, { workers: 0 });
    assert.deepEqual(built.counts.terms, ['ab', 'zz', 'ａｂ', '😀']);
  });

  it('buildCountMatrix agrees with tokenising each fortune directly (Debian fortunes)', async () => {
    const rows = readFortunes(200);
    const built = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 0, batchSize: 37 });
    const m = built.counts;
    assertCsrInvariants(m);
    const tokenize = createTokenizer(tokens);
    for (let r = 0; r < rows.length; r++) {
      const expected = new Map<string, number>();
      const all = tokenize(rows[r]!.text);
      for (const t of all) expected.set(t, (expected.get(t) ?? 0) + 1);
      assert.equal(m.firstTerms[r]! < 0 ? undefined : m.terms[m.firstTerms[r]!], all[0], `row ${r}'s first token`);
      const got = new Map<string, number>();
      for (let k = m.indptr[r]!; k < m.indptr[r + 1]!; k++) got.set(m.terms[m.indices[k]!]!, m.data[k]!);
      assert.deepEqual([...got].sort(), [...expected].sort(), `row ${r}`);
    }
    assert.deepEqual([...built.lines], rows.map((r) => r.line));
  });

  it('buildCountMatrix throws an AbortError when the signal is aborted', async () => {
    const controller = new AbortController();
    const rows = readFortunes(50);
    let seen = 0;
    const promise = buildCountMatrix(arrayCorpusSource(rows), tokens, {
      workers: 0,
      batchSize: 10,
      signal: controller.signal,
      onProgress(documents) {
        seen = documents;
        controller.abort();
      },
    });
    await assert.rejects(promise, (e: Error) => e.name === 'AbortError');
    assert.equal(seen, 10);
  });

  describe('with worker threads', function () {
    let dir = '';
    let script = '';
    before(async function () {
      this.timeout(120000);
      dir = mkdtempSync(join(tmpdir(), 'loudword-tokenize-worker-'));
      script = join(dir, 'tokenize-worker.js');
      // The threads that write the matrix's rows are looked for beside the tokenising ones.
      for (const [entry, name] of [['tokenize/tokenize-worker', 'tokenize-worker'], ['measures/matrix-thread', 'assemble-worker']] as const) {
        await build({
          entryPoints: [`extension/src/engine/${entry}.ts`],
          outfile: join(dir, `${name}.js`),
          bundle: true,
          platform: 'node',
          format: 'cjs',
          target: 'node20',
          logLevel: 'warning',
        });
      }
    });
    after(() => {
      if (dir !== '') rmSync(dir, { recursive: true, force: true });
    });

    it('buildCountMatrix gives the same matrix with 0, 1 and 2 workers', async () => {
      const rows = readFortunes(300);
      const settings: TokenSettings = { ...tokens, ngrams: 2 };
      const inProcess = await buildCountMatrix(arrayCorpusSource(rows), settings, { workers: 0, batchSize: 23 });
      for (const workers of [1, 2]) {
        const progress: number[] = [];
        const threaded = await buildCountMatrix(arrayCorpusSource(rows), settings, {
          workers,
          batchSize: 23,
          workerScript: script,
          onProgress: (d) => progress.push(d),
        });
        assert.equal(progress[progress.length - 1], rows.length);
        // Written by the assembling threads (shared arrays), and the same as written here.
        assert.ok(threaded.counts.indices.buffer instanceof SharedArrayBuffer);
        assert.ok(!(inProcess.counts.indices.buffer instanceof SharedArrayBuffer));
        assert.deepEqual(threaded.counts.terms, inProcess.counts.terms);
        assert.deepEqual(threaded.counts.indptr, inProcess.counts.indptr);
        assert.deepEqual(threaded.counts.indices, inProcess.counts.indices);
        assert.deepEqual(threaded.counts.data, inProcess.counts.data);
        assert.deepEqual(threaded.counts.tokensPerDoc, inProcess.counts.tokensPerDoc);
        assert.deepEqual(threaded.counts.firstTerms, inProcess.counts.firstTerms);
        assert.deepEqual(threaded.previews, inProcess.previews);
        // The raw counts' sums added up as the batches came (by each coder's ids, then moved to
        // columns) are termCountStats's over the finished matrix, to the bit, on either path.
        const stats = termCountStats(inProcess.counts);
        for (const built of [inProcess, threaded]) {
          assert.ok(built.countSums !== null);
          for (const key of ['documents', 'totalTokens', 'sumLengthSq'] as const) assert.equal(built.countSums[key], stats[key], key);
          for (const key of ['df', 'cf', 'sumCountSq', 'sumCountLength'] as const) assert.deepEqual(Array.from(built.countSums[key]), Array.from(stats[key]), key);
        }
      }
    });

    it('counts above 65,535 (a part kept 32-bit beside 16-bit ones) come out whole, with 0, 1 and 2 workers', async () => {
      // packedCounts keeps a batch's counts 16-bit when the largest fits: batches of two documents
      // here give both kinds, so the row writers and the count sums meet both.
      const texts = ['ab '.repeat(70_000) + 'cd', 'ab cd ef', 'ef '.repeat(65_535) + 'gh '.repeat(65_536), 'gh ab', 'ij ij kl'];
      const rows = texts.map((text, i) => ({ text, label: null, line: i + 2 }));
      const want = [
        { ab: 70_000, cd: 1 },
        { ab: 1, cd: 1, ef: 1 },
        { ef: 65_535, gh: 65_536 },
        { ab: 1, gh: 1 },
        { ij: 2, kl: 1 },
      ];
      for (const workers of [0, 1, 2]) {
        const built = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers, batchSize: 2, workerScript: script });
        const m = built.counts;
        assertCsrInvariants(m);
        for (let r = 0; r < m.rows; r++) {
          const got: Record<string, number> = {};
          for (let k = m.indptr[r]!; k < m.indptr[r + 1]!; k++) got[m.terms[m.indices[k]!]!] = m.data[k]!;
          assert.deepEqual(got, want[r], `row ${r}, ${workers} workers`);
        }
        const stats = termCountStats(m);
        assert.ok(built.countSums !== null);
        for (const key of ['documents', 'totalTokens', 'sumLengthSq'] as const) assert.equal(built.countSums[key], stats[key], key);
        for (const key of ['df', 'cf', 'sumCountSq', 'sumCountLength'] as const) assert.deepEqual(Array.from(built.countSums[key]), Array.from(stats[key]), key);
      }
    });

    it('the threads that wrote the rows then wait for passes over the matrix, and make them to the bit', async () => {
      const built = await buildCountMatrix(arrayCorpusSource(readFortunes(300)), tokens, { workers: 2, batchSize: 23, workerScript: script });
      const X = built.counts;
      const removed = new Uint8Array(X.cols);
      for (let c = 0; c < X.cols; c += 5) removed[c] = 1;
      const f64 = (n: number): Float64Array => new Float64Array(new SharedArrayBuffer(8 * n));
      const out = { s1: f64(X.cols), s2: f64(X.cols), df: new Uint32Array(new SharedArrayBuffer(4 * X.cols)), sxlogx: f64(X.cols), rowNorm2: null, rowsWithWeight: new Int32Array(new SharedArrayBuffer(4)) };
      const work: MaskedTermSumsWork = { passes: [{ removed, withSpread: true, out }], status: new Int32Array(new SharedArrayBuffer(4)) };
      // A thread goes from writing to waiting just after its reply (a moment, on a loaded machine).
      let waiting = matrixPassThreads.claim(X.indices.buffer, (t) => sameMatrix(t, X), work);
      for (let tries = 0; waiting === null && tries < 250; tries++) {
        await new Promise((resolve) => setTimeout(resolve, 20));
        waiting = matrixPassThreads.claim(X.indices.buffer, (t) => sameMatrix(t, X), work);
      }
      assert.ok(waiting !== null, 'a thread that wrote the rows is waiting over this matrix');
      const pending = startOneShot({ script: null, thread: waiting, workerData: null, status: work.status, patienceMs: 30_000, here: () => -1, read: () => out.rowsWithWeight[0]! });
      const expected = maskedTermSums(X, removed, true);
      assert.equal(pending.take(), expected.rowsWithWeight);
      assert.ok(pending.fromThread);
      for (const key of ['s1', 's2', 'df', 'sxlogx'] as const) assert.deepEqual(Array.from(out[key]), Array.from(expected.sums[key]), key);
    });

    it('rows weighed by the threads as they write them are weighInPlace\'s weights to the bit, for every tf and idf', async () => {
      const rows = readFortunes(300);
      const bits = (a: Float64Array): Buffer => Buffer.from(a.buffer, a.byteOffset, a.byteLength);
      const kinds: Array<Pick<WeightingSettings, 'tf' | 'idf'>> = [
        { tf: 'raw', idf: 'smooth' },
        { tf: 'sublinear', idf: 'plain' },
        { tf: 'binary', idf: 'plainPlusOne' },
        { tf: 'raw', idf: 'none' },
      ];
      for (const kind of kinds) {
        const settings = { prune: { minDf: 1, maxDf: 1 }, weighting: { ...kind, norm: 'l1' as const } };
        let asked = 0;
        const threaded = await buildCountMatrix(arrayCorpusSource(rows), tokens, {
          workers: 2,
          batchSize: 23,
          workerScript: script,
          weighAhead: (sums, n) => {
            asked++;
            return weighingAhead(settings, sums, n);
          },
        });
        assert.equal(asked, 1);
        // Counted in this thread, then weighed as prepareWeights weighs (l2 whatever `norm` says).
        const inProcess = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 0, batchSize: 23 });
        const expected = weighInPlace(inProcess.counts, { ...settings.weighting, norm: 'l2' });
        assert.ok(threaded.weighedWith !== null, `${kind.tf}/${kind.idf}: weighed ahead`);
        assert.ok(bits(threaded.weighedWith).equals(bits(expected.idf)), `${kind.tf}/${kind.idf}: idf`);
        assert.deepEqual(threaded.counts.indices, inProcess.counts.indices);
        assert.ok(bits(threaded.counts.data).equals(bits(expected.weights.data)), `${kind.tf}/${kind.idf}: weights`);
        assert.equal(inProcess.weighedWith, null);
      }
    });

    it('rows are left as counts when weighAhead declines (a prune bound that drops a column)', async () => {
      const rows = readFortunes(300);
      const settings = { prune: { minDf: 2, maxDf: 1 }, weighting: { tf: 'raw' as const, idf: 'smooth' as const, norm: 'l2' as const } };
      const threaded = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 2, batchSize: 23, workerScript: script, weighAhead: (sums, n) => weighingAhead(settings, sums, n) });
      const inProcess = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 0, batchSize: 23 });
      assert.equal(threaded.weighedWith, null);
      assert.deepEqual(threaded.counts.data, inProcess.counts.data);
      assertCsrInvariants(threaded.counts);
    });

    it('buildCountMatrix carries the over-long-run note back from the worker threads, the same as in-process', async () => {
      const blob = 'QUJD+/'.repeat(400); // 2,400 characters without a space
      const rows = Array.from({ length: 30 }, (_, i) => ({ text: i % 11 === 5 ? `doc ${i} ${blob}` : `doc ${i} plain words`, label: null, line: i + 1 }));
      const inProcess = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 0, batchSize: 4 });
      const threaded = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 2, batchSize: 4, workerScript: script });
      assert.equal(inProcess.notes.length, 1);
      assert.match(inProcess.notes[0]!, /^3 runs .* in 3 documents \(lines 6, 17, 28\)/);
      assert.deepEqual(threaded.notes, inProcess.notes);
    });

    it('buildCountMatrix falls back to in-process when the worker script is missing', async () => {
      const rows = readFortunes(20);
      const built = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 2, workerScript: join(dir, 'absent.js') });
      assert.equal(built.counts.rows, 20);
    });
  });
});
