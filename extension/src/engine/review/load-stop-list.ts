import * as path from 'node:path';
import { parseStopList } from '../stoplist/parse-stop-list';
import { readStopListFile } from '../stoplist/read-stop-list-file';

export interface LoadedStopList {
  /** Absolute path of the stop list file, or null when the settings name none. */
  file: string | null;
  exists: boolean;
  /** Entries as the vocabulary spells them (lower-cased when the tokenizer lower-cases). */
  terms: string[];
}

/** Reads the project's stop list (or the editor's unsaved text of it) for the baseline. */
export async function loadStopList(
  setting: string | null,
  projectDir: string,
  unsavedText: string | undefined,
  lowercase: boolean,
): Promise<LoadedStopList> {
  if (setting === null) return { file: null, exists: false, terms: [] };
  const file = path.resolve(projectDir, setting);
  const { text, exists } = unsavedText !== undefined ? { text: unsavedText, exists: true } : await readStopListFile(file);
  const parsed = parseStopList(text);
  const terms = [...new Set(parsed.terms.map((t) => (lowercase ? t.toLowerCase() : t)))];
  return { file, exists, terms };
}
