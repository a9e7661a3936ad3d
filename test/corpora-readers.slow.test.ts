// The development set's readers of R data packages (test/corpora/r-lazy-load.ts), checked against
// facts about their data: R's lazy-load data bases hold each object zlib-compressed (janeaustenr)
// or as raw LZMA2 (modeldata, built with xz compression), and both must read back whole.
// Slow: the first run fetches the two Debian packages (apt-get download, not installed).
import { strict as assert } from 'node:assert';
import { AUSTEN_CHAPTERS } from './corpora/austen-chapters';
import { FINE_FOOD_REVIEWS } from './corpora/fine-food-reviews';
import type { LabelledDoc } from './corpora/labelled-corpus';

function countLabels(docs: readonly LabelledDoc[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const d of docs) out[d.label] = (out[d.label] ?? 0) + 1;
  return out;
}

describe('corpora: readers of R data packages', function () {
  this.timeout(300_000);

  it('janeaustenr (zlib objects): the chapters of the six novels, as many as each novel has', async () => {
    // Chapter counts of the novels as published (from memory; the Project Gutenberg texts the
    // package ships number them so): Sense and Sensibility 50, Pride and Prejudice 61, Mansfield
    // Park 48, Emma 55, Northanger Abbey 31, Persuasion 24.
    assert.ok(AUSTEN_CHAPTERS.available(), AUSTEN_CHAPTERS.missing);
    const docs = await AUSTEN_CHAPTERS.load();
    assert.deepEqual(countLabels(docs), { sensesensibility: 50, prideprejudice: 61, mansfieldpark: 48, emma: 55, northangerabbey: 31, persuasion: 24 });
    assert.ok(docs.every((d) => d.text.length > 1000), 'every chapter has its text');
  });

  it('modeldata (raw LZMA2 objects, data frames with a factor column): 3,000 of the 5,000 rated reviews, HTML left in', async () => {
    assert.ok(FINE_FOOD_REVIEWS.available(), FINE_FOOD_REVIEWS.missing);
    const docs = await FINE_FOOD_REVIEWS.load();
    assert.equal(docs.length, 3000);
    // The factor `score` decodes to its two level names ("great" for five stars, "other" below, as
    // the package documents them, from memory); about two thirds of the reviews are five-star.
    const labels = countLabels(docs);
    assert.deepEqual(Object.keys(labels).sort(), ['great', 'other']);
    assert.ok(labels.great! > 1700 && labels.great! < 2300, `great: ${labels.great}`);
    // The reviews keep the page's line breaks as tags ("<br />"): a fifth to a quarter of them.
    const withBreaks = docs.filter((d) => /<br\s*\/?>/i.test(d.text)).length / docs.length;
    assert.ok(withBreaks > 0.18 && withBreaks < 0.3, `share with <br />: ${withBreaks}`);
  });
});
