import { promises as fs } from 'node:fs';
import type { CountMatrix } from '../matrix/csr';
import { LOUDWORD_VERSION } from '../review/version';
import { UserError } from '../user-error';

/**
 * A shard's token counts as round 1 found them, kept so that the sums rounds weigh them without
 * reading and tokenising the shard again (tokenising is most of a shard step's cost). The counts
 * are those of count-each-file.ts's fresh tokeniser, so a sums round over kept counts equals one
 * over a second tokenisation, bit for bit.
 *
 * On disk (`loudword shard count --counts FILE`, read by `shard sums --counts FILE`): the bytes
 * "LWCOUNTS", a little-endian uint32 length, that many bytes of JSON (the header below, the terms
 * and the previews), zero padding to a multiple of 4, then the uint32 arrays indptr (rows + 1),
 * indices (nonzeros), data (nonzeros: counts are whole numbers) and tokensPerDoc (rows), then the
 * int32 array firstTerms (rows).
 */
export interface ShardCounts {
  counts: CountMatrix;
  /** First characters of each document (tokenize/document-preview.ts). */
  previews: string[];
  /** Each document's label, when the review has a label field: the verdict's corpus search reports its neighbours' labels. */
  labels: (string | null)[] | null;
}

/** What the kept counts were computed from: a sums step uses them only if all of it still holds. */
export interface ShardCountsOrigin {
  settingsKey: string;
  shardKey: string;
  /** The shard file's size and modification time when round 1 read it. */
  size: number;
  mtimeMs: number;
}

interface Header extends ShardCountsOrigin {
  format: number;
  toolVersion: string;
  rows: number;
  cols: number;
  nonzeros: number;
  terms: string[];
  previews: string[];
  labels: (string | null)[] | null;
}

const MAGIC = Buffer.from('LWCOUNTS', 'latin1');
const FORMAT = 3;

export function encodeShardCounts(kept: ShardCounts, origin: ShardCountsOrigin): Buffer {
  const { counts } = kept;
  const nonzeros = counts.indptr[counts.rows]!;
  const data = new Uint32Array(nonzeros);
  for (let p = 0; p < nonzeros; p++) {
    const v = counts.data[p]!;
    if (!Number.isInteger(v) || v < 0 || v > 0xffffffff) throw new Error(`a token count that is not a whole number: ${v}`);
    data[p] = v;
  }
  const header: Header = {
    ...origin,
    format: FORMAT,
    toolVersion: LOUDWORD_VERSION,
    rows: counts.rows,
    cols: counts.cols,
    nonzeros,
    terms: [...counts.terms],
    previews: kept.previews,
    labels: kept.labels,
  };
  const json = Buffer.from(JSON.stringify(header), 'utf8');
  const pad = (4 - ((MAGIC.length + 4 + json.length) % 4)) % 4;
  const length = Buffer.alloc(4);
  length.writeUInt32LE(json.length);
  const bytes = (a: Uint32Array): Buffer => Buffer.from(a.buffer, a.byteOffset, a.byteLength);
  return Buffer.concat([
    MAGIC,
    length,
    json,
    Buffer.alloc(pad),
    bytes(counts.indptr.subarray(0, counts.rows + 1)),
    bytes(counts.indices.subarray(0, nonzeros)),
    bytes(data),
    bytes(counts.tokensPerDoc.subarray(0, counts.rows)),
    Buffer.from(counts.firstTerms.buffer, counts.firstTerms.byteOffset, 4 * counts.rows),
  ]);
}

/** Reads kept counts; null when they were computed from anything other than `origin` (then tokenise again). */
export function decodeShardCounts(buffer: Buffer, origin: ShardCountsOrigin, file: string): ShardCounts | null {
  if (buffer.length < MAGIC.length + 4 || !buffer.subarray(0, MAGIC.length).equals(MAGIC)) throw new UserError('not a file of Loudword shard counts', file, null);
  const jsonLength = buffer.readUInt32LE(MAGIC.length);
  let at = MAGIC.length + 4;
  const header = JSON.parse(buffer.toString('utf8', at, at + jsonLength)) as Header;
  if (header.format !== FORMAT || header.toolVersion !== LOUDWORD_VERSION) return null;
  if (header.settingsKey !== origin.settingsKey || header.shardKey !== origin.shardKey || header.size !== origin.size || header.mtimeMs !== origin.mtimeMs) return null;
  at += jsonLength;
  at += (4 - (at % 4)) % 4;
  const { rows, nonzeros } = header;
  const expected = at + 4 * (rows + 1 + 2 * nonzeros + rows + rows);
  if (buffer.length !== expected) throw new UserError(`shard counts cut short (${buffer.length} bytes, expected ${expected})`, file, null);
  // Copies, so the arrays are aligned whatever the Buffer's offset in its pool.
  const take = (n: number): Uint32Array => {
    const out = new Uint32Array(n);
    new Uint8Array(out.buffer).set(buffer.subarray(at, at + 4 * n));
    at += 4 * n;
    return out;
  };
  const indptr = take(rows + 1);
  const indices = take(nonzeros);
  const data = Float64Array.from(take(nonzeros));
  const tokensPerDoc = take(rows);
  const firstTerms = new Int32Array(take(rows).buffer);
  return { counts: { rows, cols: header.cols, indptr, indices, data, terms: header.terms, tokensPerDoc, firstTerms }, previews: header.previews, labels: header.labels };
}

/** The origin of a shard's counts now: its file's size and modification time under these settings. */
export async function shardCountsOrigin(file: string, shardKey: string, settingsKey: string): Promise<ShardCountsOrigin> {
  const stat = await fs.stat(file);
  return { settingsKey, shardKey, size: stat.size, mtimeMs: stat.mtimeMs };
}

/** Writes kept counts atomically (a temporary file renamed into place), so a killed step leaves none or all. */
export async function writeShardCounts(file: string, kept: ShardCounts, origin: ShardCountsOrigin): Promise<void> {
  const temporary = `${file}.${process.pid}.${Date.now()}.part`;
  try {
    await fs.writeFile(temporary, encodeShardCounts(kept, origin));
    await fs.rename(temporary, file);
  } catch (e) {
    await fs.rm(temporary, { force: true });
    throw new UserError(`cannot write the shard counts (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`, file, null);
  }
}

/** Kept counts if `file` holds them for this origin; null if it is missing or from another state of the shard. */
export async function readShardCounts(file: string, origin: ShardCountsOrigin): Promise<ShardCounts | null> {
  let buffer: Buffer;
  try {
    buffer = await fs.readFile(file);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw new UserError(`cannot read the shard counts (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`, file, null);
  }
  return decodeShardCounts(buffer, origin, file);
}
