// A research probe, not part of the rule: the same texts under two labels. The subject-labelled
// definitions of webster-definitions whose entry is a noun or an adjective are reviewed once,
// WITHOUT labels (so Loudword's list is one list), and scikit-learn's leave-one-out precision@10
// of no list, its English list, max_df = 0.5 and ours is printed twice: against the subject
// labels and against the part of speech. Whatever a label-free rule suggests, it suggests for
// both; whether it should depends on what the labels are about (docs/methods.md §9).
//
// With --search it then asks, using the labels, whether any list meets the issue's bounds for both
// labellings at once (list_for_both_labels.py: the English list, keeping one word at a time).
//
//   npx tsx test/quality/same-texts-probe.ts [--search]
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { suggestionLines } from '../../extension/src/engine/terms/stop-list-spelling';
import type { DevCorpus } from '../corpora/labelled-corpus';
import { WEBSTER_DEFINITIONS, websterSubjectDocuments } from '../corpora/webster-definitions';
import { partOfSpeech } from '../corpora/webster-parts-of-speech';
import { reviewWithoutLabels } from './quality-row';

async function main(): Promise<void> {
  const docs = websterSubjectDocuments()
    .map((d) => ({ ...d, pos: partOfSpeech(d.entry) }))
    .filter((d) => d.pos === 'n.' || d.pos === 'a.');
  const corpus: DevCorpus = { ...WEBSTER_DEFINITIONS, name: 'webster-nouns-adjectives', load: async () => docs };
  const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-same-texts-'));
  try {
    const { report } = await reviewWithoutLabels(corpus, dir, null);
    const ours = suggestionLines(report);
    console.log(`${docs.length} definitions (nouns and adjectives), ${ours.length} terms suggested without labels\n`);
    console.log('| labels | none | English | max_df 0.5 | ours | ours − none | English − none |');
    console.log('|---|---|---|---|---|---|---|');
    for (const [name, labels] of [['subject', docs.map((d) => d.label)], ['part of speech', docs.map((d) => d.pos!)]] as const) {
      const job = { texts: docs.map((d) => d.text), labels, k: 10, stop_lists: { none: null, english: 'english', maxDf: { max_df: 0.5 }, ours } };
      const out = execFileSync('/usr/bin/python3', [path.join(__dirname, 'precision_at_k.py')], { input: JSON.stringify(job), maxBuffer: 1 << 26 });
      const p = JSON.parse(out.toString()) as Record<'none' | 'english' | 'maxDf' | 'ours', number>;
      const d = (x: number) => (x >= 0 ? '+' : '−') + Math.abs(x).toFixed(4);
      console.log(`| ${name} | ${p.none.toFixed(4)} | ${p.english.toFixed(4)} | ${p.maxDf.toFixed(4)} | ${p.ours.toFixed(4)} | ${d(p.ours - p.none)} | ${d(p.english - p.none)} |`);
    }
    if (process.argv.includes('--search')) {
      const both = path.join(dir, 'both-labels.jsonl');
      writeFileSync(both, docs.map((d) => JSON.stringify({ text: d.text, subject: d.label, pos: d.pos })).join('\n') + '\n');
      console.log('');
      const search = execFileSync('/usr/bin/python3', [path.join(__dirname, 'list_for_both_labels.py'), both, 'subject', 'pos']).toString();
      console.log(search.trimEnd());
      // What the review, without labels, said of the words the search kept.
      const kept = /less (.+)$/m.exec(search)?.[1]?.split(', ') ?? [];
      for (const word of kept) {
        const row = report.terms.find((t) => t.term === word);
        console.log(`  "${word}" in Loudword's review: ${row === undefined ? 'not in the term table' : `${row.status}, ${row.why}`}`);
      }
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  process.exit(0);
}
void main();
