import { existsSync, lstatSync, readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';

/**
 * Debian's `fortunes` package as a labelled corpus: one category per file under
 * /usr/share/games/fortunes, entries separated by lines holding a single '%'.
 * Source: the Debian package `fortunes` (fortune-mod data files), installed by apt.
 */
export const FORTUNES_DIR = '/usr/share/games/fortunes';

/** Categories with a few hundred entries each, mostly prose (not ASCII art). */
export const FORTUNE_CATEGORIES = ['computers', 'food', 'law', 'love', 'medicine', 'politics', 'science', 'sports', 'work', 'education', 'pets', 'literature'];

export interface Fortune {
  text: string;
  category: string;
}

export function fortunesAvailable(): boolean {
  return existsSync(path.join(FORTUNES_DIR, 'computers'));
}

export function readFortunes(categories: readonly string[] = FORTUNE_CATEGORIES, maxPerCategory = Infinity): Fortune[] {
  if (!fortunesAvailable()) {
    throw new Error(`${FORTUNES_DIR} is missing: install the Debian package "fortunes" (apt-get install fortunes)`);
  }
  const out: Fortune[] = [];
  for (const category of categories) {
    const raw = readFileSync(path.join(FORTUNES_DIR, category), 'latin1');
    const entries = raw
      .split(/\r?\n%\r?\n/)
      .map((e) => e.replace(/\s+/g, ' ').trim())
      .filter((e) => e.length > 0 && e !== '%');
    for (const text of entries.slice(0, maxPerCategory)) out.push({ text, category });
  }
  return out;
}

/** The corpus as JSON Lines with keys "text" and "category". */
export function fortunesJsonl(categories?: readonly string[], maxPerCategory?: number): string {
  return readFortunes(categories, maxPerCategory)
    .map((f) => JSON.stringify(f))
    .join('\n') + '\n';
}

/**
 * The fortunes of another language's Debian package (`fortunes-de`: German, `fortunes-es`:
 * Spanish), UTF-8, under FORTUNES_DIR/<language>: every regular data file is a category (the
 * links, the `.dat` indexes and the subfolders left out).
 */
export function readForeignFortunes(language: 'de' | 'es'): Fortune[] {
  const dir = path.join(FORTUNES_DIR, language);
  if (!existsSync(dir)) throw new Error(`${dir} is missing: install the Debian package "fortunes-${language}"`);
  const out: Fortune[] = [];
  for (const name of readdirSync(dir).sort()) {
    const file = path.join(dir, name);
    if (name.endsWith('.dat') || !lstatSync(file).isFile()) continue;
    const entries = readFileSync(file, 'utf8')
      .split(/\r?\n%\r?\n/)
      .map((e) => e.replace(/\s+/g, ' ').trim())
      .filter((e) => e.length > 0 && e !== '%');
    for (const text of entries) out.push({ text, category: name });
  }
  return out;
}
