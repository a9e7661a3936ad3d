import type { Csr } from '../matrix/csr';
import { rowHasWeight } from '../matrix/rows-with-weight';
import { BottomK, type Ranked } from '../random/bottom-k';
import { hashFileKey, placeKey } from '../random/place-hash';

export interface ReviewSample {
  /** Document index of each sample position, ascending. */
  positions: Uint32Array;
  /** Label id per sample position (−1 = no label); null when the corpus has no label field. */
  labels: Int32Array | null;
  /** How many documents had no terms left and so could not be sampled. */
  emptyDocuments: number;
}

/** Where the documents come from: file keys in reading order, documents per file, and each document's line. */
export interface SamplePlaces {
  keys: readonly string[];
  documents: readonly number[];
  lines: Uint32Array;
}

/**
 * The seeded sample the quadratic measures run on: the `size` documents whose places (file key,
 * line) hash lowest under the seed (bottom-k, see random/place-hash.ts), so the shards of a
 * distributed review choose exactly these documents too. Documents with no terms left are not
 * sampled: they have no direction, so no distance to rank.
 */
export function chooseSample(weights: Csr, size: number, seed: number, labels: readonly (string | null)[] | null, places: SamplePlaces): ReviewSample {
  const kept = new BottomK<Ranked & { doc: number }>(Math.max(0, Math.min(size, weights.rows)));
  let nonEmpty = 0;
  let doc = 0;
  // One candidate object is reused for the test; only admitted documents get their own (at a
  // million documents, a million short-lived objects otherwise).
  const candidate: Ranked = { key: 0, file: '', line: 0 };
  for (let f = 0; f < places.keys.length; f++) {
    const file = places.keys[f]!;
    const fileHash = hashFileKey(file, seed);
    candidate.file = file;
    const end = doc + places.documents[f]!;
    for (; doc < end; doc++) {
      if (!rowHasWeight(weights, doc)) continue;
      nonEmpty++;
      candidate.line = places.lines[doc]!;
      candidate.key = placeKey(fileHash, candidate.line);
      if (kept.admits(candidate)) kept.push({ key: candidate.key, file, line: candidate.line, doc });
    }
  }
  if (doc !== weights.rows) throw new RangeError(`chooseSample: the places cover ${doc} documents of ${weights.rows}`);
  const positions = Uint32Array.from(kept.items(), (item) => item.doc).sort();
  return { positions, labels: sampleLabelIds(positions, labels), emptyDocuments: weights.rows - nonEmpty };
}

/** Label ids per sample position, numbered in order of first appearance; −1 where there is none. */
export function sampleLabelIds(positions: Uint32Array, labels: readonly (string | null)[] | null): Int32Array | null {
  if (labels === null) return null;
  const ids = new Map<string, number>();
  const labelIds = new Int32Array(positions.length);
  for (let i = 0; i < positions.length; i++) {
    const label = labels[positions[i]!] ?? null;
    if (label === null || label === '') {
      labelIds[i] = -1;
      continue;
    }
    let id = ids.get(label);
    if (id === undefined) ids.set(label, (id = ids.size));
    labelIds[i] = id;
  }
  return labelIds;
}
