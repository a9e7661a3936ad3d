import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { gunzipSync, inflateSync } from 'node:zlib';

/**
 * Reads the character vectors of an R package's lazy-load data base (data/Rdata.rdx + Rdata.rdb),
 * so that a data package can be used without installing R. The format is R's own serialization
 * ("R Internals", §1.8 "Serialization formats" and the lazy-loading section): the .rdx is a
 * gzip'd serialized list(variables = named list of c(offset, length), …), and each object in the
 * .rdb is a 4-byte length followed by zlib data of a serialized object. Only what character data
 * needs is read (vectors, pairlists, symbols, strings); anything else is refused by name.
 */
export function readRLazyLoadStrings(dataDir: string): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const [name, value] of readObjects(dataDir)) {
    if (value instanceof RStrings) out.set(name, value.values.map((s) => s ?? ''));
  }
  return out;
}

/**
 * The text columns of one data frame of the data base, by column name: character columns as they
 * are, factors (integer codes with a "levels" attribute) as their level names. Other columns are
 * left out.
 */
export function readRLazyLoadFrame(dataDir: string, frame: string): Map<string, string[]> {
  const value = readObjects(dataDir, frame).get(frame);
  if (!(value instanceof RVector)) throw new Error(`R data base ${dataDir}: no data frame '${frame}'`);
  const out = new Map<string, string[]>();
  for (const [column, cells] of named(value)) {
    if (cells instanceof RStrings) out.set(column, cells.values.map((s) => s ?? ''));
    const levels = cells instanceof RInts ? cells.attributes.get('levels') : undefined;
    if (cells instanceof RInts && levels instanceof RStrings) {
      out.set(column, cells.values.map((code) => levels.values[code - 1] ?? ''));
    }
  }
  return out;
}

/**
 * One object's bytes: a 4-byte big-endian uncompressed length, then either zlib data (R's default
 * compression) or a type byte and the data — 'Z' raw LZMA2 (xz), '2' bzip2, '0' stored — as R's
 * R_compress3 / R_compress2 write them (src/main/serialize.c). xz and bzip2 are Debian's own
 * command-line tools (xz-utils is a required package; bzip2 is standard).
 */
function decompress(chunk: Buffer): Buffer {
  const body = chunk.subarray(5);
  switch (String.fromCharCode(chunk[4]!)) {
    case 'Z':
      return execFileSync('xz', ['--format=raw', '--lzma2=preset=9e', '--decompress', '--stdout'], { input: body, maxBuffer: 1 << 30 });
    case '2':
      return execFileSync('bzip2', ['--decompress', '--stdout'], { input: body, maxBuffer: 1 << 30 });
    case '0':
      return body;
    default:
      return inflateSync(chunk.subarray(4));
  }
}

/** Every object of the data base (or only the one named `only`), deserialized. */
function readObjects(dataDir: string, only?: string): Map<string, unknown> {
  const index = new RReader(gunzipSync(readFileSync(path.join(dataDir, 'Rdata.rdx')))).object() as RVector;
  const entries = named(index).get('variables') as RVector;
  const db = readFileSync(path.join(dataDir, 'Rdata.rdb'));
  const out = new Map<string, unknown>();
  for (const [name, where] of named(entries)) {
    if (only !== undefined && name !== only) continue;
    const [offset, length] = (where as RInts).values;
    const chunk = db.subarray(offset!, offset! + length!);
    out.set(name, new RReader(decompress(chunk)).object());
  }
  return out;
}

class RStrings {
  constructor(readonly values: (string | null)[]) {}
}
class RInts {
  constructor(readonly values: number[], readonly attributes: Map<string, unknown> = new Map()) {}
}
class RVector {
  constructor(readonly items: unknown[], readonly attributes: Map<string, unknown>) {}
}
type Pair = { tag: unknown; value: unknown };

function named(v: RVector): Map<string, unknown> {
  const names = v.attributes.get('names');
  if (!(names instanceof RStrings)) throw new Error('R list without names');
  return new Map(v.items.map((item, i) => [names.values[i] ?? '', item]));
}

const NIL = 254;
const SPECIAL = new Set([NIL, 242, 241, 253, 252, 251, 247]);

class RReader {
  private at = 0;
  private readonly refs: unknown[] = [];
  constructor(private readonly bytes: Buffer) {
    if (bytes.toString('latin1', 0, 2) !== 'X\n') throw new Error('not an R XDR serialization');
    this.at = 2;
    const version = this.int();
    this.int();
    this.int();
    if (version === 3) {
      const nameLength = this.int(); // then the native encoding's name
      this.at += nameLength;
    }
  }

  object(): unknown {
    return this.item(this.int());
  }

  private int(): number {
    const v = this.bytes.readInt32BE(this.at);
    this.at += 4;
    return v;
  }

  private attributes(flags: number): Map<string, unknown> {
    const out = new Map<string, unknown>();
    if ((flags & (1 << 9)) === 0) return out;
    for (const pair of this.object() as Pair[]) out.set(String(pair.tag), pair.value);
    return out;
  }

  private item(flags: number): unknown {
    const type = flags & 0xff;
    if (SPECIAL.has(type)) return null;
    switch (type) {
      case 255:
        return this.refs[(flags >> 8) - 1];
      case 1: {
        const symbol = this.object();
        this.refs.push(symbol);
        return symbol;
      }
      case 9: {
        const n = this.int();
        if (n === -1) return null;
        const s = this.bytes.toString('utf8', this.at, this.at + n);
        this.at += n;
        return s;
      }
      case 2: {
        const pairs: Pair[] = [];
        for (let f = flags; (f & 0xff) === 2; f = this.int()) {
          if ((f & (1 << 9)) !== 0) this.object();
          const tag = (f & (1 << 10)) !== 0 ? this.object() : null;
          pairs.push({ tag, value: this.object() });
        }
        return pairs;
      }
      case 16: {
        const values = Array.from({ length: this.int() }, () => this.object() as string | null);
        this.attributes(flags);
        return new RStrings(values);
      }
      case 19: {
        const items = Array.from({ length: this.int() }, () => this.object());
        return new RVector(items, this.attributes(flags));
      }
      case 10:
      case 13: {
        const values = Array.from({ length: this.int() }, () => this.int());
        return new RInts(values, this.attributes(flags));
      }
      default:
        throw new Error(`R serialization: type ${type} is not read here`);
    }
  }
}
