// The reviews this window holds, keyed by corpus URI, and which one the panel and status bar
// follow. Fires onDidChange whenever a Report or the "added since" set changes.
import * as vscode from 'vscode';
import { CorpusReview } from './corpus-review';
import { samePath } from './pure/same-path';

export class ReviewStore implements vscode.Disposable {
  private readonly reviews = new Map<string, CorpusReview>();
  private focusedKey: string | null = null;
  private readonly changed = new vscode.EventEmitter<CorpusReview>();
  readonly onDidChange = this.changed.event;

  constructor(private readonly workerFile: string) {}

  get(uri: vscode.Uri): CorpusReview | undefined {
    return this.reviews.get(uri.toString());
  }

  getOrCreate(uri: vscode.Uri): CorpusReview {
    const key = uri.toString();
    let review = this.reviews.get(key);
    if (review === undefined) {
      review = new CorpusReview(uri, this.workerFile);
      this.reviews.set(key, review);
    }
    return review;
  }

  all(): CorpusReview[] {
    return [...this.reviews.values()];
  }

  /** Reviews whose stop list is the file at `uri`. */
  usingStopList(uri: vscode.Uri): CorpusReview[] {
    if (uri.scheme !== 'file') return [];
    return this.all().filter((r) => r.report !== null && r.stopListPath !== null && samePath(r.stopListPath, uri.fsPath));
  }

  /** The review the panel shows: the last one focused (reviewed, or its corpus made active). */
  get focused(): CorpusReview | null {
    return this.focusedKey === null ? null : this.reviews.get(this.focusedKey) ?? null;
  }

  focus(review: CorpusReview): void {
    const key = review.uri.toString();
    if (this.focusedKey === key) return;
    this.focusedKey = key;
    this.changed.fire(review);
  }

  notify(review: CorpusReview): void {
    this.changed.fire(review);
  }

  dispose(): void {
    for (const r of this.reviews.values()) r.dispose();
    this.reviews.clear();
    this.changed.dispose();
  }
}
