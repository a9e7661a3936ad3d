import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';

export const PYTHON = '/usr/bin/python3';
const SCRIPT = join(__dirname, 'sklearn-tfidf.py');

export interface SklearnCsr {
  vocabulary: string[];
  indptr: number[];
  indices: number[];
  data: number[];
}

export interface SklearnVariant {
  sublinear_tf: boolean;
  binary: boolean;
  use_idf: boolean;
  smooth_idf: boolean;
  norm: 'l2' | 'l1' | null;
}

export type SklearnDf = { int: number } | { float: number };

export interface SklearnAnswer {
  sklearn: string;
  variants: (SklearnCsr & { idf: number[] | null })[];
  prunes: SklearnCsr[];
}

/** Fails with an install hint when scikit-learn is not importable by /usr/bin/python3. */
export function requireSklearn(): void {
  const probe = existsSync(PYTHON) ? spawnSync(PYTHON, ['-c', 'import sklearn'], { encoding: 'utf8' }) : null;
  if (probe === null || probe.status !== 0) {
    throw new Error('scikit-learn is needed for the reference checks: install Debian\'s python3-sklearn (apt-get install python3-sklearn); CI installs it.');
  }
}

/** Runs test/reference/sklearn-tfidf.py once on our token lists. */
export function runSklearn(docs: string[][], variants: SklearnVariant[], prunes: { min_df: SklearnDf; max_df: SklearnDf }[]): SklearnAnswer {
  const r = spawnSync(PYTHON, [SCRIPT], {
    input: JSON.stringify({ docs, variants, prunes }),
    encoding: 'utf8',
    maxBuffer: 256 * 1024 * 1024,
  });
  if (r.status !== 0) throw new Error(`sklearn-tfidf.py failed: ${r.stderr}`);
  return JSON.parse(r.stdout) as SklearnAnswer;
}
