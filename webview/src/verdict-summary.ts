// What a reader needs first, above the measures: the review's verdict on the suggested list
// (Report.verdict, when the engine gives one) and the few loudest terms. At the default
// bottom-panel height this is what shows before any scrolling.

import type { Report, Verdict } from '../../extension/src/protocol';
import { formatShare, formatSignedChange } from '../../extension/src/number-format';
import { estimateDigits, outcomeWords } from '../../extension/src/verdict-wording';
import { el, type Child } from './create-element';

/** How many of the loudest terms the summary names. */
export const TOP_TERMS = 5;

export function renderVerdictSummary(report: Report): HTMLElement {
  const children: Child[] = [];
  // The judgement and its reasons, then the loudest terms, then the caveats: at the default
  // panel height the caveats, the longest part, are what scrolls out of view.
  const verdict = report.verdict ? renderVerdict(report.verdict) : null;
  if (verdict !== null) children.push(...verdict.lead);
  const top = report.terms.filter((t) => t.status !== 'stopped').slice(0, TOP_TERMS);
  if (top.length > 0) {
    const items: Child[] = [];
    top.forEach((t, i) => {
      if (i > 0) items.push(', ');
      items.push(el('span', { className: `lw-top__term${t.status === 'suggested' ? ' lw-top__term--suggested' : ''}`, text: t.term }), ` ${formatShare(t.pullShare)}`);
    });
    children.push(el('p', { className: 'lw-top' }, [el('span', { className: 'lw-top__label', text: 'Loudest terms, loudest first (each with its share of all-pair similarity): ' }), ...items]));
  }
  if (verdict !== null && verdict.caveats !== null) children.push(verdict.caveats);
  return el('div', { className: 'lw-verdict', attrs: { 'data-outcome': report.verdict?.outcome ?? 'none' } }, children);
}

/** The verdict's judgement (the estimate, when there is one) and its headline; its caveats apart. */
function renderVerdict(v: Verdict): { lead: Child[]; caveats: HTMLElement | null } {
  const out: Child[] = [];
  if (v.estimate) {
    // The one judgement first (the CLI leads with the same words), then the figure it rests on,
    // with the digits the headline uses: three for a precision, two for neighbour standout, more
    // when a bound would otherwise read as zero.
    const e = v.estimate;
    const digits = estimateDigits(e.measure, e.low, e.high);
    const signed = (x: number) => formatSignedChange(x, digits);
    const words = outcomeWords(v);
    const judged = words.charAt(0).toUpperCase() + words.slice(1);
    const spread = e.method === 'seeds' ? `${signed(e.low)} to ${signed(e.high)} over ${e.draws} re-drawn samples` : `95% interval ${signed(e.low)} to ${signed(e.high)}, ${e.draws} bootstrap draws`;
    out.push(el('p', { className: 'lw-verdict__estimate', text: `${judged}: ${e.measure} ${signed(e.change)} (${spread}).` }));
  }
  out.push(el('p', { className: 'lw-verdict__headline', text: v.headline }));
  const caveats =
    v.caveats.length > 0
      ? el('ul', { className: 'lw-verdict__caveats' }, v.caveats.map((c) => el('li', {}, [el('span', { className: 'lw-verdict__measure', text: `${c.measure}: ` }), c.sentence])))
      : null;
  return { lead: out, caveats };
}
