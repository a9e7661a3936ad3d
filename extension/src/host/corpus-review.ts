// One reviewed corpus: its worker, its latest Report, and what was added to the stop list
// since. Lives from the first review of a document until the document closes (the worker is
// then stopped; the Report stays for the panel until the next review).
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { Report } from '../protocol';
import type { ReviewStage } from '../engine/review/review-api';
import type { SettingsOverrides } from '../engine/config/settings-overrides';
import { ReviewWorkerClient } from '../worker/review-worker-client';
import { prepareReview } from './review-input';
import { stageProgress } from './pure/stage-progress';

export class CorpusReview implements vscode.Disposable {
  readonly client: ReviewWorkerClient;
  report: Report | null = null;
  /** Where the stop list was expected when the review ran (the Report's value wins if absolute). */
  private expectedStopList: string | null = null;
  private configDir: string | null = null;
  /** Terms added to the stop list since the Report was made: no longer offered or underlined. */
  readonly addedSinceReview = new Set<string>();
  private running: AbortController | null = null;
  /** Set when the corpus's document closed; a new review clears it. */
  closed = false;
  /** What changed since the Report was made (stop list, loudword.json, corpus); null = up to date. */
  staleReason: string | null = null;
  /** The document version the running review reads (−1: the file on disk), to ignore a double click. */
  runningVersion: number | null = null;
  /** Set when the user pressed Cancel on the progress notification of the last run. */
  cancelledByUser = false;
  /** The overrides of the latest run (a column the user picked when the configured one was missing). */
  lastOverrides: SettingsOverrides = {};

  constructor(readonly uri: vscode.Uri, workerFile: string) {
    this.client = new ReviewWorkerClient(workerFile);
  }

  get isRunning(): boolean {
    return this.running !== null;
  }

  /** The stop list file edits go to, or null when the project has none configured. */
  get stopListPath(): string | null {
    const fromReport = this.report?.stopList.file ?? null;
    if (fromReport !== null) return path.isAbsolute(fromReport) ? fromReport : path.resolve(this.configDir ?? path.dirname(this.uri.fsPath), fromReport);
    return this.expectedStopList;
  }

  /** Suggestions still open (not added since the review). */
  openSuggestions(): string[] {
    return (this.report?.suggestions ?? []).filter((t) => !this.addedSinceReview.has(t));
  }

  /**
   * Runs a review with a cancellable progress notification. A review already running for this
   * corpus is cancelled first (its worker is stopped). Rejects with a UserError, an AbortError
   * when cancelled, or a WorkerFailure (a bug).
   */
  async run(doc: vscode.TextDocument | undefined, onStage: (stage: ReviewStage | null) => void, extraOverrides: SettingsOverrides = {}): Promise<Report> {
    this.lastOverrides = extraOverrides;
    this.cancel();
    this.closed = false;
    this.cancelledByUser = false;
    const controller = new AbortController();
    this.running = controller;
    this.runningVersion = doc?.version ?? -1;
    try {
      const prepared = await prepareReview(this.uri, doc);
      // A column picked after a missing-field error wins over the settings for this review.
      prepared.input.overrides = { ...prepared.input.overrides, ...extraOverrides };
      this.expectedStopList = prepared.stopListPath;
      this.configDir = prepared.configPath === null ? prepared.workspaceRoot : path.dirname(prepared.configPath);
      const report = await vscode.window.withProgress(
        { location: vscode.ProgressLocation.Notification, title: `Loudword: reviewing ${path.basename(this.uri.path)}`, cancellable: true },
        (progress, token) => {
          const sub = token.onCancellationRequested(() => {
            this.cancelledByUser = true;
            controller.abort();
          });
          let done = 0;
          return this.client
            .review(prepared.input, (stage, fraction) => {
              const percent = stageProgress(stage, fraction);
              progress.report({ message: stage, increment: Math.max(0, percent - done) });
              done = Math.max(done, percent);
              onStage(stage);
            }, controller.signal)
            .finally(() => sub.dispose());
        },
      );
      this.report = report;
      this.addedSinceReview.clear();
      this.staleReason = null;
      return report;
    } finally {
      if (this.running === controller) {
        this.running = null;
        this.runningVersion = null;
      }
      onStage(null);
    }
  }

  cancel(): void {
    this.running?.abort();
    this.running = null;
    this.runningVersion = null;
  }

  /** Marks the Report as out of date (the first reason is kept until the next review). */
  markStale(reason: string): void {
    if (this.report !== null && this.staleReason === null) this.staleReason = reason;
  }

  /** Stops the worker (document closed); the Report stays readable. */
  stopWorker(): void {
    this.closed = true;
    this.cancel();
    void this.client.terminate('The corpus was closed; run "Review distances" again for what-ifs.', 'user');
  }

  dispose(): void {
    this.stopWorker();
  }
}
