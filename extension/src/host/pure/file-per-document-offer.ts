// A folder the review could not read as tables or lines (no .csv, .jsonl, .txt… in it): the
// editor offers to read each file in it as one document (format "files"), once per review.
import { NO_CORPUS_FILES } from '../../engine/read/corpus-files';

/** Whether a review that failed with `message` should offer format "files"; not when it was already set for this review. */
export function offersFilePerDocument(message: string, overridden: readonly string[]): boolean {
  return message.startsWith(NO_CORPUS_FILES) && !overridden.includes('format');
}
