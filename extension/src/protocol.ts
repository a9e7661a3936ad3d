// The Report (README.md "The Report") and every message between the extension host and
// the Distance Review webview. Imported by both sides: keep it free of Node and DOM types.
// Each message type carries a literal `type`; the comment says which way it travels.

/** Distance-health measures of one setting (baseline or with suggestions). */
export interface Measures {
  /** The seeded document sample the quadratic measures were computed on. */
  sample: { documents: number; k: number; seed: number };
  /** Mean pairwise cosine over all pairs, exact (docs/methods.md §3). */
  backgroundSimilarity: number;
  /** Median z-score of the nearest neighbour's similarity against the query's similarities. */
  neighborStandout: number | null;
  /** Relative contrast (Dmax − Dmin)/Dmin per query, Beyer et al. 1999 (docs/methods.md §4). */
  contrast: { median: number; p10: number; p90: number } | null;
  /** E[D_mean]/E[D_min] over the sample queries, He, Kumar & Chang 2012 (docs/methods.md §4). */
  meanToNearest: number | null;
  /** 1/(2·CV²) of the sampled pair distances (docs/methods.md §4). */
  iidEquivalentDimension: number | null;
  /** k-occurrence statistics, Radovanović et al. 2010 (docs/methods.md §5). */
  hubness: { skewness: number; hubs: number; orphans: number } | null;
  /** TwoNN (Facco et al. 2017) and MLE (Levina & Bickel 2005) on the sample (docs/methods.md §6). */
  intrinsicDimension: { twoNN: number | null; mle: number | null };
  /** Relative growth of the radius past the k-th neighbour before hits grow 10×. */
  radiusSlack: { median: number } | null;
  /** Share of the all-pairs similarity mass carried by the 10 / 100 heaviest terms. */
  topTermsMassShare: { top10: number; top100: number };
  /** Leave-one-out k-NN precision@k against the label column; null without labels. */
  labelPrecisionAtK: number | null;
  /** 1 − mean Jaccard overlap of k-NN sets against the baseline; null for the baseline itself. */
  neighborTurnover: number | null;
  /** Chart data for the panel; a pure function of the same sample. */
  distributions: Distributions;
}

/** Histograms for the panel's charts. Bin edges are implied by `binWidth` from `start`. */
export interface Distributions {
  /** Cosine similarity of sampled document pairs and of each query's nearest neighbour. */
  similarity: { start: number; binWidth: number; pairs: number[]; nearest: number[] };
  /** Histogram of k-occurrence N_k: counts[i] documents have N_k = i (last bin: ≥). */
  kOccurrence: number[];
  /** Cumulative share of all-pairs similarity mass of the top 1..m terms. */
  cumulativeMass: number[];
}

export type TermStatus = 'suggested' | 'stopped' | 'protected' | 'kept';

export interface TermRow {
  term: string;
  df: number;
  idf: number;
  /** Share of the all-pairs similarity mass (docs/methods.md §3). */
  pullShare: number;
  /** Share of the similarity inside k-NN pairs ÷ pull share; null where no k-NN mass exists. */
  neighborLift: number | null;
  /** Normalised entropy of the term's weight over documents (1 = evenly everywhere). */
  spread: number;
  /** Combined score used to rank loud terms (higher = louder). */
  loudness: number;
  status: TermStatus;
  /** One line a person can read: why this term is or is not suggested. */
  why: string;
  /** Stopped terms only: whether the suggestion rule would suggest the term too (the stop-list
   *  warning "carries neighbour signal" is not raised on such terms). */
  ruleWouldSuggest?: boolean | undefined;
}

export interface HubRow {
  /** 0-based document index in the corpus. */
  doc: number;
  /** 1-based line in the source file where the document starts. */
  line: number;
  /** The file (its path below the corpus root) when the corpus is many files; absent for one file. */
  file?: string | undefined;
  kOccurrence: number;
  preview: string;
}

/**
 * The one judgement a review leads with: what the suggested stop list does to neighbour quality,
 * with its uncertainty. The CLI summary, the panel and the HTML report all show it first.
 */
