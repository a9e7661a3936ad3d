import { formatCount } from '../number-format';
import type { Report } from '../protocol';
import { judgedChangeWord, measureCatalog } from '../measure-catalog';
import { verdictLines } from './format-verdict';
import { piecesSentence, suggestedTermLines } from '../engine/terms/stop-list-spelling';
import { provenanceLine } from './format-provenance';
import { count } from './text-layout';
import { stopListInForce } from '../stop-list-wording';

const TERMS_SHOWN = 30;

/** Markdown cells must not break the table or inject markup: escape pipes and specials. */
function cell(text: string): string {
  return text.replace(/[\\`*_{}[\]<>|#]/g, (c) => `\\${c}`).replace(/\r?\n/g, ' ');
}

/** The Report as Markdown, for pull requests and CI summaries. */
export function formatMarkdown(report: Report): string {
  const { input, vocabulary, baseline, suggested } = report;
  const out: string[] = [];
  out.push(`## Loudword review of \`${cell(input.file)}\``);
  out.push('');
  const verdict = verdictLines(report.verdict);
  if (verdict !== null) {
    out.push(`**${verdict.title}.** ${cell(verdict.headline)}`);
    out.push('');
    for (const c of verdict.caveats) out.push(`- ${cell(c)}`);
    if (verdict.caveats.length > 0) out.push('');
  }
  out.push(`${count(input.documents, 'document')} · ${count(vocabulary.terms, 'term')} · ${count(vocabulary.tokens, 'token')} · sample ${formatCount(baseline.sample.documents)} (k = ${baseline.sample.k}, seed ${baseline.sample.seed})`);
  out.push('');
  const provenance = provenanceLine(report);
  if (provenance !== null) out.push(cell(provenance), '');
  out.push(`Stop list: ${cell(stopListInForce(report.stopList))}`, '');
  // What the reader and the review had to say (an encoding read as windows-1252, duplicates).
  for (const note of input.notes ?? []) out.push(`> ${cell(note)}`, '');
  out.push('| measure | current | with suggestions | |');
  out.push('|---|---:|---:|---|');
  for (const spec of measureCatalog) {
    const a = spec.value(baseline);
    const b = spec.value(suggested);
    if (a === null && b === null) continue;
    out.push(`| ${spec.label} | ${spec.format(a)} | ${spec.format(b)} | ${judgedChangeWord(spec, a, b)} |`);
  }
  out.push('');
  out.push(report.suggestions.length > 0 ? `**Suggested stop terms (${report.suggestions.length}):** ${suggestedTermLines(report).map(cell).join(', ')}` : 'No stop terms suggested.');
  const pieces = piecesSentence(report);
  if (pieces !== null) out.push('', cell(pieces));
  out.push('');
  out.push('| term | status | df | pull share | neighbour lift | why |');
  out.push('|---|---|---:|---:|---:|---|');
  for (const t of report.terms.slice(0, TERMS_SHOWN)) {
    out.push(`| ${cell(t.term)} | ${t.status} | ${t.df} | ${(t.pullShare * 100).toFixed(2)}% | ${t.neighborLift === null ? '–' : t.neighborLift.toFixed(2)} | ${cell(t.why)} |`);
  }
  return out.join('\n') + '\n';
}
