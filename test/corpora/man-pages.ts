import { execFile } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import * as path from 'node:path';
import { promisify } from 'node:util';
import { cached, evenlySpaced, squeeze, type DevCorpus, type LabelledDoc } from './labelled-corpus';

const run = promisify(execFile);
const MAN = '/usr/share/man';
const SECTIONS = ['1', '2', '3', '5', '7', '8'];
const PER_SECTION = 170;

/**
 * Manual pages rendered as a reader sees them (man-db, 100 columns, no hyphenation), labelled by
 * section (1 commands, 2 system calls, 3 library functions, 5 file formats, 7 overviews,
 * 8 administration), 170 pages a section, evenly spaced by file name.
 * Source: Debian packages manpages, manpages-dev and the man pages of the installed packages.
 */
export const MAN_PAGES: DevCorpus = {
  name: 'man-pages',
  genre: 'technical manuals',
  role: 'TUNE',
  source: 'Debian manpages + manpages-dev (+ installed packages), rendered by man-db; label = section',
  missing: 'apt-get install man-db manpages manpages-dev',
  available: () => existsSync('/usr/bin/man') && existsSync(path.join(MAN, 'man2')),
  load: () =>
    cached('man-pages', async () => {
      const jobs: Array<{ file: string; label: string }> = [];
      for (const s of SECTIONS) {
        const dir = path.join(MAN, `man${s}`);
        const files = readdirSync(dir).filter((f) => f.endsWith('.gz')).sort();
        for (const f of evenlySpaced(files, PER_SECTION)) jobs.push({ file: path.join(dir, f), label: s });
      }
      const docs: Array<LabelledDoc | null> = new Array(jobs.length).fill(null);
      let next = 0;
      const worker = async (): Promise<void> => {
        while (next < jobs.length) {
          const i = next++;
          try {
            const { stdout } = await run('/usr/bin/man', ['--no-hyphenation', '--no-justification', '-l', jobs[i]!.file], {
              env: { ...process.env, MANWIDTH: '100', MAN_KEEP_FORMATTING: '', LC_ALL: 'C.UTF-8' },
              maxBuffer: 1 << 26,
            });
            // Overstrike bold/underline (x\bx, _\bx) to plain characters, as col -b does.
            const text = squeeze(stdout.replace(/.\x08/g, ''));
            if (text.length > 0) docs[i] = { text, label: jobs[i]!.label };
          } catch {
            // A page man cannot render (a .so link to a missing file) is left out.
          }
        }
      };
      await Promise.all([worker(), worker()]);
      return docs.filter((d): d is LabelledDoc => d !== null);
    }),
};