export interface Verdict {
  outcome: 'helps' | 'no clear change' | 'hurts' | 'nothing suggested';
  /** One sentence a person reads first, e.g. why little or nothing is suggested. */
  headline: string;
  /** The quantity judged, its change with the suggested list, and an interval from `draws` re-draws. */
  estimate: {
    measure: string;
    change: number;
    low: number;
    high: number;
    draws: number;
    method: 'seeds' | 'bootstrap';
    /** With labels on a corpus larger than the sample: the documents the sampled documents' neighbours were sought among. */
    neighborsAmong?: number;
    /** With neighborsAmong: how many sampled documents were searched for (fewer than the sample when the search of the corpus would cost too much). */
    neighborsFor?: number;
  } | null;
  /** A sample too small for its k ("sample"), then measures that moved the other way, each explained in a sentence. */
  caveats: Array<{ measure: string; sentence: string }>;
  /**
   * With labels and suggest.useLabels, when the rule suggested grammar words below half the
   * documents: what half of the sample said about keeping them. The estimate is then measured on
   * the other half only.
   */
  labelChoice?: LabelChoiceFigures;
}

/** The labels' choice about the grammar words (Verdict.labelChoice). */
export interface LabelChoiceFigures {
  /** The grammar words asked about. */
  words: number;
  /** True: they are kept (not suggested), because keeping them clearly raised label precision. */
  kept: boolean;
  /** Label precision@k keeping them less suggesting them, on the deciding half, with its 95% interval. */
  change: number;
  low: number;
  high: number;
  /** Sampled documents that decided (with a label and neighbours). */
  decidedBy: number;
}

export interface Report {
  tool: { name: 'loudword'; version: string };
  input: {
    file: string;
    format: CorpusFormatName;
    textField: string | null;
    labelField: string | null;
    documents: number;
    skipped: number;
    /**
     * Documents whose label is empty, missing or a list, when there is a label field: label precision
     * does not score them, and as a neighbour each counts as a miss (engine/measures/label-precision.ts).
     */
    unlabelled?: number | undefined;
    /** Set when the input was cut at a size limit: what was read and why. */
    truncated?: { bytesRead: number; limitBytes: number } | undefined;
    /** What the reader had to decide on its own (encoding fallback, ignored options). */
    notes?: string[] | undefined;
    /** A few of the skipped rows, with their line and reason. */
    skippedExamples?: Array<{ line: number; reason: string }> | undefined;
  };
  settings: EffectiveSettings;
  vocabulary: {
    terms: number;
    tokens: number;
    nonzeros: number;
    meanDocLength: number;
    /** Share of the word tokens that are the English grammar words the suggestion rule knows: low in text that is not English (docs/methods.md §9). */
    englishGrammarShare?: number;
    /**
     * Documents that repeat another exactly under this tokenising and weighting (the same terms in
     * the same proportions: distance 0), a group of c counting c − 1; `exact` false: estimated from
     * a sketch of 4,096 distinct documents (engine/matrix/duplicate-sketch.ts).
     */
    duplicates?: { documents: number; exact: boolean };
  };
  baseline: Measures;
  suggested: Measures;
  terms: TermRow[];
  suggestions: string[];
  /**
   * The plain spelling a stop list file gets for a suggested term whose tokenizer spelling differs
   * (with stemming on, "becaus" → "because"); only such terms are listed (engine/terms/stop-list-spelling.ts).
   */
  suggestionSpellings?: Record<string, string> | undefined;
  /**
   * Pieces of English contractions that scikit-learn's default tokens keep where wink-nlp expands
   * the contraction ("don" of "don't", for "do" and "not"), each with the suggested terms it stands
   * for: the ones whose terms the suggestions complete (with the stop list's). A stop list file
   * gets them after the suggestions (engine/terms/contraction-pieces.ts).
   */
  suggestionPieces?: Record<string, string[]> | undefined;
  /** What the suggested list does to neighbour quality, read first (engine/terms/judge-suggestions.ts). */
  verdict: Verdict;
  hubs: HubRow[];
  /**
   * The stop list in force for the baseline (from the project's stop list file). `exists` is false
   * when the settings name a file that is not there yet (the first term added creates it).
   */
  stopList: {
    file: string | null;
    exists: boolean;
    terms: number;
    /** Entries, as written, whose term never occurs in the corpus. */
    unused: string[];
    /**
     * Of `unused`, those the tokenizer does not read as one term, with the terms it makes of them
     * ("Don't" → do, not; "new york" → new, york; "—" → none): an entry stops one term.
     */
    split?: Record<string, string[]> | undefined;
  };
  timings?: Record<string, number> | undefined;
  /** Which loudword.json the review read and where each setting came from. */
  provenance?: SettingsProvenance | undefined;
}

