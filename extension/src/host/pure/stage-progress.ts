// Overall progress of a review from its named stage, for the progress notification: the engine
// reports stages in a fixed order with a fraction within the stage.
import type { ReviewStage } from '../../engine/review/review-api';

const ORDER: readonly ReviewStage[] = ['reading', 'tokenizing', 'weighting', 'measuring', 'reviewing terms', 'writing report'];

/** Percent done (0–100) at `fraction` (0–1) of the way through `stage`. */
export function stageProgress(stage: ReviewStage, fraction: number): number {
  const i = ORDER.indexOf(stage);
  if (i < 0) return 0;
  const f = Number.isFinite(fraction) ? Math.max(0, Math.min(1, fraction)) : 0;
  return Math.round(((i + f) / ORDER.length) * 100);
}
