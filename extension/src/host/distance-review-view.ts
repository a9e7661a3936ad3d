// The Distance Review panel: a webview view whose page is a pure function of the Report. The
// page is untrusted: every message is checked with isWebviewToHost before the host acts.
import { randomBytes } from 'node:crypto';
import * as vscode from 'vscode';
import { isWebviewToHost, type HostToWebview, type Report, type WebviewToHost } from '../protocol';
import { panelHtml } from '../html/panel-html';
import type { CorpusReview } from './corpus-review';
import { DISTANCE_REVIEW_VIEW_ID } from './pure/contribution-ids';
import type { ReviewStore } from './review-store';

/** What the page may ask the host to do, for the review it shows. */
export interface PanelActions {
  revealLine(review: CorpusReview, line: number): Promise<void>;
  addTerms(review: CorpusReview, terms: string[]): Promise<void>;
  exportHtml(review: CorpusReview, report: Report): Promise<void>;
  reviewAgain(review: CorpusReview): Promise<void>;
}

export class DistanceReviewViewProvider implements vscode.WebviewViewProvider, vscode.Disposable {
  /** Equal to the view id in package.json (contributes.views). */
  static readonly viewType = DISTANCE_REVIEW_VIEW_ID;

  private view: vscode.WebviewView | null = null;
  private ready = false;
  /** The review whose Report the page holds, so a late what-if answer is not mixed up. */
  private shown: CorpusReview | null = null;
  private shownReport: Report | null = null;
  private readonly disposables: vscode.Disposable[] = [];
  private readonly viewDisposables: vscode.Disposable[] = [];

  constructor(
    private readonly extensionUri: vscode.Uri,
    private readonly store: ReviewStore,
    private readonly actions: PanelActions,
  ) {
    this.disposables.push(store.onDidChange(() => this.showFocused()));
  }

  resolveWebviewView(view: vscode.WebviewView): void {
    this.disposeView();
    this.view = view;
    this.ready = false;
    const dist = vscode.Uri.joinPath(this.extensionUri, 'dist');
    view.webview.options = { enableScripts: true, localResourceRoots: [dist] };
    view.webview.html = this.html(view.webview, dist);
    this.viewDisposables.push(
      view.webview.onDidReceiveMessage((m: unknown) => void this.receive(m)),
      view.onDidDispose(() => {
        this.view = null;
        this.ready = false;
        this.shown = null;
        this.shownReport = null;
        this.disposeView();
      }),
    );
  }

  /** Reveals the panel (e.g. after a review the user asked for). */
  async reveal(): Promise<void> {
    await vscode.commands.executeCommand(`${DistanceReviewViewProvider.viewType}.focus`);
  }

  busy(stage: string | null): void {
    this.post({ type: 'busy', stage });
  }

  private html(webview: vscode.Webview, dist: vscode.Uri): string {
    // A fresh nonce per render: a script injected through corpus text can never guess it.
    return panelHtml({
      cspSource: webview.cspSource,
      nonce: randomBytes(18).toString('base64'),
      scriptUri: webview.asWebviewUri(vscode.Uri.joinPath(dist, 'webview.js')).toString(),
      styleUri: webview.asWebviewUri(vscode.Uri.joinPath(dist, 'webview.css')).toString(),
    });
  }

  private showFocused(): void {
    const review = this.store.focused;
    if (review === null || review.report === null) return;
    // A store change that leaves the Report as it was (a stop-list edit, say) must not redraw the
    // page and lose the reader's toggles: only the out-of-date state is sent then.
    if (this.shown !== review || this.shownReport !== review.report) {
      // Recorded only when the page got it: a Report sent before the page is ready is dropped,
      // and must go out again when it says 'ready'.
      if (!this.post({ type: 'showReport', report: review.report })) return;
      this.shown = review;
      this.shownReport = review.report;
    }
    this.post({ type: 'stale', reason: review.staleReason, added: [...review.addedSinceReview] });
  }

  /** The Report the page shows (Export writes this one, whatever was reviewed since). */
  get shownReportOf(): { review: CorpusReview; report: Report } | null {
    return this.shown === null || this.shownReport === null ? null : { review: this.shown, report: this.shownReport };
  }

  /** Sends `message` to the page; false when there is no ready page to take it. */
  private post(message: HostToWebview): boolean {
    if (this.view === null || !this.ready) return false;
    void this.view.webview.postMessage(message);
    return true;
  }

  private async receive(message: unknown): Promise<void> {
    if (!isWebviewToHost(message)) return;
    const m: WebviewToHost = message;
    if (m.type === 'ready') {
      this.ready = true;
      // A (re)loaded page holds nothing yet, whatever was sent to an earlier one.
      this.shown = null;
      this.shownReport = null;
      this.showFocused();
      return;
    }
    const review = this.shown;
    if (review === null || review.report === null) {
      this.post({ type: 'error', message: 'No review is loaded; run "Review distances" on a corpus first.' });
      return;
    }
    try {
      switch (m.type) {
        case 'whatIf': {
          const hostReceived = Date.now();
          const arrived = performance.now();
          const { measures, engineMs, hops } = await review.client.timedWhatIf(m.removed);
          const hostMs = performance.now() - arrived;
          const all = { ...(m.panelPosted !== undefined ? { panelPosted: m.panelPosted } : {}), hostReceived, ...hops, hostPosted: Date.now() };
          if (this.shown === review) this.post({ type: 'whatIfResult', removed: m.removed, measures, requestId: m.requestId, engineMs, hostMs, hops: all });
          return;
        }
        case 'whatIfPrefetch': {
          const arrived = performance.now();
          // A prefetch that fails or is dropped says nothing: the click that may follow asks again.
          const answer = await review.client.speculativeWhatIf(m.removed).catch(() => null);
          const hostMs = performance.now() - arrived;
          if (answer !== null && this.shown === review) this.post({ type: 'prefetchResult', removed: m.removed, measures: answer.measures, requestId: m.requestId, engineMs: answer.engineMs, hostMs });
          return;
        }
        case 'revealLine':
          await this.actions.revealLine(review, m.line);
          return;
        case 'addTerms':
          await this.actions.addTerms(review, m.terms);
          return;
        case 'exportHtml':
          await this.actions.exportHtml(review, this.shownReport ?? review.report);
          return;
        case 'reviewAgain':
          await this.actions.reviewAgain(review);
          return;
      }
    } catch (e) {
      this.post({ type: 'error', message: e instanceof Error ? e.message : String(e) });
    }
  }

  private disposeView(): void {
    for (const d of this.viewDisposables.splice(0)) d.dispose();
  }

  dispose(): void {
    this.disposeView();
    for (const d of this.disposables.splice(0)) d.dispose();
  }
}
