import { formatCount } from './number-format';
import type { Report } from './protocol';

/**
 * How the CLI and the panel say the size of the stop list in force: "41 terms", or, for a file
 * the settings name but nobody has written yet, that it is not there — "0 terms" beside a path
 * reads as an empty file the user made, and sends them looking for it; the first term added
 * creates it.
 */
export function stopListSize(stopList: Report['stopList']): string {
  if (stopList.file !== null && !stopList.exists) return 'not created yet';
  return `${formatCount(stopList.terms)} term${stopList.terms === 1 ? '' : 's'}`;
}
