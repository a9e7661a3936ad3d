// The page's link to the extension host. Inside VS Code it wraps acquireVsCodeApi(); in the
// standalone HTML report there is no host, so posting does nothing and nothing is persisted.

import { isWhatIfHopsOrAbsent, type HostToWebview, type WebviewToHost } from '../../extension/src/protocol';

interface VsCodeApi {
  postMessage(message: unknown): void;
  getState(): unknown;
  setState(state: unknown): void;
}

declare global {
  // Injected by VS Code into webviews; absent in a plain browser.
  // eslint-disable-next-line no-var
  var acquireVsCodeApi: (() => VsCodeApi) | undefined;
}

export interface HostBridge {
  readonly mode: 'panel' | 'standalone';
  post(message: WebviewToHost): void;
  loadState(): unknown;
  saveState(state: unknown): void;
}

export function createHostBridge(): HostBridge {
  const acquire = typeof globalThis.acquireVsCodeApi === 'function' ? globalThis.acquireVsCodeApi : null;
  if (!acquire) {
    return { mode: 'standalone', post: () => undefined, loadState: () => undefined, saveState: () => undefined };
  }
  // acquireVsCodeApi may be called only once per page.
  const api = acquire();
  return {
    mode: 'panel',
    post: (message) => api.postMessage(message),
    loadState: () => api.getState(),
    saveState: (state) => api.setState(state),
  };
}

const hostTypes: ReadonlySet<string> = new Set(['showReport', 'whatIfResult', 'prefetchResult', 'busy', 'error', 'stale']);

/** Shape check for messages arriving on window 'message' events. */
export function isHostToWebview(value: unknown): value is HostToWebview {
  if (typeof value !== 'object' || value === null) return false;
  const m = value as Record<string, unknown>;
  if (typeof m.type !== 'string' || !hostTypes.has(m.type)) return false;
  switch (m.type) {
    case 'showReport':
      return isReportLike(m.report);
    case 'whatIfResult':
    case 'prefetchResult':
      return typeof m.requestId === 'number' && Array.isArray(m.removed) && typeof m.measures === 'object' && m.measures !== null && (m.engineMs === undefined || typeof m.engineMs === 'number') && (m.hostMs === undefined || typeof m.hostMs === 'number') && isWhatIfHopsOrAbsent(m.hops);
    case 'busy':
      return m.stage === null || typeof m.stage === 'string';
    case 'error':
      return typeof m.message === 'string';
    case 'stale':
      return (m.reason === null || typeof m.reason === 'string') && Array.isArray(m.added) && m.added.every((t) => typeof t === 'string');
    default:
      return false;
  }
}

/** Enough structure for the panel to render without throwing. */
export function isReportLike(value: unknown): boolean {
  if (typeof value !== 'object' || value === null) return false;
  const r = value as Record<string, unknown>;
  return (
    Array.isArray(r.terms) &&
    Array.isArray(r.hubs) &&
    Array.isArray(r.suggestions) &&
    typeof r.baseline === 'object' &&
    r.baseline !== null &&
    typeof r.suggested === 'object' &&
    r.suggested !== null &&
    typeof r.input === 'object' &&
    r.input !== null
  );
}
