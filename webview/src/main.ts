// Entry of the webview bundle (dist/webview.js). Inside VS Code the host sends the Report with
// 'showReport' after the page says 'ready'; in a standalone HTML report the Report is embedded
// in a <script type="application/json" id="loudword-report"> element and there is no host.

import type { Report } from '../../extension/src/protocol';
import { createHostBridge, isHostToWebview, isReportLike } from './host-bridge';
import { PanelApp } from './panel-app';

const EMBEDDED_REPORT_ID = 'loudword-report';

function start(): void {
  const root = document.getElementById('app') ?? document.body.appendChild(document.createElement('div'));
  const bridge = createHostBridge();
  const app = new PanelApp(root, bridge);

  if (bridge.mode === 'standalone') {
    const report = readEmbeddedReport();
    if (report) app.showReport(report);
    else app.showError('This page holds no readable Loudword report.');
    return;
  }

  window.addEventListener('message', (event: MessageEvent<unknown>) => {
    const message = event.data;
    if (!isHostToWebview(message)) return;
    switch (message.type) {
      case 'showReport':
        app.setBusy(null);
        app.showReport(message.report);
        break;
      case 'whatIfResult':
        app.onWhatIfResult(message);
        break;
      case 'prefetchResult':
        app.onPrefetchResult(message);
        break;
      case 'busy':
        app.setBusy(message.stage);
        break;
      case 'error':
        app.setBusy(null);
        app.showError(message.message);
        break;
      case 'stale':
        app.setStale(message.reason, message.added);
        break;
    }
  });
  bridge.post({ type: 'ready' });
}

function readEmbeddedReport(): Report | null {
  const text = document.getElementById(EMBEDDED_REPORT_ID)?.textContent;
  if (!text) return null;
  try {
    const value: unknown = JSON.parse(text);
    return isReportLike(value) ? (value as Report) : null;
  } catch {
    return null;
  }
}

if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', start);
else start();
