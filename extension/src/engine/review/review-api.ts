import type { Measures, Report, SettingsProvenance } from '../../protocol';
import type { SettingsLayer } from '../config/load-settings';
import type { SettingsOverrides } from '../config/settings-overrides';

export interface ReviewInput {
  /** Path of the corpus file (used for reading unless `text` is given, and for messages). */
  file: string;
  /** The corpus's text when it comes from an editor buffer rather than the disk. */
  text?: string;
  /** loudword.json to read; null = none (defaults). */
  configPath?: string | null;
  /**
   * Stop-list text to use instead of reading the stop list file (the editor passes its
   * unsaved buffer here).
   */
  stopListText?: string;
  /** Settings that win over loudword.json (command-line flags unless overridesFrom says otherwise). */
  overrides?: SettingsOverrides;
  /**
   * The workspace folder in the editor: paths loudword.json names must stay inside it. Without
   * it (the CLI) they must stay inside the config's own folder.
   */
  projectRoot?: string | null;
  /** Who gives `overrides` and what their keys are called ("sample.k" → "--k"), for messages and the Report. */
  overridesFrom?: Omit<SettingsLayer, 'values'>;
  /** Editor settings standing in for loudword.json keys: loudword.json wins over them. */
  editorSettings?: SettingsLayer;
  /** How configPath was chosen, for Report.provenance (default: given, or none when null). */
  configHow?: SettingsProvenance['config']['how'];
}

/** Named stages, in order, for progress reporting ('reviewing terms' includes the what-if checks of the suggestions; 'writing report' assembles the Report). */
export type ReviewStage = 'reading' | 'tokenizing' | 'weighting' | 'measuring' | 'reviewing terms' | 'writing report';

export interface ReviewHooks {
  onStage?(stage: ReviewStage, fraction: number): void;
  /** Aborting stops the review between batches; startReview then rejects with an AbortError. */
  signal?: AbortSignal;
  /**
   * The caller reads the Report and asks the session no what-if (the CLI): what only makes
   * later what-ifs faster is skipped. A what-if asked anyway gets the same answers.
   */
  reportOnly?: boolean;
}

/**
 * A finished review that keeps its matrix in memory so the panel's toggles can ask
 * "what if these terms were stopped too?" without re-reading or re-tokenising.
 */
export interface ReviewSession {
  readonly report: Report;
  /**
   * Measures with the baseline stop list plus `removed`; O(nnz) plus the sampled measures, the
   * two halves on two threads once prepareWhatIf has started the sample's thread.
   */
  whatIf(removed: readonly string[]): Promise<Measures>;
  /**
   * whatIf(removed)'s answer computed without moving the session's what-if state (the panel's
   * prefetch on a hover); a whatIf(removed) that comes next, with no other call between, adopts
   * it and answers at once with the same bits. Null when this session cannot speculate now (no
   * what-if thread yet, or it failed), and when `clicks` (a count of clicks sent, in shared
   * memory: the caller adds 1 before it sends each) moves while it computes — it then stops
   * part way, so a click never waits for a whole prefetch.
   */
  speculate?(removed: readonly string[], clicks?: Int32Array): Promise<Measures | null>;
  /**
   * Builds what the first toggle would otherwise pay for (the column postings), starts the
   * sample's what-if thread at the panel's opening state and, unless `warmUp` is false, runs a
   * few toggles there and back so the reader's first click runs optimised code (optional; idle
   * time). Resolves when all of it is done; the answers that follow are the same either way.
   */
  prepareWhatIf?(options?: { warmUp?: boolean }): Promise<void>;
  /** Ends the what-if thread, if one was started. */
  close?(): Promise<void>;
}
