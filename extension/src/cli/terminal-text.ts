// Text from the corpus (headers, file names, documents, hub previews, terms, error messages)
// reaches the terminal and Markdown files. Escape sequences in it could set the terminal's title
// and colours, rewrite the line (\r), or reorder what is shown (bidirectional overrides, "Trojan
// Source", CVE-2021-42574). Loudword's own output uses no control characters but the line break
// and the tab, so everything else is shown escaped: ESC as \x1b, CR as \r, U+202E as \u{202e}.
// Source: ECMA-48 (C0 and C1 control sets), Unicode UAX #9 (the bidi controls).

const CONTROLS = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g;

/** `text` with every control character but \n and \t written as a visible escape. */
export function escapeControls(text: string): string {
  return text.replace(CONTROLS, (c) => {
    const code = c.charCodeAt(0);
    if (code === 0x0d) return '\\r';
    if (code < 0x100) return `\\x${code.toString(16).padStart(2, '0')}`;
    return `\\u{${code.toString(16)}}`;
  });
}

const JSON_UNESCAPED_CONTROLS = /[\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g;

/**
 * JSON text with the controls JSON.stringify leaves raw (DEL, C1, bidi) written as \u escapes:
 * the same JSON value (RFC 8259 §7), but safe to print on a terminal.
 */
export function escapeJsonControls(json: string): string {
  return json.replace(JSON_UNESCAPED_CONTROLS, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}
