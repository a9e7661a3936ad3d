// The verdict leads the CLI summary and the Markdown output (issue 9, "One verdict"). The Report
// is the small fixture of test/fixtures with a verdict of our own; no outside figure is involved.
import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { formatMarkdown } from '../extension/src/cli/format-markdown';
import { formatText } from '../extension/src/cli/format-text';
import type { Report } from '../extension/src/protocol';
import { formatSignedChange } from '../extension/src/number-format';
import { estimateDigits, verdictCaution } from '../extension/src/verdict-wording';

function withVerdict(): Report {
  const report = JSON.parse(readFileSync(path.join(__dirname, 'fixtures', 'report-small.json'), 'utf8')) as Report;
  report.verdict = {
    outcome: 'helps',
    headline: 'These 3 terms raise label precision@10 (0.800 → 0.850, +0.050; 95% interval +0.020 to +0.080 over 200 sampled documents).',
    estimate: { measure: 'label precision@10', change: 0.05, low: 0.02, high: 0.08, draws: 400, method: 'bootstrap' },
    caveats: [{ measure: 'hubness', sentence: 'Hubness skew rose (1.20 → 1.40): look at the hub list.' }],
  };
  return report;
}

describe('verdict in the CLI outputs', () => {
  it('formatText: the verdict and its caveats come right after the title, before the measures', () => {
    const text = formatText(withVerdict());
    const lines = text.split('\n');
    const at = lines.findIndex((l) => l.startsWith('Verdict: the suggested list helps. These 3 terms raise'));
    assert.ok(at > 0 && at <= 2, text.slice(0, 400));
    // The verdict wraps at 100 characters (continuation lines indented 4); the caveat follows it.
    const next = lines.slice(at + 1).find((l) => !l.startsWith('    '));
    assert.match(next!, /^ {2}But: Hubness skew rose/);
    assert.ok(at < lines.findIndex((l) => l.startsWith('measure')));
  });

  it('formatText: beside a list that hurts, the caveats are not introduced as "But"', () => {
    const report = withVerdict();
    report.verdict!.outcome = 'hurts';
    const lines = formatText(report).split('\n');
    assert.ok(lines.some((l) => /^ {2}Also: Hubness skew rose/.test(l)));
    assert.ok(!lines.some((l) => l.startsWith('  But:')));
  });

  it('formatText: the closing "Next:" line recommends apply only when the list does not hurt', () => {
    const helps = formatText(withVerdict()).replace(/\n {4}/g, ' ');
    assert.match(helps, /Next: review the suggestions, then `loudword apply /);
    const report = withVerdict();
    report.verdict!.outcome = 'hurts';
    report.verdict!.estimate!.change = -0.004;
    const hurts = formatText(report).replace(/\n {4}/g, ' ');
    assert.match(hurts, /Next: the review judged this list to lower label precision@10 \(\u22120\.004\), so applying it as a whole is not advised/);
    assert.doesNotMatch(hurts, /Next: review the suggestions/);
  });

  it('verdictCaution: a sentence only for a list judged to hurt, with the change in the verdict\'s digits', () => {
    const report = withVerdict();
    assert.equal(verdictCaution(report.verdict), null);
    assert.equal(verdictCaution(undefined), null);
    report.verdict = { ...report.verdict!, outcome: 'hurts', estimate: { measure: 'neighbour standout', change: -0.0312, low: -0.05, high: -0.01, draws: 400, method: 'bootstrap' } };
    assert.equal(verdictCaution(report.verdict), 'the review judged this list to lower neighbour standout (\u22120.03)');
    report.verdict = { ...report.verdict, estimate: null };
    assert.equal(verdictCaution(report.verdict), null);
  });

  it('formatText: without labels the title says what was measured (neighbour standout), never "helps"', () => {
    const report = withVerdict();
    report.verdict!.estimate = { measure: 'neighbour standout', change: 5.7, low: 5.5, high: 6, draws: 400, method: 'bootstrap' };
    const text = formatText(report).replace(/\n {4}/g, ' ');
    assert.match(text, /Verdict: neighbours stand out more with the suggested list \(without labels, a proxy\)\./);
    assert.doesNotMatch(text, /the suggested list helps/);
  });

  it('formatMarkdown: the verdict is the first paragraph under the heading, caveats as a list', () => {
    const md = formatMarkdown(withVerdict()).split('\n');
    assert.match(md[2]!, /^\*\*Verdict: the suggested list helps\.\*\* These 3 terms raise/);
    assert.match(md[4]!, /^- Hubness skew rose/);
  });
});

describe('the digits of the verdict figure and its interval', () => {
  it('a bound that is not zero is never written as zero (it is why the verdict is not "no clear change")', () => {
    // The demo's interval once read "+0.000 to +0.007" beside "helps" (low was 0.00033).
    assert.equal(estimateDigits('label precision@10', 0.00033, 0.0066), 4);
    assert.equal(formatSignedChange(0.00033, estimateDigits('label precision@10', 0.00033, 0.0066)), '+0.0003');
    assert.equal(estimateDigits('label precision@10', -0.0066, -0.00004), 5);
    // Bounds that round to something other than zero keep the measure's usual digits.
    assert.equal(estimateDigits('label precision@10', 0.02, 0.08), 3);
    assert.equal(estimateDigits('neighbour standout', 0.05, 0.4), 2);
    // A bound that is exactly zero, or not a number, asks for no extra digits; five at most.
    assert.equal(estimateDigits('label precision@10', 0, 0.01), 3);
    assert.equal(estimateDigits('label precision@10', Number.NaN, 0.01), 3);
    assert.equal(estimateDigits('label precision@10', 1e-9, 0.01), 5);
  });
});
