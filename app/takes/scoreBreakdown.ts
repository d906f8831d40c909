// The score's parts as the take page lists them beside the score: each part's value, its
// weight in the formula (app/analysis/score.ts, SCORE.md) and the points it brings.
import { SCORE_WEIGHTS } from "~/analysis/score";
import type { ScoreParts } from "~/analysis/types";

export type ScorePartRow = {
  part: keyof ScoreParts;
  label: string;
  what: string;
  weight: number;
  value: number;
  points: number;
};

const LABELS: Record<keyof ScoreParts, { label: string; what: string }> = {
  smoothness: { label: "Smoothness", what: "best motion ÷ motion played" },
  cleanliness: { label: "Clean playing", what: "chords and changes without a flag" },
  techniqueVariety: { label: "Technique variety", what: "techniques used, full marks at three" },
  steadiness: { label: "Steady time", what: "notes on the beat" },
  accuracy: { label: "Exercise accuracy", what: "the exercise's chords played in order" },
};

/** One row per part that counts (accuracy only with a target); points add up to the score before rounding. */
export function scoreBreakdown(parts: ScoreParts): ScorePartRow[] {
  const weights = parts.accuracy === null ? SCORE_WEIGHTS.withoutTarget : SCORE_WEIGHTS.withTarget;
  return (Object.keys(LABELS) as Array<keyof ScoreParts>)
    .filter((p) => weights[p] > 0)
    .map((p) => {
      const value = parts[p] ?? 0;
      return { part: p, ...LABELS[p], weight: weights[p], value, points: 100 * weights[p] * value };
    });
}