/** Where a setting's value came from; later ones win: default < editor setting < loudword.json < command-line flag. */
export type SettingSourceKind = 'default' | 'editor setting' | 'loudword.json' | 'command-line flag';

export interface SettingsProvenance {
  /**
   * The loudword.json read (absolute), or null. `how`: given (--config), nearest (found from the
   * corpus's folder up to the project root), none (none found), ignored (--no-config).
   */
  config: { file: string | null; how: 'given' | 'nearest' | 'none' | 'ignored' };
  /**
   * Every setting not at its default, by dotted key ("sample.k"): where it came from and where
   * exactly ("/p/loudword.json:4", "--k", "loudword.neighbors").
   */
  sources: Record<string, { from: SettingSourceKind; where: string }>;
}

/** How a corpus can be read (`format`, `--input-format`): the one list; loudword.schema.json's enum is it plus "auto", held equal by a test. */
export const CORPUS_FORMATS = ['csv', 'tsv', 'jsonl', 'json', 'text', 'parquet', 'files'] as const;
export type CorpusFormatName = (typeof CORPUS_FORMATS)[number];
/** The token kinds a user can keep (`tokens.kinds`): the one list; loudword.schema.json's enum is held equal by a test. */
export const TOKEN_KINDS = ['word', 'number', 'url', 'email', 'hashtag', 'mention', 'emoji', 'emoticon', 'symbol', 'punctuation', 'currency', 'ordinal', 'time', 'shortForm'] as const;
export type TokenKind = (typeof TOKEN_KINDS)[number];

/** The settings after defaults are applied: what the review actually used. */
export interface EffectiveSettings {
  format: CorpusFormatName | 'auto';
  text: string | null;
  label: string | null;
  stopList: string | null;
  /** tokenizer: "wink" (wink-nlp, typed tokens) or "pattern" (a scikit-learn token_pattern; kinds then do not apply). */
  tokens: { lowercase: boolean; minLength: number; kinds: TokenKind[]; stem: boolean; ngrams: 1 | 2; tokenizer: 'wink' | 'pattern'; pattern: string };
  weighting: { tf: 'raw' | 'sublinear' | 'binary'; idf: 'smooth' | 'plain' | 'plainPlusOne' | 'none'; norm: 'l2' | 'l1' | 'none' };
  prune: { minDf: number; maxDf: number };
  sample: { documents: number; k: number; seed: number };
  suggest: { max: number; protect: string[]; functionWordPrior: boolean; useLabels: boolean };
  limits: { maxBytes: number };
}

// ---- Messages: extension host → webview ----
export interface ShowReportMessage { type: 'showReport'; report: Report }
/**
 * `engineMs`: the engine's time for this what-if in the worker; `hostMs`: the host's, from the
 * request's arrival to this answer (the worker's messages and the engine). The rest of a click's
 * wait is the messages between panel and host and the drawing.
 */
export interface WhatIfResultMessage { type: 'whatIfResult'; removed: string[]; measures: Measures; requestId: number; engineMs?: number; hostMs?: number; hops?: WhatIfHops }
/**
 * When a what-if passed each hop, for the e2e latency scenario's split: Date.now() in ms, one
 * clock for the panel, the host and the worker on one machine. Each side fills in its own.
 */
export interface WhatIfHops {
  /** panel: the request posted. */
  panelPosted?: number;
  /** host: the request read from the panel; handed to the review worker. */
  hostReceived?: number;
  hostToWorker?: number;
  /** worker: the request read; the engine's call started and ended (the answer posted at once). */
  workerReceived?: number;
  engineStarted?: number;
  engineEnded?: number;
  /** host: the worker's answer read; posted to the panel. */
  hostAnswered?: number;
  hostPosted?: number;
}
export const WHAT_IF_HOP_NAMES: readonly (keyof WhatIfHops)[] = ['panelPosted', 'hostReceived', 'hostToWorker', 'workerReceived', 'engineStarted', 'engineEnded', 'hostAnswered', 'hostPosted'];

