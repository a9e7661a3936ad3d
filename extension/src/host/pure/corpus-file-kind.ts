// Which editor documents can be reviewed as a corpus. Mirrors the editor-title button's `when`
// clause in package.json (resourceExtname / resourceLangId), so command and button agree.

const CORPUS_EXTENSIONS: ReadonlySet<string> = new Set(['.csv', '.tsv', '.tab', '.jsonl', '.ndjson', '.txt', '.text']);

export function isCorpusFile(fileName: string, languageId: string): boolean {
  const dot = fileName.lastIndexOf('.');
  const slash = Math.max(fileName.lastIndexOf('/'), fileName.lastIndexOf('\\'));
  const ext = dot > slash ? fileName.slice(dot).toLowerCase() : '';
  return CORPUS_EXTENSIONS.has(ext) || languageId === 'plaintext' || languageId === 'csv' || languageId === 'tsv' || languageId === 'jsonl';
}
