import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { gzipSync } from 'node:zlib';
import { mulberry32 } from '../../extension/src/engine/random/seeded-random';
import { readFortunes } from '../corpora/fortunes';

export interface Doc {
  text: string;
  label: string;
}

/** Debian's fortunes (package `fortunes`), `perCategory` entries of each category. */
export function fortuneDocs(perCategory: number): Doc[] {
  return readFortunes(undefined, perCategory).map((f) => ({ text: f.text, label: f.category }));
}

/**
 * Generated documents (seeded): a Zipf-like background vocabulary every topic shares, plus
 * topic words, so there are loud terms and neighbour signal to find. No outside source.
 */
export function generatedDocs(count: number, seed: number): Doc[] {
  const random = mulberry32(seed);
  const common = Array.from({ length: 60 }, (_, i) => `com${i}`);
  const topics = Array.from({ length: 6 }, (_, t) => Array.from({ length: 80 }, (_, i) => `t${t}w${i}`));
  const docs: Doc[] = [];
  for (let d = 0; d < count; d++) {
    const topic = Math.floor(random() * topics.length);
    const length = 8 + Math.floor(random() * 30);
    const words: string[] = [];
    for (let i = 0; i < length; i++) {
      if (random() < 0.55) words.push(common[Math.floor(common.length * random() ** 3)]!);
      else words.push(topics[topic]![Math.floor(80 * random() ** 2)]!);
    }
    docs.push({ text: words.join(' '), label: `topic${topic}` });
  }
  return docs;
}

/** Deals `docs` round-robin into `shards` JSON Lines files `part-<i>.jsonl` in `dir`; returns their paths. */
export function writeShards(dir: string, docs: readonly Doc[], shards: number): string[] {
  const files: string[] = [];
  for (let s = 0; s < shards; s++) {
    const file = path.join(dir, `part-${s}.jsonl`);
    writeFileSync(file, docs.filter((_, i) => i % shards === s).map((d) => JSON.stringify(d)).join('\n') + '\n');
    files.push(file);
  }
  return files;
}

/** The same as JSON Lines compressed with gzip. */
export function writeGzipJsonl(file: string, docs: readonly Doc[]): void {
  writeFileSync(file, gzipSync(Buffer.from(docs.map((d) => JSON.stringify(d)).join('\n') + '\n')));
}
