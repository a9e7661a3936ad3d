// The page builders for the panel and the standalone report, checked as text (no browser):
// the CSP is strict, the embedded JSON cannot close its element, assets load from dist.
import assert from 'node:assert/strict';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { panelHtml } from '../extension/src/html/panel-html';
import { jsonForScriptElement } from '../extension/src/html/script-json';
import { loadWebviewAssets, renderStandaloneReport } from '../extension/src/html/standalone-report';
import { UserError } from '../extension/src/engine/user-error';
import type { Report } from '../extension/src/protocol';

const fixture = (name: string): Report => JSON.parse(readFileSync(join(__dirname, 'fixtures', name), 'utf8')) as Report;

function cspOf(html: string): string {
  const m = /<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(html);
  assert.ok(m, 'page has a CSP meta element');
  return m[1]!.replace(/&#39;/g, "'");
}

describe('panelHtml', () => {
  const params = { cspSource: 'https://file+.vscode-resource.vscode-cdn.net', nonce: 'q3V0bm9uY2VfdGVzdA0123', scriptUri: 'https://x.test/dist/webview.js', styleUri: 'https://x.test/dist/webview.css' };

  it('panelHtml sets a CSP with no inline allowance and scripts only by nonce', () => {
    const csp = cspOf(panelHtml(params));
    // Source: the VS Code webview guide's recommended policy (default-src 'none', cspSource, nonce) — (from memory).
    assert.match(csp, /default-src 'none'/);
    assert.match(csp, new RegExp(`script-src 'nonce-${params.nonce}'(;|$)`));
    assert.match(csp, /style-src https:\/\/file\+\.vscode-resource\.vscode-cdn\.net(;|$)/);
    assert.doesNotMatch(csp, /unsafe-inline|unsafe-eval/);
  });

  it('panelHtml puts the nonce on the one script element and loads the stylesheet from the style URI', () => {
    const html = panelHtml(params);
    const scripts = html.match(/<script\b[^>]*>/g) ?? [];
    assert.deepEqual(scripts, [`<script nonce="${params.nonce}" src="${params.scriptUri}">`]);
    assert.ok(html.includes(`<link rel="stylesheet" href="${params.styleUri}">`));
    assert.doesNotMatch(html, /style="/);
  });

  it('panelHtml escapes URIs that contain quotes and refuses a short nonce', () => {
    const html = panelHtml({ ...params, scriptUri: 'https://x.test/a"onload="b.js' });
    assert.ok(html.includes('src="https://x.test/a&quot;onload=&quot;b.js"'));
    assert.throws(() => panelHtml({ ...params, nonce: 'abc' }), RangeError);
  });
});

describe('jsonForScriptElement', () => {
  it('jsonForScriptElement leaves no <, >, & or line separators and parses back to the same value', () => {
    // Source: HTML Living Standard, "Restrictions for contents of script elements" (</script and <!-- end or
    // change the element) — common practice to escape < > & as \u003c \u003e \u0026 in embedded JSON.
    const value = { a: '</script><script>x()</script>', b: '<!-- -->', c: 'a & b > c', d: 'l\u2028m\u2029n' };
    const text = jsonForScriptElement(value);
    assert.doesNotMatch(text, /[<>&\u2028\u2029]/);
    assert.ok(text.includes('\\u003c/script\\u003e'));
    assert.deepEqual(JSON.parse(text), value);
  });
});

describe('renderStandaloneReport', () => {
  const assets = { js: 'console.log("</script><!--");', css: 'body{color:red}/* </style> */' };

  it('renderStandaloneReport allows exactly the inlined script and style by their sha256 hashes', () => {
    const html = renderStandaloneReport(fixture('report-small.json'), assets);
    const csp = cspOf(html);
    const script = /<script>([\s\S]*?)<\/script>/.exec(html)![1]!;
    const style = /<style>([\s\S]*?)<\/style>/.exec(html)![1]!;
    // Source: CSP Level 3, hash-source: base64 of the SHA-256 digest of the element's text, UTF-8.
    const hash = (t: string) => createHash('sha256').update(t, 'utf8').digest('base64');
    assert.match(csp, new RegExp(`script-src 'sha256-${hash(script).replace(/[+/]/g, '\\$&')}'`));
    assert.match(csp, new RegExp(`style-src 'sha256-${hash(style).replace(/[+/]/g, '\\$&')}'`));
    assert.match(csp, /default-src 'none'/);
    assert.doesNotMatch(csp, /unsafe-inline|unsafe-eval|https?:/);
  });

  it('renderStandaloneReport keeps script and style text from ending their elements early', () => {
    const html = renderStandaloneReport(fixture('report-small.json'), assets);
    assert.equal((html.match(/<\/script>/g) ?? []).length, 2, 'one closing tag for the JSON, one for the code');
    assert.equal((html.match(/<\/style>/g) ?? []).length, 1);
    assert.ok(html.includes('console.log("<\\/script><\\!--");'));
  });

  it('renderStandaloneReport embeds hostile corpus strings only inside escaped JSON', () => {
    const bad = fixture('report-payloads.json');
    const html = renderStandaloneReport(bad, assets);
    assert.doesNotMatch(html, /<img|<svg|<\/script><script>|<style>body\{display/i);
    const json = /<script type="application\/json" id="loudword-report">([\s\S]*?)<\/script>/.exec(html)![1]!;
    assert.deepEqual(JSON.parse(json), bad);
    assert.ok(/<title>Distance Review: [^<]*&lt;img src=x onerror=&quot;/.test(html), 'file name escaped in the title');
  });
});

describe('loadWebviewAssets', () => {
  it('loadWebviewAssets reads webview.js and webview.css from the folder given', () => {
    const dir = mkdtempSync(join(tmpdir(), 'lw-assets-'));
    try {
      writeFileSync(join(dir, 'webview.js'), 'js!');
      writeFileSync(join(dir, 'webview.css'), 'css!');
      assert.deepEqual(loadWebviewAssets(dir), { js: 'js!', css: 'css!' });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('loadWebviewAssets throws a UserError naming the missing file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'lw-assets-'));
    try {
      assert.throws(() => loadWebviewAssets(dir), (e: unknown) => e instanceof UserError && e.file === join(dir, 'webview.js'));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
