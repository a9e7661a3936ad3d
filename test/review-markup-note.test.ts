// The note on HTML left in the text (engine/review/markup-note.ts): said from 5% of the documents
// holding a tag, attribute or entity name that is no English word, never for names that are also
// abbreviations or names ("li", "th"), and never on the bundled sample (our own tickets, no markup).
import { strict as assert } from 'node:assert';
import * as path from 'node:path';
import { markupNote, MARKUP_NOTE_SHARE } from '../extension/src/engine/review/markup-note';
import { startReview } from '../extension/src/engine/review/start-review';

describe('the note on HTML left in the text', function () {
  this.timeout(120_000);

  it('names the widespread markup names, most widespread first, from MARKUP_NOTE_SHARE of the documents', () => {
    const terms = ['br', 'the', 'href', 'li', 'nbsp', 'div'];
    const df = [230, 990, 60, 400, 49, 50];
    const note = markupNote(terms, df, 1000);
    assert.match(note ?? '', /^HTML is left in the text: "br" in 23% of the documents, "href" in 6%, "div" in 5%\. /);
    assert.doesNotMatch(note ?? '', /"li"|"nbsp"/, '"li" is also a name; "nbsp" is below the share');
    assert.equal(MARKUP_NOTE_SHARE, 0.05);
    assert.equal(markupNote(terms, [10, 990, 10, 400, 10, 10], 1000), null);
    assert.equal(markupNote([], [], 0), null);
  });

  it('is said in a review of text with HTML line breaks and links, and not in the sample\'s', async () => {
    const sample = path.join(__dirname, '..', 'samples', 'support-tickets.csv');
    const plain = (await startReview({ file: sample, configPath: null, overrides: { stopList: null } }, { reportOnly: true })).report;
    assert.ok(!(plain.input.notes ?? []).some((n) => n.startsWith('HTML')), JSON.stringify(plain.input.notes));
    const docs = Array.from({ length: 60 }, (_, i) =>
      JSON.stringify({ text: i % 4 === 0 ? `Order ${i} arrived late.<br /><br />See <a href="https://x.org/${i}">the page</a>.` : `Order ${i} arrived on time and works well.` }),
    );
    const html = (await startReview({ file: 'h.jsonl', text: docs.join('\n'), configPath: null, overrides: { format: 'jsonl', text: 'text', stopList: null } }, { reportOnly: true })).report;
    assert.ok((html.input.notes ?? []).some((n) => /^HTML is left in the text: "br" in 25% of the documents, "href" in 25%/.test(n)), JSON.stringify(html.input.notes));
  });
});
