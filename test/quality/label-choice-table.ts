// What `suggest.useLabels` does on the labelled development corpora (test/corpora/README.md): each
// corpus is reviewed without its labels (the rule's list) and with them and useLabels (half the
// sample decides whether rule 2's grammar words stay, engine/terms/label-choice.ts); both lists are
// scored by scikit-learn's leave-one-out precision@10 over every document, beside no list, its
// English list and max_df = 0.5. Reference: scikit-learn (Debian python3-sklearn) via
// precision_at_k.py. The figure counts the deciding documents too (up to half of a small corpus);
// held_out_choice.py --guard measures the same rule on documents that did not decide.
//
//   npx tsx test/quality/label-choice-table.ts [corpus ...]
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { startReview } from '../../extension/src/engine/review/start-review';
import { suggestionLines } from '../../extension/src/engine/terms/stop-list-spelling';
import { formatSignedChange as signed } from '../../extension/src/number-format';
import { corporaNamed } from '../corpora/dev-corpora';
import { reviewWithoutLabels } from './quality-row';

const PYTHON = '/usr/bin/python3';

async function main(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-label-choice-'));
  const lines = [
    '| corpus | role | docs | the labels\' choice (deciding half: keep − suggest [95%]) | max(E, M) | rule (no labels) | with useLabels | with − max(E, M) |',
    '|---|---|---|---|---|---|---|---|',
  ];
  try {
    for (const corpus of corporaNamed(process.argv.slice(2))) {
      if (!corpus.available()) {
        console.log(`${corpus.name}: not available — ${corpus.missing}`);
        continue;
      }
      const { docs, report: rule } = await reviewWithoutLabels(corpus, dir, null);
      const file = path.join(dir, `${corpus.name}.jsonl`);
      const session = await startReview({ file, configPath: null, overrides: { text: 'text', label: 'label', stopList: null, suggest: { useLabels: true } } });
      const labelled = session.report;
      const job = {
        texts: docs.map((d) => d.text),
        labels: docs.map((d) => d.label),
        k: 10,
        stop_lists: { none: null, english: 'english', maxDf: { max_df: 0.5 }, rule: suggestionLines(rule), labelled: suggestionLines(labelled) },
      };
      const out = execFileSync(PYTHON, [path.join(__dirname, 'precision_at_k.py')], { input: JSON.stringify(job), maxBuffer: 1 << 26, stdio: ['pipe', 'pipe', 'ignore'] });
      const p = JSON.parse(out.toString()) as Record<'none' | 'english' | 'maxDf' | 'rule' | 'labelled', number>;
      const c = labelled.verdict?.labelChoice;
      const choice = c === undefined
        ? 'no grammar word to decide'
        : `${c.kept ? 'kept' : 'suggested'} ${c.words}: ${signed(c.change, 4)} [${signed(c.low, 4)}, ${signed(c.high, 4)}] on ${c.decidedBy}`;
      const best = Math.max(p.english, p.maxDf);
      const line = `| ${corpus.name} | ${corpus.role} | ${docs.length} | ${choice} | ${best.toFixed(4)} | ${p.rule.toFixed(4)} | ${p.labelled.toFixed(4)} | ${signed(p.labelled - best, 4)} |`;
      lines.push(line);
      console.log(line);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  console.log('\n' + lines.join('\n'));
}

void main().then(() => process.exit(0));
