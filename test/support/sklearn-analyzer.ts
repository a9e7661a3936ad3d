import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { DEFAULT_SETTINGS } from '../../extension/src/engine/config/default-settings';
import type { TokenSettings } from '../../extension/src/engine/tokenize/create-tokenizer';
import { SKLEARN_TOKEN_PATTERN } from '../../extension/src/engine/tokenize/pattern-tokenizer';
import { PYTHON } from '../reference/run-sklearn';

// Helpers for comparing tokens.tokenizer "pattern" with scikit-learn's analyzer
// (test/reference/sklearn-analyzer.py, Debian's python3-sklearn).

export interface AnalyzerJob {
  token_pattern?: string;
  lowercase: boolean;
  ngram_range: [number, number];
}

/** scikit-learn's analyzer output for each job (one Python process for all of them). */
export function sklearnTokensMany(docs: string[], jobs: AnalyzerJob[]): string[][][] {
  const run = spawnSync(PYTHON, [join(__dirname, '..', 'reference', 'sklearn-analyzer.py')], {
    input: JSON.stringify({ docs, jobs: jobs.map((j) => ({ ...j, token_pattern: j.token_pattern ?? null })) }),
    encoding: 'utf8',
    maxBuffer: 1 << 30,
  });
  if (run.status !== 0) throw new Error(`sklearn-analyzer.py failed: ${run.stderr}`);
  return (JSON.parse(run.stdout) as { tokens: string[][][] }).tokens;
}

export function sklearnTokens(docs: string[], job: AnalyzerJob): string[][] {
  return sklearnTokensMany(docs, [job])[0]!;
}

export function assertSameTokens(ours: (t: string) => string[], theirs: string[][], docs: string[]): void {
  for (let d = 0; d < docs.length; d++) {
    const got = ours(docs[d]!);
    const want = theirs[d]!;
    if (got.length !== want.length || got.some((t, i) => t !== want[i])) assert.deepEqual(got, want, `document ${d}: ${JSON.stringify(docs[d]!.slice(0, 200))}`);
  }
}

export const base: TokenSettings = { ...DEFAULT_SETTINGS.tokens, kinds: [...DEFAULT_SETTINGS.tokens.kinds], ngrams: 1, minLength: 1, tokenizer: 'pattern', pattern: SKLEARN_TOKEN_PATTERN };

