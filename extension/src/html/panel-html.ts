// The Distance Review webview page: an empty shell that loads dist/webview.js and
// dist/webview.css; the Report arrives later by message. Strict CSP: nothing inline, scripts
// only with this render's nonce. chart.js sizes its canvases through CSSOM (element.style),
// which style-src does not govern, so no 'unsafe-inline' is needed.

import { escapeHtml } from './html-escape';

export interface PanelHtmlParams {
  /** webview.cspSource */
  cspSource: string;
  /** A fresh random value per render (base64 or hex). */
  nonce: string;
  scriptUri: string;
  styleUri: string;
}

export function panelHtml(p: PanelHtmlParams): string {
  if (!/^[A-Za-z0-9+/=_-]{16,}$/.test(p.nonce)) throw new RangeError('nonce must be at least 16 base64 or hex characters');
  const csp = [
    "default-src 'none'",
    `style-src ${p.cspSource}`,
    `script-src 'nonce-${p.nonce}'`,
    `img-src ${p.cspSource} data:`,
    `font-src ${p.cspSource}`,
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${escapeHtml(csp)}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="stylesheet" href="${escapeHtml(p.styleUri)}">
<title>Distance Review</title>
</head>
<body>
<div id="app"></div>
<script nonce="${escapeHtml(p.nonce)}" src="${escapeHtml(p.scriptUri)}"></script>
</body>
</html>
`;
}
