import type { CorpusFormatName } from '../../protocol';

/** One document as read from the source, before tokenising. */
export interface CorpusRow {
  text: string;
  /** The label column's value, or null where there is no label column (or the cell is empty). */
  label: string | null;
  /** 1-based line in the source file where the document starts. */
  line: number;
}

export interface SkippedRow {
  line: number;
  reason: string;
}

export interface ReadOptions {
  format?: CorpusFormatName | 'auto';
  /** The text column (CSV/TSV header name) or key (JSON Lines). Detected when absent. */
  textField?: string | null;
  labelField?: string | null;
  /** Stop reading after this many bytes and say so in `truncated`. */
  maxBytes?: number;
  /**
   * Bytes (characters for in-memory text) per read; default 64 KiB (text-chunks.ts). Tests set it small so records,
   * quotes, CRLF pairs and multi-byte characters fall across chunk boundaries.
   */
  chunkBytes?: number;
}

/**
 * An opened corpus. Opening reads only enough to detect the format and fields; `batches()`
 * streams the documents, so a large file is never held as one string.
 */
export interface CorpusSource {
  readonly file: string;
  readonly format: CorpusFormatName;
  readonly textField: string | null;
  readonly labelField: string | null;
  /** Column names (CSV/TSV) or keys seen (JSON Lines); empty for plain text. */
  readonly fields: readonly string[];
  /** Streams the rows in batches of about `batchSize`. Each call starts a fresh pass. */
  batches(batchSize?: number): AsyncIterable<CorpusRow[]>;
  /** Filled while streaming: how many rows were skipped, and the first few with reasons. */
  readonly skipped: { count: number; examples: SkippedRow[] };
  /** Set after streaming when maxBytes cut the input. */
  readonly truncated: { bytesRead: number; limitBytes: number } | null;
  /** The CSV/TSV field delimiter in use; absent for JSON Lines and plain text. */
  readonly delimiter?: string;
  /** Things the user should know about how the file was read (encoding fallback, ignored options). */
  readonly notes?: readonly string[];
}
