// A generated corpus in shards for the cluster benches (seeded; common practice, no source): a
// Zipf-like vocabulary of 50,000 words shared by all documents plus 40 topics' own bands of it,
// 20–119 words a document, labelled by topic. Document d goes to shard d mod shards.
import { createWriteStream, mkdirSync } from 'node:fs';
import { once } from 'node:events';
import * as path from 'node:path';
import { tsImport } from 'tsx/esm/api';

// The engine's own seeded generator (one mulberry32 in the project), loaded through tsx.
const { mulberry32 } = await tsImport('../extension/src/engine/random/seeded-random.ts', import.meta.url);

export async function generateShards(dir, documents, shards) {
  const random = mulberry32(2026);
  const vocabulary = Array.from({ length: 50_000 }, (_, i) => `w${i.toString(36)}`);
  const topics = 40;
  mkdirSync(dir, { recursive: true });
  const outs = Array.from({ length: shards }, (_, s) => createWriteStream(path.join(dir, `part-${String(s).padStart(3, '0')}.jsonl`)));
  for (let d = 0; d < documents; d++) {
    const topic = Math.floor(random() * topics);
    const length = 20 + Math.floor(random() * 100);
    const words = [];
    for (let i = 0; i < length; i++) {
      // Zipf-like background (rank ~ 1/u) and a topic's own band of the vocabulary.
      if (random() < 0.7) words.push(vocabulary[Math.min(vocabulary.length - 1, Math.floor(1 / (random() + 1e-5)) - 1)]);
      else words.push(vocabulary[1000 + topic * 500 + Math.floor(500 * random() ** 2)]);
    }
    const out = outs[d % shards];
    if (!out.write(`${JSON.stringify({ text: words.join(' '), label: `t${topic}` })}\n`)) await once(out, 'drain');
  }
  await Promise.all(outs.map((o) => new Promise((resolve, reject) => o.end((e) => (e ? reject(e) : resolve())))));
}
