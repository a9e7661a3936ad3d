/**
 * The tokens of a stand-in wink document: the text split on runs of spaces, each chunk turned
 * into tokens by `chunkTokens`, and the spaces before a chunk given to its first token (wink's
 * its.precedingSpaces). `afterChunk` sees each chunk's tokens before the next chunk is split, as
 * wink adds a chunk's words to its lexicon before reading on. Shared by the chunk-cache tests.
 */
export function standInTokens<T>(text: string, chunkTokens: (chunk: string) => T[], afterChunk?: (tokens: T[]) => void): { tokens: T[]; spaces: string[] } {
  const tokens: T[] = [];
  const spaces: string[] = [];
  let pending = '';
  for (const piece of text.split(/( +)/)) {
    if (piece === '') continue;
    if (piece.startsWith(' ')) {
      pending = piece;
      continue;
    }
    const chunk = chunkTokens(piece);
    chunk.forEach((t, i) => {
      tokens.push(t);
      spaces.push(i === 0 ? pending : '');
    });
    afterChunk?.(chunk);
    pending = '';
  }
  return { tokens, spaces };
}
