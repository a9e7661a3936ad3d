// The standalone HTML report: one self-contained file with the panel's CSS and JS inlined and
// the Report embedded as JSON. It works offline in any browser; the what-if toggles are
// disabled there because no engine is running. The CSP allows exactly the inlined script and
// stylesheet by their sha256 hashes, so nothing else on the page can run.

import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Report } from '../protocol';
import { UserError } from '../engine/user-error';
import { escapeHtml } from './html-escape';
import { jsonForScriptElement } from './script-json';

export interface WebviewAssets {
  js: string;
  css: string;
}

/** Reads dist/webview.js and dist/webview.css (built by scripts/build.mjs). */
export function loadWebviewAssets(distDir: string): WebviewAssets {
  const read = (name: string): string => {
    const file = join(distDir, name);
    try {
      return readFileSync(file, 'utf8');
    } catch {
      throw new UserError(`cannot read ${name}; build the project first (npm run build)`, file);
    }
  };
  return { js: read('webview.js'), css: read('webview.css') };
}

export function renderStandaloneReport(report: Report, assets: WebviewAssets): string {
  // Text that would end the element early (or start an HTML comment inside a script) is
  // rewritten with a backslash, which means the same thing to the JS and CSS parsers.
  const js = assets.js.replace(/<\/(script)/gi, '<\\/$1').replace(/<!--/g, '<\\!--');
  const css = assets.css.replace(/<\/(style)/gi, '<\\/$1');
  const csp = [
    "default-src 'none'",
    `style-src '${sha256(css)}'`,
    `script-src '${sha256(js)}'`,
    'img-src data:',
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
  const name = report.input.file.split(/[\\/]/).pop() || report.input.file;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${escapeHtml(csp)}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="${escapeHtml(`${report.tool.name} ${report.tool.version}`)}">
<title>${escapeHtml(`Distance Review: ${name}`)}</title>
<style>${css}</style>
</head>
<body>
<div id="app"></div>
<script type="application/json" id="loudword-report">${jsonForScriptElement(report)}</script>
<script>${js}</script>
</body>
</html>
`;
}

function sha256(text: string): string {
  return `sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}`;
}
