import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { availableWhen, type DevCorpus, type LabelledDoc } from './labelled-corpus';

/** The three files of the sentiment package's test fixtures, one sentence per item. */
const SOURCES = ['amazon', 'imdb', 'yelp'] as const;

function fixture(name: string): string {
  return path.join(path.dirname(require.resolve('sentiment/package.json')), 'test', 'fixtures', `${name}.json`);
}

/**
 * Short opinion text labelled by rating: 3,000 one-sentence reviews of products, films and
 * restaurants, each labelled positive or negative by its author's rating. Source: the UCI
 * "Sentiment Labelled Sentences" data (Kotzias, Denil, de Freitas & Smyth 2015, "From group to
 * individual labels using deep features", KDD), as shipped in the test fixtures of the npm package
 * `sentiment` (devDependency). The label is the polarity alone, so neighbours must share the
 * opinion, not the product kind — the case where removing negations and intensifiers hurts.
 */
export const RATED_SENTENCES: DevCorpus = {
  name: 'rated-sentences',
  genre: 'one-sentence reviews (opinion text)',
  role: 'CHECK',
  source: 'npm sentiment test fixtures (UCI Sentiment Labelled Sentences); label = positive / negative',
  missing: 'npm install (devDependency sentiment)',
  available: availableWhen(...SOURCES.map((s) => () => fixture(s))),
  load: async () => {
    const docs: LabelledDoc[] = [];
    for (const source of SOURCES) {
      const items = JSON.parse(readFileSync(fixture(source), 'utf8')) as { text: string; class: number }[];
      for (const item of items) {
        const text = item.text.trim();
        if (text.length > 0) docs.push({ text, label: item.class === 1 ? 'positive' : 'negative' });
      }
    }
    return docs;
  },
};
