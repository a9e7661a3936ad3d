// The suggestion method's quality table (issue: suggestions that earn their place): for each
// labelled development corpus (test/corpora/README.md), leave-one-out precision@10 by
// scikit-learn's TfidfVectorizer (defaults) with no list, its English list, max_df = 0.5, and
// Loudword's suggestions made WITHOUT the labels. Reference: scikit-learn (Debian
// python3-sklearn) via test/quality/precision_at_k.py.
//
//   npm run quality            all corpora available on this machine
//   npm run quality -- sotu    only the named ones (and larger corpora, which run only when named)
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { corporaNamed } from '../corpora/dev-corpora';
import { bounds, qualityRow, type Row } from './quality-row';

async function main(): Promise<void> {
  // `--tokenizer pattern` reviews with scikit-learn's own tokens (tokens.tokenizer), the setting
  // the README recommends when the vectors come from scikit-learn; the default is wink.
  const args = process.argv.slice(2);
  const at = args.indexOf('--tokenizer');
  const tokenizer = at >= 0 ? args.splice(at, 2)[1] : undefined;
  if (at >= 0 && tokenizer !== 'wink' && tokenizer !== 'pattern') throw new Error('--tokenizer takes wink or pattern');
  const only = args;
  const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-quality-'));
  let configPath: string | null = null;
  if (tokenizer !== undefined) {
    configPath = path.join(dir, 'loudword.json');
    writeFileSync(configPath, JSON.stringify({ tokens: { tokenizer } }));
  }
  const rows: Row[] = [];
  try {
    for (const corpus of corporaNamed(only)) {
      if (!corpus.available()) {
        console.log(`${corpus.name}: not available — ${corpus.missing}`);
        continue;
      }
      const row = await qualityRow(corpus, dir, configPath);
      rows.push(row);
      console.log(format(row));
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  console.log('\n' + table(rows));
}

function format(r: Row): string {
  return `${r.name} (${r.role}, ${r.documents} docs): none ${r.none.toFixed(4)}, English ${r.english.toFixed(4)}, max_df 0.5 ${r.maxDf.toFixed(4)}, ours ${r.ours.toFixed(4)} (${r.suggested} terms, review ${r.seconds.toFixed(1)} s)`;
}

/** The Markdown table of the README and docs/methods.md, with the three conditions. */
function table(rows: Row[]): string {
  const lines = [
    '| corpus | role | docs | none | English | max_df 0.5 | ours (no labels) | terms | ours − max(E, M) | ours − none |',
    '|---|---|---|---|---|---|---|---|---|---|',
  ];
  const signed = (x: number): string => `${x >= 0 ? '+' : '−'}${Math.abs(x).toFixed(4)}`;
  let ok = true;
  for (const r of rows) {
    const { vsBest: a, vsNone: b, passBest: passA, passNone: passB } = bounds(r);
    ok &&= passA && passB;
    const mark = (x: number, pass: boolean): string => `${signed(x)}${pass ? '' : ' ✗'}`;
    lines.push(`| ${r.name} | ${r.role} | ${r.documents} | ${r.none.toFixed(4)} | ${r.english.toFixed(4)} | ${r.maxDf.toFixed(4)} | ${r.ours.toFixed(4)} | ${r.suggested} | ${mark(a, passA)} | ${mark(b, passB)} |`);
  }
  const meanGain = (of: readonly Row[]): number => (of.length > 0 ? of.reduce((s, r) => s + r.ours - r.english, 0) / of.length : 0);
  // By role too: the CHECK corpora chose nothing, so their mean is the one that says how the
  // rule does on text it was not chosen on; a TUNE corpus on which the English list does badly
  // can lift the overall mean by itself.
  const byRole = (['TUNE', 'CHECK'] as const)
    .map((role) => rows.filter((r) => r.role === role))
    .filter((of) => of.length > 0)
    .map((of) => `${of[0]!.role} ${signed(meanGain(of))} over ${of.length}`);
  lines.push('');
  lines.push(`Mean ours − English list: ${signed(meanGain(rows))} over ${rows.length} corpora (${byRole.join(', ')}; target ≥ +0.01); per-corpus conditions ${ok ? 'all hold' : 'do not all hold (✗)'}.`);
  return lines.join('\n');
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
