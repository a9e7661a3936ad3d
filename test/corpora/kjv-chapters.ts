import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { promisify } from 'node:util';
import { cached, squeeze, type DevCorpus, type LabelledDoc } from './labelled-corpus';

const run = promisify(execFile);
const BIBLE = '/usr/bin/bible';

/** The 66 books as the `bible` program spells them (no spaces in numbered books). */
const BOOKS = [
  'Genesis', 'Exodus', 'Leviticus', 'Numbers', 'Deuteronomy', 'Joshua', 'Judges', 'Ruth', '1Samuel', '2Samuel',
  '1Kings', '2Kings', '1Chronicles', '2Chronicles', 'Ezra', 'Nehemiah', 'Esther', 'Job', 'Psalms', 'Proverbs',
  'Ecclesiastes', 'Song', 'Isaiah', 'Jeremiah', 'Lamentations', 'Ezekiel', 'Daniel', 'Hosea', 'Joel', 'Amos',
  'Obadiah', 'Jonah', 'Micah', 'Nahum', 'Habakkuk', 'Zephaniah', 'Haggai', 'Zechariah', 'Malachi', 'Matthew',
  'Mark', 'Luke', 'John', 'Acts', 'Romans', '1Corinthians', '2Corinthians', 'Galatians', 'Ephesians',
  'Philippians', 'Colossians', '1Thessalonians', '2Thessalonians', '1Timothy', '2Timothy', 'Titus', 'Philemon',
  'Hebrews', 'James', '1Peter', '2Peter', '1John', '2John', '3John', 'Jude', 'Revelation',
];

/**
 * The King James Version, one document per chapter (1,189), labelled by book.
 * Source: Debian packages bible-kjv-text (the text) and bible-kjv (the `bible` program that reads it).
 * The program answers a chapter past the book's end with the last chapter, so a chapter whose
 * heading names another number ends the book.
 */
export const KJV_CHAPTERS: DevCorpus = {
  name: 'kjv-chapters',
  genre: 'scripture chapters (archaic English)',
  role: 'CHECK',
  source: 'Debian bible-kjv-text via bible-kjv; label = book',
  missing: 'apt-get install bible-kjv',
  available: () => existsSync(BIBLE),
  load: () =>
    cached('kjv-chapters', async () => {
      const docs: LabelledDoc[] = [];
      for (const book of BOOKS) {
        for (let chapter = 1; ; chapter++) {
          const { stdout } = await run(BIBLE, [`${book} ${chapter}:1-999`], { env: { ...process.env, LC_ALL: 'C.UTF-8' } });
          const lines = stdout.split('\n');
          const heading = lines.find((l) => l.trim().length > 0) ?? '';
          if (!heading.trim().endsWith(` ${chapter}`)) break;
          // Verse numbers are layout, not text.
          const text = squeeze(lines.slice(lines.indexOf(heading) + 1).join('\n').replace(/^\s*\d+\s/gm, ' '));
          if (text.length === 0) break;
          docs.push({ text, label: book });
        }
      }
      return docs;
    }),
};
