// The scenarios in the order they run. Later ones reuse the review the earlier ones ran
// (lib/review-corpus.mjs caches it) and each puts back any file it edits.
import { smoke } from './scenarios/smoke.mjs';
import { reviewFromPalette } from './scenarios/review-from-palette.mjs';

export const scenarios = [smoke, reviewFromPalette];
