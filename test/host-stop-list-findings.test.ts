import { strict as assert } from 'node:assert';
import type { Measures, Report, TermRow } from '../extension/src/protocol';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { NEIGHBOR_SIGNAL_LIFT, stopListEntries, stopListFindings } from '../extension/src/host/pure/stop-list-findings';
import { statusHeadline, statusTooltip } from '../extension/src/host/pure/status-headline';
import { unusedEntriesInBrief } from '../extension/src/stop-list-wording';
import { withSplit } from '../extension/src/engine/review/load-stop-list';

// A hand-made Report: only the fields the functions read carry meaning; the values are
// invented for the test (common practice, no source).
function measures(backgroundSimilarity: number): Measures {
  return {
    sample: { documents: 10, k: 3, seed: 1 },
    backgroundSimilarity,
    neighborStandout: null,
    contrast: null,
    meanToNearest: null,
    iidEquivalentDimension: null,
    hubness: null,
    intrinsicDimension: { twoNN: null, mle: null },
    radiusSlack: null,
    topTermsMassShare: { top10: 0, top100: 0 },
    labelPrecisionAtK: null,
    neighborTurnover: null,
    distributions: { similarity: { start: 0, binWidth: 0.05, pairs: [], nearest: [] }, kOccurrence: [], cumulativeMass: [] },
  };
}

function row(term: string, status: TermRow['status'], neighborLift: number | null): TermRow {
  return { term, df: 1, idf: 1, pullShare: 0.1, neighborLift, spread: 0.5, loudness: 1, status, why: '' };
}

function report(terms: TermRow[], unused: string[], suggestions: string[] = [], lowercase = true): Report {
  return {
    tool: { name: 'loudword', version: '0.0.0' },
    input: { file: '/p/tickets.csv', format: 'csv', textField: 'message', labelField: null, documents: 10, skipped: 0 },
    settings: { ...DEFAULT_SETTINGS, tokens: { ...DEFAULT_SETTINGS.tokens, lowercase } },
    vocabulary: { terms: 5, tokens: 50, nonzeros: 40, meanDocLength: 5 },
    baseline: measures(0.214),
    suggested: measures(0.068),
    terms,
    suggestions,
    verdict: { outcome: 'nothing suggested', headline: '', estimate: null, caveats: [] },
    hubs: [],
    stopList: { file: '/p/stoplist.txt', exists: true, terms: 4, unused },
  };
}

const stopList = '# footer\nsubmitted\n  Via  \n# old format\nattachmentid\nboiler\n#ad\n';

describe('stopListEntries', () => {
  it('stopListEntries skips comments and blanks and gives 0-based line and trimmed columns', () => {
    assert.deepEqual(stopListEntries(stopList, true), [
      { term: 'submitted', line: 1, start: 0, end: 9 },
      { term: 'via', line: 2, start: 2, end: 5 },
      { term: 'attachmentid', line: 4, start: 0, end: 12 },
      { term: 'boiler', line: 5, start: 0, end: 6 },
      // A hashtag is an entry, not a comment (the engine's stop-list rule).
      { term: '#ad', line: 6, start: 0, end: 3 },
    ]);
  });

  it('stopListEntries keeps case when the review does', () => {
    assert.equal(stopListEntries(stopList, false)[1]!.term, 'Via');
  });
});

describe('stopListFindings', () => {
  it('stopListFindings flags unused entries and stopped terms with neighbour lift at the threshold or above', () => {
    const r = report([
      row('submitted', 'stopped', 0.2),
      row('via', 'stopped', NEIGHBOR_SIGNAL_LIFT - 0.01),
      row('boiler', 'stopped', NEIGHBOR_SIGNAL_LIFT),
      row('thanks', 'suggested', 3),
    ], ['attachmentid']);
    const findings = stopListFindings(stopList, r);
    assert.deepEqual(findings.map((f) => [f.term, f.kind, f.line]), [
      ['attachmentid', 'unused', 4],
      ['boiler', 'neighborSignal', 5],
    ]);
    assert.match(findings[0]!.message, /never occurs in tickets\.csv/);
    assert.match(findings[1]!.message, /neighbour lift 1\.25 ≥ 1\.25/);
  });

  it('stopListFindings flags an unused entry written with capitals, and says how the tokenizer reads one that is not one term', () => {
    // Report.stopList.unused holds entries as written; split, those the tokenizer reads as several terms or none.
    const text = "Don't\nNew York\na\nQwerty\n";
    const r = report([], ["Don't", 'New York', 'a', 'Qwerty']);
    r.stopList.split = { "Don't": ['do', 'not'], 'New York': ['new', 'york'], a: [] };
    const findings = stopListFindings(text, r);
    assert.deepEqual(findings.map((f) => [f.term, f.kind, f.line]), [
      ["don't", 'unused', 0],
      ['new york', 'unused', 1],
      ['a', 'unused', 2],
      ['qwerty', 'unused', 3],
    ]);
    assert.equal(findings[0]!.message, "'Don't' is 2 terms to the tokenizer (do + not), and an entry stops one term; to stop them, write each on a line of its own.");
    assert.match(findings[2]!.message, /^'a' gives no term under the token settings/);
    assert.equal(findings[3]!.message, "'Qwerty' never occurs in tickets.csv; the entry has no effect.");
  });

  it('an unused entry named like an Object property is read by its own key only', () => {
    const r = report([], ['constructor', "Don't"]);
    r.stopList.split = { "Don't": ['do', 'not'] };
    const findings = stopListFindings("constructor\nDon't\n", r);
    assert.equal(findings[0]!.message, "'constructor' never occurs in tickets.csv; the entry has no effect.");
    assert.equal(unusedEntriesInBrief(r.stopList), "constructor, Don't (do + not)");
    // The engine's side: "__proto__" becomes an own key of split, kept through JSON.
    const split = withSplit({ unused: ['__proto__', 'one'] }, (t) => (t === 'one' ? ['one'] : ['proto', 'x'])).split!;
    assert.deepEqual(JSON.parse(JSON.stringify(split)), JSON.parse('{"__proto__": ["proto", "x"]}'));
    assert.ok(Object.hasOwn(split, '__proto__'));
  });

  it('stopListFindings ignores a null neighbour lift and a kept term with high lift', () => {
    const r = report([row('boiler', 'stopped', null), row('submitted', 'kept', 9)], []);
    assert.deepEqual(stopListFindings(stopList, r), []);
  });

  it('stopListFindings stops at max', () => {
    const r = report([], ['submitted', 'via', 'attachmentid', 'boiler']);
    assert.equal(stopListFindings(stopList, r, 2).length, 2);
  });
});

describe('statusHeadline', () => {
  it('statusHeadline shows baseline → suggested background similarity to two decimals', () => {
    assert.equal(statusHeadline(report([], [], ['via'])), 'Loudword: bg sim 0.21 → 0.07');
  });

  it('statusHeadline drops the arrow when nothing is suggested', () => {
    assert.equal(statusHeadline(report([], [])), 'Loudword: bg sim 0.21');
  });

  it('statusTooltip names the document count and the number of suggestions', () => {
    const tip = statusTooltip(report([], [], ['via', 'thanks']));
    assert.match(tip, /of 10 documents/);
    assert.match(tip, /With the 2 suggested stop terms: 0\.07/);
  });
});
