import { createHash } from 'node:crypto';
import type { EffectiveSettings, Report } from '../../protocol';
import { LOUDWORD_VERSION } from '../review/version';
import { UserError } from '../user-error';
import type { DuplicateSketch } from '../matrix/duplicate-sketch';
import type { RepeatedLines } from '../matrix/repeated-lines';

/**
 * The shard steps' partial files (JSON). Every partial says which step wrote it, the version of
 * this layout and of Loudword, and a key of the settings it was computed with: partials from
 * different settings or versions are never merged. Float arrays travel as base64 of their
 * IEEE-754 bytes, so a figure survives the trip to the last bit.
 */
// 4: the plan says whether the stop list file exists. 5: sums partials carry the duplicates sketch.
export const PARTIAL_FORMAT = 5;

export type ShardStep = 'count' | 'plan' | 'sums';

export interface PartialHeader {
  loudword: 'shard-partial';
  step: ShardStep;
  formatVersion: number;
  toolVersion: string;
  settingsKey: string;
}

/** A document kept as a sample candidate by its shard (its raw counts, to be weighed after the merge). */
export interface SampleCandidate {
  /** The bottom-k key of its place (random/place-hash.ts). */
  key: number;
  line: number;
  /** 0-based document index within the shard. */
  row: number;
  label: string | null;
  preview: string;
  /** Ids into the shard's `terms`, ascending, with their counts. */
  terms: number[];
  counts: number[];
}

/** Round 1 of one shard: what the merge needs to fix the vocabulary, idf and sample. */
export interface CountPartial extends PartialHeader {
  step: 'count';
  shard: { key: string; file: string };
  documents: number;
  tokens: number;
  /** Documents with at least one term before pruning: those the sample may draw. */
  nonEmptyDocuments: number;
  input: {
    format: Report['input']['format'];
    textField: string | null;
    labelField: string | null;
    skipped: number;
    /** Documents with no label (absent in partials written before it was counted: read as 0). */
    unlabelled?: number;
    skippedExamples: Array<{ line: number; reason: string }>;
    notes: string[];
    truncated: { bytesRead: number; limitBytes: number } | null;
  };
  /** What tokenising had to say (over-long runs cut), as one process reports it after the reader's notes. */
tokenizerNotes: string[];
  /** Lines recurring across the shard's documents (matrix/repeated-lines.ts); absent in partials written before they were counted. */
  repeatedLines?: RepeatedLines;
  /** The shard's terms in code point order, with their document frequency. */
  terms: string[];
  df: number[];
  /** Up to `candidateLimit` documents with the smallest keys, smallest first. */
  candidates: SampleCandidate[];
  candidateLimit: number;
}

/** A set of stopped columns whose exact sums the shards must add up. */
export interface MaskRequest {
  id: string;
  columns: number[];
}

/**
 * The sampled documents' k nearest neighbours under a mask, which each shard seeks among its own
 * documents (terms/corpus-precision.ts: the verdict's label precision with neighbours from the
 * corpus); `documents`, `among` and `seed` say which documents are candidates (searchCandidates).
 */
export interface NeighborRequest {
  id: string;
  columns: number[];
  documents: number;
  among: number;
  /** How many of the sampled documents are searched for (terms/corpus-precision.ts searchedQueries). */
  queries: number;
  seed: number;
  k: number;
}

/** A shard's answer to a NeighborRequest: per sampled document, its k nearest in the shard (corpus document indices) with their cosines and labels. */
export interface EncodedNeighbors {
  id: string;
  docs: string;
  sims: string;
  labels: (string | null)[];
}

/** An id for a neighbour request's content, the same in every step. */
export function neighborRequestId(columns: readonly number[], search: { documents: number; among: number; queries: number; seed: number }, k: number): string {
  return `${maskId(columns)}-${search.documents}-${search.among}-${search.queries}-${search.seed}-${k}`;
}

/** The merge: vocabulary, idf, the sample, and which exact sums round 2 computes. */
export interface PlanPartial extends PartialHeader {
  step: 'plan';
  /** Identifies vocabulary + shards; sums partials name the plan they were computed for. */
  planId: string;
  corpus: string;
  shards: Array<{ key: string; documents: number; offset: number }>;
  documents: number;
  tokens: number;
  nonzeros: number;
  terms: string[];
  idf: string;
  sample: {
    docs: number[];
    files: string[];
    lines: number[];
    labels: (string | null)[] | null;
    previews: string[];
    indptr: number[];
    indices: number[];
    counts: number[];
  };
  /** Masks whose sums the next sums round computes; `full` adds the unmasked sums, the raw-count statistics and the previews. */
  masks: MaskRequest[];
  /** Neighbour searches the next sums round runs (after the masks they need are known); none at first. */
  neighbors?: NeighborRequest[];
  full: boolean;
  /** Documents whose previews the opinion check reads (terms/review-terms.ts), ascending. */
  previewDocs: number[];
  input: Omit<Report['input'], 'documents'>;
tokenizerNotes: string[];
  /** The shards' repeated lines added up. */
  repeatedLines?: RepeatedLines;
  stopList: { file: string | null; exists: boolean; terms: string[]; unused: string[]; split?: Record<string, string[]> | undefined };
}

export interface EncodedSums {
  rowsWithWeight: number;
  /** Columns with a non-zero df in this shard, ascending (the other sums are 0). */
  cols: string;
  s1: string;
  s2: string;
  sxlogx: string;
  df: string;
}

