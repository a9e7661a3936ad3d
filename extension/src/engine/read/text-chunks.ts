import { createReadStream } from 'node:fs';
import { ChunkDecoder } from './chunk-decoder';
import type { DetectedEncoding } from './detect-encoding';
import { NewlineNormalizer } from './newline-normalizer';

/**
 * Bytes per read: large enough that per-chunk overhead vanishes, and small enough that each
 * decoded chunk is an ordinary heap string. A string over ~128 KB goes to V8's large-object space,
 * a fresh mapping each time: reading the 59 MB bench corpus into rows took ~0.8 s with 1 MiB
 * chunks and ~0.3 s with 64 KiB (test/bench, one process, shared machine).
 */
export const CHUNK_BYTES = 64 * 1024;

/**
 * Bytes per read from the file: each read is a round trip through libuv's thread pool and the
 * stream's async iterator, ~900 of them for the 59 MB bench corpus at 64 KiB; a 1 MiB read is
 * decoded in CHUNK_BYTES pieces, so the strings stay as small as before.
 */
const READ_BYTES = 1024 * 1024;

/** LF-normalised text of bytes [bom, end) of a file, decoded chunk by chunk; `cut`: `end` is a size limit, not the file's end. */
export async function* fileTextChunks(
  file: string,
  encoding: DetectedEncoding,
  end: number,
  notes: string[],
  chunkBytes = CHUNK_BYTES,
  cut = false,
): AsyncGenerator<string> {
  const decoder = new ChunkDecoder(encoding.encoding, encoding.bomLength);
  const newlines = new NewlineNormalizer();
  if (end > encoding.bomLength) {
    const stream = createReadStream(file, { start: encoding.bomLength, end: end - 1, highWaterMark: Math.max(chunkBytes, READ_BYTES) });
    try {
      for await (const read of stream as AsyncIterable<Buffer>) {
        for (let at = 0; at < read.length; at += chunkBytes) {
          const text = newlines.push(decoder.decode(read.subarray(at, at + chunkBytes), false), false);
          if (text.length > 0) yield text;
        }
      }
    } finally {
      stream.destroy();
    }
  }
  const tail = newlines.push(decoder.decode(new Uint8Array(0), true, cut), true);
  if (tail.length > 0) yield tail;
  notes.push(...decoder.notes);
}

/** The same for text already in memory (an editor buffer); the BOM character is dropped. */
export function* memoryTextChunks(text: string, chunkChars = CHUNK_BYTES): Generator<string> {
  const start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const newlines = new NewlineNormalizer();
  for (let i = start; i < text.length; i += chunkChars) {
    const end = Math.min(text.length, i + chunkChars);
    const out = newlines.push(text.slice(i, end), end === text.length);
    if (out.length > 0) yield out;
  }
}
