import { createReadStream } from 'node:fs';
import { createGunzip } from 'node:zlib';
import type { CorpusSource, ReadOptions } from './corpus-source';
import { ChunkDecoder } from './chunk-decoder';
import { BINARY_PROBE_BYTES, detectEncoding, type DetectedEncoding } from './detect-encoding';
import { formatFromExtension } from './detect-format';
import { NewlineNormalizer } from './newline-normalizer';
import { HEAD_BYTES, openCorpusFromChunks } from './open-corpus';
import { UserError } from '../user-error';

/** The format a `.gz` file holds, from the name under the `.gz` (corpus.jsonl.gz → jsonl). */
export function innerFormatOfGzip(file: string): ReturnType<typeof formatFromExtension> {
  return formatFromExtension(file.replace(/\.gz$/i, ''));
}

/**
 * Opens a gzip-compressed corpus (RFC 1952, through node:zlib) as a stream: the head is
 * inflated once to detect encoding, format and fields, and each pass inflates the file again
 * chunk by chunk, so a file larger than memory (or than a JavaScript string) is never held whole.
 */
export async function openGzipCorpus(file: string, options: ReadOptions = {}): Promise<CorpusSource> {
  const { bytes, complete } = await inflatedHead(file, Math.max(HEAD_BYTES, BINARY_PROBE_BYTES));
  if (bytes.length === 0) throw new UserError('the file is empty (nothing inside the gzip stream)', file, null);
  const encoding = detectEncoding(bytes, file, complete);
  const decoder = new ChunkDecoder(encoding.encoding, encoding.bomLength);
  const head = new NewlineNormalizer().push(decoder.decode(bytes.subarray(encoding.bomLength), complete), complete);
  const inner = innerFormatOfGzip(file);
  const readOptions: ReadOptions = (options.format === undefined || options.format === 'auto') && inner !== null ? { ...options, format: inner } : options;
  const notes = encoding.note === null ? [] : [encoding.note];
  return openCorpusFromChunks(file, head, complete, notes, (passNotes) => inflatedText(file, encoding, passNotes), readOptions);
}

async function inflatedHead(file: string, length: number): Promise<{ bytes: Uint8Array; complete: boolean }> {
  const parts: Buffer[] = [];
  let size = 0;
  let complete = true;
  const stream = createReadStream(file).pipe(createGunzip());
  try {
    for await (const chunk of stream as AsyncIterable<Buffer>) {
      parts.push(chunk);
      size += chunk.length;
      if (size >= length) {
        complete = false;
        break;
      }
    }
  } catch (e) {
    throw gzipError(file, e);
  } finally {
    stream.destroy();
  }
  const all = Buffer.concat(parts);
  return { bytes: complete ? all : all.subarray(0, length), complete };
}

async function* inflatedText(file: string, encoding: DetectedEncoding, notes: string[]): AsyncGenerator<string> {
  const decoder = new ChunkDecoder(encoding.encoding, encoding.bomLength);
  const newlines = new NewlineNormalizer();
  let skip = encoding.bomLength;
  const stream = createReadStream(file).pipe(createGunzip());
  try {
    for await (const raw of stream as AsyncIterable<Buffer>) {
      let chunk: Uint8Array = raw;
      if (skip > 0) {
        const drop = Math.min(skip, chunk.length);
        chunk = chunk.subarray(drop);
        skip -= drop;
      }
      const text = newlines.push(decoder.decode(chunk, false), false);
      if (text.length > 0) yield text;
    }
  } catch (e) {
    throw gzipError(file, e);
  } finally {
    stream.destroy();
  }
  const tail = newlines.push(decoder.decode(new Uint8Array(0), true), true);
  if (tail.length > 0) yield tail;
  notes.push(...decoder.notes);
}

function gzipError(file: string, e: unknown): Error {
  if (e instanceof UserError) return e;
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOENT' || code === 'EACCES' || code === 'EISDIR') return new UserError(`cannot read the file (${code})`, file, null);
  return new UserError(`not a readable gzip file (${(e as Error).message})`, file, null);
}