/** Round 2 of one shard: exact sums under each requested mask (and unmasked). */
export interface SumsPartial extends PartialHeader {
  step: 'sums';
  planId: string;
  shard: { key: string; documents: number };
  masks: Array<{ id: string } & EncodedSums>;
  /** The plan's neighbour requests answered for this shard's documents. */
  neighbors?: EncodedNeighbors[];
  full: EncodedSums | null;
  /** Raw-count statistics of the shard (terms/term-count-stats.ts), with `full`. */
  counts: EncodedCountStats | null;
  /** Previews of the plan's previewDocs that are in this shard, with `full`. */
  previews: Array<{ doc: number; preview: string }>;
  /** The shard's weighted rows' duplicates sketch (matrix/duplicate-sketch.ts), with `full`. */
  duplicates: EncodedDuplicateSketch | null;
}

/** A DuplicateSketch: its hashes as float64 bits and their copies as uint32, both base64. */
export interface EncodedDuplicateSketch {
  keys: string;
  copies: string;
  truncated: boolean;
}

export function encodeDuplicateSketch(sketch: DuplicateSketch): EncodedDuplicateSketch {
  return {
    keys: encodeFloat64(Float64Array.from(sketch.entries, (e) => e.key)),
    copies: encodeUint32(Uint32Array.from(sketch.entries, (e) => e.copies)),
    truncated: sketch.truncated,
  };
}

export function decodeDuplicateSketch(encoded: EncodedDuplicateSketch): DuplicateSketch {
  const keys = decodeFloat64(encoded.keys);
  const copies = decodeUint32(encoded.copies);
  return { entries: Array.from(keys, (key, i) => ({ key, copies: copies[i]! })), truncated: encoded.truncated };
}

export interface EncodedCountStats {
  documents: number;
  totalTokens: number;
  sumLengthSq: number;
  /** Columns with a non-zero df in this shard, ascending. */
  cols: string;
  df: string;
  cf: string;
  sumCountSq: string;
  sumCountLength: string;
  /** Documents each column opens (TermCountStats.opens). */
  opens: string;
}

export type AnyPartial = CountPartial | PlanPartial | SumsPartial;

/** The settings that shape any figure; two partials merge only if these are equal. */
export function settingsKey(settings: EffectiveSettings): string {
  return createHash('sha256').update(canonicalJson(settings)).digest('hex').slice(0, 16);
}

export function header(step: ShardStep, settings: EffectiveSettings): PartialHeader {
  return { loudword: 'shard-partial', step, formatVersion: PARTIAL_FORMAT, toolVersion: LOUDWORD_VERSION, settingsKey: settingsKey(settings) };
}

/** Parses and checks a partial file's text: right kind, step, layout version and Loudword version. */
export function parsePartial<S extends ShardStep>(text: string, file: string, step: S): Extract<AnyPartial, { step: S }> {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    throw new UserError(`not a Loudword partial (invalid JSON: ${(e as Error).message})`, file, null);
  }
  const h = value as Partial<PartialHeader> | null;
  if (h === null || typeof h !== 'object' || h.loudword !== 'shard-partial') throw new UserError('not a Loudword partial', file, null);
  if (h.step !== step) throw new UserError(`a "${String(h.step)}" partial where a "${step}" partial was expected`, file, null);
  if (h.formatVersion !== PARTIAL_FORMAT || h.toolVersion !== LOUDWORD_VERSION) {
    throw new UserError(
      `written by Loudword ${String(h.toolVersion)} (partial format ${String(h.formatVersion)}); this is Loudword ${LOUDWORD_VERSION} (format ${PARTIAL_FORMAT}): run every shard step with one version`,
      file,
      null,
    );
  }
  return value as Extract<AnyPartial, { step: S }>;
}

/** Refuses partials computed with other settings than `expected`, naming the first one. */
export function checkSameSettings(partials: ReadonlyArray<{ header: PartialHeader; file: string }>, expected: string): void {
  for (const p of partials) {
    if (p.header.settingsKey !== expected) {
      throw new UserError(
        `computed with other settings (key ${p.header.settingsKey}, expected ${expected}): every shard step must use the same loudword.json and options`,
        p.file,
        null,
      );
    }
  }
}

export function encodeFloat64(a: Float64Array): string {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64');
}

export function decodeFloat64(text: string): Float64Array {
  const bytes = Buffer.from(text, 'base64');
  const out = new Float64Array(bytes.length / 8);
  new Uint8Array(out.buffer).set(bytes);
  return out;
}

export function encodeUint32(a: Uint32Array): string {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64');
}

export function decodeUint32(text: string): Uint32Array {
  const bytes = Buffer.from(text, 'base64');
  const out = new Uint32Array(bytes.length / 4);
  new Uint8Array(out.buffer).set(bytes);
  return out;
}

/** An id for a mask's content: the same columns give the same id in every step. */
export function maskId(columns: readonly number[]): string {
  if (columns.length === 0) return 'none';
  return createHash('sha256').update(Uint32Array.from(columns).sort()).digest('hex').slice(0, 16);
}

export function maskColumns(removed: Uint8Array): number[] {
  const out: number[] = [];
  for (let c = 0; c < removed.length; c++) if (removed[c] !== 0) out.push(c);
  return out;
}

/** JSON with object keys sorted, so equal settings give equal text. */
function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined);
    entries.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}