/** Whether `value` is absent or a WhatIfHops (every field a number). */
export function isWhatIfHopsOrAbsent(value: unknown): boolean {
  if (value === undefined) return true;
  if (typeof value !== 'object' || value === null) return false;
  const m = value as Record<string, unknown>;
  return Object.keys(m).every((k) => (WHAT_IF_HOP_NAMES as readonly string[]).includes(k) && typeof m[k] === 'number');
}
/**
 * host → webview: the answer to a WhatIfPrefetchMessage (same fields as WhatIfResultMessage). A
 * prefetch the host dropped (a click came first, or the review cannot speculate) gets no answer.
 */
export interface WhatIfPrefetchResultMessage { type: 'prefetchResult'; removed: string[]; measures: Measures; requestId: number; engineMs?: number; hostMs?: number }
export interface BusyMessage { type: 'busy'; stage: string | null }
export interface ErrorMessage { type: 'error'; message: string }
/**
 * host → webview: whether the shown Report still describes the files. `reason` says what changed
 * since (stop list, loudword.json, corpus); null = up to date. `added`: terms added to the stop
 * list since the review (no longer open suggestions).
 */
export interface StaleMessage { type: 'stale'; reason: string | null; added: string[] }
export type HostToWebview = ShowReportMessage | WhatIfResultMessage | WhatIfPrefetchResultMessage | BusyMessage | ErrorMessage | StaleMessage;

// ---- Messages: webview → extension host ----
export interface ReadyMessage { type: 'ready' }
/** `panelPosted`: Date.now() when the panel posted it (WhatIfHops). */
export interface WhatIfRequestMessage { type: 'whatIf'; removed: string[]; requestId: number; panelPosted?: number }
/**
 * webview → host: the what-if of `removed` ahead of a click (the pointer rests on the toggle that
 * would make it): computed only when no click waits, without moving the review's what-if state,
 * and adopted by a WhatIfRequestMessage for the same selection (webview/src/what-if-prefetcher.ts).
 * `requestId`s are the prefetcher's own, apart from the clicks'.
 */
export interface WhatIfPrefetchMessage { type: 'whatIfPrefetch'; removed: string[]; requestId: number }
export interface RevealLineMessage { type: 'revealLine'; line: number }
export interface AddTermsMessage { type: 'addTerms'; terms: string[] }
export interface ExportHtmlMessage { type: 'exportHtml' }
/** webview → host: review the shown corpus again (the out-of-date banner's button). */
export interface ReviewAgainMessage { type: 'reviewAgain' }
export type WebviewToHost = ReadyMessage | WhatIfRequestMessage | WhatIfPrefetchMessage | RevealLineMessage | AddTermsMessage | ExportHtmlMessage | ReviewAgainMessage;

const webviewToHostTypes: ReadonlySet<string> = new Set(['ready', 'whatIf', 'whatIfPrefetch', 'revealLine', 'addTerms', 'exportHtml', 'reviewAgain']);

/** Checks a message from the webview before the host acts on it (the page is not trusted). */
export function isWebviewToHost(value: unknown): value is WebviewToHost {
  if (typeof value !== 'object' || value === null) return false;
  const m = value as Record<string, unknown>;
  if (typeof m.type !== 'string' || !webviewToHostTypes.has(m.type)) return false;
  switch (m.type) {
    case 'whatIf':
    case 'whatIfPrefetch':
      return Array.isArray(m.removed) && m.removed.every((t) => typeof t === 'string') && typeof m.requestId === 'number' && (m.panelPosted === undefined || typeof m.panelPosted === 'number');
    case 'revealLine':
      return typeof m.line === 'number' && Number.isInteger(m.line) && m.line >= 1;
    case 'addTerms':
      return Array.isArray(m.terms) && m.terms.every((t) => typeof t === 'string');
    default:
      return true;
  }
}
