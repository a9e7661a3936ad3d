/**
 * Whether two absolute file-system paths name the same file as the editor sees them: exact on
 * Linux, case-insensitive on Windows and macOS, whose default file systems ignore case.
 */
export function samePath(a: string, b: string, platform: NodeJS.Platform = process.platform): boolean {
  return platform === 'win32' || platform === 'darwin' ? a.toLowerCase() === b.toLowerCase() : a === b;
}
