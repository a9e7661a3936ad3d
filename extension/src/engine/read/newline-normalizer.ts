/**
 * Rewrites CRLF and lone CR as LF across chunk boundaries. Counting LF afterwards gives the same
 * 1-based line numbers an editor shows (VS Code breaks lines at CRLF, CR and LF), and mixed line
 * endings in one file stop mattering to the parsers. Text inside quoted fields changes from CRLF
 * to LF, which no tokenizer cares about.
 */
export class NewlineNormalizer {
  private pendingCR = false;

  push(chunk: string, final: boolean): string {
    let s = this.pendingCR ? '\r' + chunk : chunk;
    this.pendingCR = false;
    if (s.indexOf('\r') < 0) return s;
    if (!final && s.charCodeAt(s.length - 1) === 13) {
      // Wait: the next chunk may start with the LF of this CRLF.
      s = s.slice(0, -1);
      this.pendingCR = true;
    }
    return s.replace(/\r\n?/g, '\n');
  }
}
