// The scenarios in the order they run. Later ones reuse the review the earlier ones ran
// (lib/review-corpus.mjs caches it) and each puts back any file it edits.
import { smoke } from './scenarios/smoke.mjs';
import { reviewFromPalette } from './scenarios/review-from-palette.mjs';
import { toggleWhatIf } from './scenarios/toggle-what-if.mjs';
import { quickFixAddTerm } from './scenarios/quick-fix-add-term.mjs';
import { deadStopEntry } from './scenarios/dead-stop-entry.mjs';
import { htmlPayloadCorpus } from './scenarios/html-payload-corpus.mjs';
import { malformedCorpus } from './scenarios/malformed-corpus.mjs';
import { exportHtmlReport } from './scenarios/export-html-report.mjs';
import { cancelReview, whatIfLatency, whatIfLatency100k } from './scenarios/what-if-latency.mjs';
import { reviewShardsFolder } from './scenarios/review-shards-folder.mjs';
import { reviewDocumentsFolder } from './scenarios/review-documents-folder.mjs';
import { corpusMarkers } from './scenarios/corpus-markers.mjs';
import { columnPicker } from './scenarios/column-picker.mjs';
import { reviewJsonArray } from './scenarios/review-json-array.mjs';

export const scenarios = [smoke, reviewFromPalette, toggleWhatIf, quickFixAddTerm, deadStopEntry, htmlPayloadCorpus, malformedCorpus, exportHtmlReport, corpusMarkers, columnPicker, reviewJsonArray, reviewShardsFolder, reviewDocumentsFolder, whatIfLatency, cancelReview, whatIfLatency100k];
