import * as path from 'node:path';
import { evenlySpaced, squeeze, type DevCorpus, type LabelledDoc, availableWhen, unpackedDebianPackage } from './labelled-corpus';
import { readRLazyLoadFrame } from './r-lazy-load';

const PACKAGE = 'r-cran-modeldata';

/** The package's folder of data, unpacked into the cache (installing it would pull in all of R). */
function unpack(): string {
  return path.join(unpackedDebianPackage(PACKAGE), 'usr', 'lib', 'R', 'site-library', 'modeldata', 'data');
}

/**
 * Multi-sentence product reviews labelled by rating, with the HTML line breaks of the original
 * pages left in ("<br />" in about 23% of them): the 5,000 Amazon fine-food reviews of the R
 * package modeldata's `small_fine_foods` data (its `training_data` and `testing_data` frames; from
 * McAuley & Leskovec 2013, "From amateurs to connoisseurs", WWW). Source: Debian package
 * r-cran-modeldata, read from its R data base by r-lazy-load.ts. Label = the package's `score`
 * ("great" for five stars, "other" below). Capped to 3,000 evenly spaced reviews like the other
 * corpora of this size.
 */
export const FINE_FOOD_REVIEWS: DevCorpus = {
  name: 'fine-food-reviews',
  genre: 'product reviews, several sentences, HTML line breaks left in (opinion text)',
  role: 'CHECK',
  source: 'Debian r-cran-modeldata (small_fine_foods: Amazon fine-food reviews); label = score (great / other)',
  missing: 'apt-get update (the corpus is unpacked from `apt-get download r-cran-modeldata`)',
  available: availableWhen(unpack),
  load: async () => evenlySpaced(allReviews(), 3000),
};

/**
 * All 5,000 of the same reviews, uncapped: run only when named (test/corpora/README.md, "Larger
 * versions"), to see whether the capped corpus's row holds on every review the package has.
 */
export const FINE_FOOD_REVIEWS_5K: DevCorpus = {
  ...FINE_FOOD_REVIEWS,
  name: 'fine-food-reviews-5k',
  load: async () => allReviews(),
};

/** Every review of both frames, in the package's order. */
function allReviews(): LabelledDoc[] {
  const docs: LabelledDoc[] = [];
  for (const frame of ['training_data', 'testing_data']) {
    const columns = readRLazyLoadFrame(unpack(), frame);
    const reviews = columns.get('review');
    const scores = columns.get('score');
    if (reviews === undefined || scores === undefined) throw new Error(`modeldata ${frame}: no review or score column`);
    reviews.forEach((review, i) => {
      const text = squeeze(review);
      if (text.length > 0) docs.push({ text, label: scores[i]! });
    });
  }
  return docs;
}
