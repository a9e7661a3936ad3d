import type { Report } from '../protocol';
import { provenanceLine } from './format-provenance';
import { count, wrapLines } from './text-layout';
import { formatCount, formatNumber } from '../number-format';
import { judgedChangeWord, measureCatalog } from '../measure-catalog';
import { verdictLines } from './format-verdict';
import { verdictCaution } from '../verdict-wording';
import { piecesSentence, suggestedTermLines } from '../engine/terms/stop-list-spelling';
import { skippedWording } from '../skipped-wording';
import { stopListInForce } from '../stop-list-wording';

const TERMS_SHOWN = 15;
const HUBS_SHOWN = 5;

/** The Report as a terminal summary: headline, measures current → suggested, terms, hubs. */
export function formatText(report: Report): string {
  const out: string[] = [];
  const { input, vocabulary, baseline, suggested } = report;
  const fields = [input.format, input.textField && `text "${input.textField}"`, input.labelField && `label "${input.labelField}"`].filter(Boolean).join(', ');
  out.push(`Loudword ${report.tool.version} — ${input.file} (${fields})`);
  const verdict = verdictLines(report.verdict);
  if (verdict !== null) {
    out.push('');
    out.push(`${verdict.title}. ${verdict.headline}`);
    // "But" only against a list that helps: beside one that hurts or changes nothing, the caveats agree with it.
    const lead = report.verdict?.outcome === 'helps' ? 'But' : 'Also';
    for (const c of verdict.caveats) out.push(`  ${lead}: ${c}`);
    out.push('');
  }
  const skipped = skippedWording(input.format);
  out.push(
    `${count(input.documents, 'document')}, ${count(vocabulary.terms, 'term')}, ${count(vocabulary.tokens, 'token')} ` +
      `(mean ${formatNumber(vocabulary.meanDocLength)} per document); ${count(input.skipped, skipped.unit)} skipped`,
  );
  for (const note of input.notes ?? []) out.push(`Note: ${note}`);
  for (const s of input.skippedExamples ?? []) out.push(`Skipped ${skipped.example(s)}`);
  if (input.truncated) out.push(`Read only the first ${count(input.truncated.bytesRead, 'byte')} (limit ${formatCount(input.truncated.limitBytes)}).`);
  out.push(`Stop list: ${stopListInForce(report.stopList)}`);
  const provenance = provenanceLine(report);
  if (provenance !== null) out.push(provenance);
  out.push(`Sample: ${count(baseline.sample.documents, 'document')}, k = ${baseline.sample.k}, seed ${baseline.sample.seed}`);
  out.push('');

  const width = Math.max(...measureCatalog.map((spec) => spec.label.length));
  out.push(`${'measure'.padEnd(width)}  ${'current'.padStart(9)}  ${'suggested'.padStart(9)}`);
  for (const spec of measureCatalog) {
    const a = spec.value(baseline);
    const b = spec.value(suggested);
    if (a === null && b === null) continue;
    out.push(`${spec.label.padEnd(width)}  ${spec.format(a).padStart(9)}  ${spec.format(b).padStart(9)}  ${judgedChangeWord(spec, a, b)}`.trimEnd());
  }
  out.push('');

  if (report.suggestions.length > 0) {
    out.push(`Suggested stop terms (${report.suggestions.length}): ${suggestedTermLines(report).join(', ')}`);
    const pieces = piecesSentence(report);
    if (pieces !== null) out.push(pieces);
  } else {
    out.push('No stop terms suggested (see the verdict above for why).');
  }
  out.push('');
  out.push('Loudest terms (pull share = share of all-pair similarity; lift = neighbour share ÷ pull share):');
  for (const t of report.terms.slice(0, TERMS_SHOWN)) {
    const lift = t.neighborLift === null ? '–' : t.neighborLift.toFixed(2);
    out.push(`  ${t.term.padEnd(16)} ${t.status.padEnd(9)} pull ${(t.pullShare * 100).toFixed(2).padStart(6)}%  lift ${lift.padStart(5)}  ${t.why}`);
  }
  if (report.hubs.length > 0) {
    out.push('');
    out.push(`Hub documents (in the k-NN lists of many others; current setting):`);
    for (const h of report.hubs.slice(0, HUBS_SHOWN)) {
      out.push(`  line ${String(h.line).padStart(6)}  N_k = ${String(h.kOccurrence).padStart(3)}  ${h.preview}`);
    }
  }
  if (report.suggestions.length > 0) {
    out.push('');
    const target = report.stopList.file ?? 'the stop list file';
    const caution = verdictCaution(report.verdict);
    // After a verdict that the list hurts, apply is not the next step to recommend: say so first.
    out.push(caution === null
      ? `Next: review the suggestions, then \`loudword apply ${input.file}\` adds them to ${target}.`
      : `Next: ${caution}, so applying it as a whole is not advised; pick terms from it by hand, or try them in the editor's what-if first. \`loudword apply ${input.file}\` would add all of them to ${target}.`);
  }
  return wrapLines(out).join('\n') + '\n';
}
