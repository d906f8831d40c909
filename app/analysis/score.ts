// The 0–100 score of a take. The formula is written out in plain words in SCORE.md (the
// README quotes it); keep the two in step and raise ANALYSIS_VERSION when it changes.
import type { ScoreParts } from "./types";

export const SCORE_WEIGHTS = {
  withoutTarget: { smoothness: 0.45, cleanliness: 0.3, techniqueVariety: 0.15, steadiness: 0.1, accuracy: 0 },
  withTarget: { smoothness: 0.35, cleanliness: 0.25, techniqueVariety: 0.1, steadiness: 0.1, accuracy: 0.2 },
} as const;

/** Techniques needed for full marks on variety. */
export const VARIETY_FOR_FULL_MARKS = 3;

const clamp01 = (x: number) => (Number.isFinite(x) ? Math.min(1, Math.max(0, x)) : 0);

export type ScoreInputs = {
  chordCount: number;
  smoothness: number;
  /** chords carrying at least one flag plus graded changes carrying at least one flag */
  flaggedItems: number;
  /** chords plus graded changes */
  items: number;
  /** distinct technique names shown in the take, smooth-top-line included */
  distinctTechniques: number;
  steadiness: number;
  accuracy: number | null;
};

export function scoreParts(input: ScoreInputs): ScoreParts {
  return {
    smoothness: clamp01(input.smoothness),
    cleanliness: input.items === 0 ? 1 : clamp01(1 - input.flaggedItems / input.items),
    techniqueVariety: clamp01(input.distinctTechniques / VARIETY_FOR_FULL_MARKS),
    steadiness: clamp01(input.steadiness),
    accuracy: input.accuracy === null ? null : clamp01(input.accuracy),
  };
}

/** Weighted sum of the parts, rounded to a whole number; a take without chords scores 0. */
export function score(chordCount: number, parts: ScoreParts): number {
  if (chordCount === 0) return 0;
  const w = parts.accuracy === null ? SCORE_WEIGHTS.withoutTarget : SCORE_WEIGHTS.withTarget;
  const total =
    w.smoothness * parts.smoothness +
    w.cleanliness * parts.cleanliness +
    w.techniqueVariety * parts.techniqueVariety +
    w.steadiness * parts.steadiness +
    w.accuracy * (parts.accuracy ?? 0);
  return Math.round(100 * total);
}
