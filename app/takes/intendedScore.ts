// A take's score with the flags its teacher marked as intended ("I asked for this") left out.
// The engine's score function does the sum (SCORE.md); only the clean-playing part changes:
// a chord or change counts as flagged when it carries a flag that is not marked intended.
import { score } from "~/analysis/score";
import type { FlagName, TakeAnalysis } from "~/analysis/types";

export type IntendedMark = { on: "chord" | "change"; idx: number; flag: string };

export type IntendedScore = {
  score: number;
  cleanliness: number;
  /** flag counts without the intended ones */
  flags: Record<string, number>;
  rootPositionLeaps: number;
  /** how many flags the marks actually took out (a mark whose flag is gone after re-analysis counts 0) */
  excluded: number;
};

export function isIntended(marks: readonly IntendedMark[], on: IntendedMark["on"], idx: number, flag: string): boolean {
  return marks.some((m) => m.on === on && m.idx === idx && m.flag === flag);
}

export function scoreWithIntended(analysis: TakeAnalysis, marks: readonly IntendedMark[]): IntendedScore {
  const { chords, changes, summary } = analysis;
  const flags: Record<string, number> = { ...summary.flags };
  let excluded = 0;
  let flaggedItems = 0;
  chords.forEach((c, i) => {
    const left = c.flags.filter((f) => !isIntended(marks, "chord", i, f));
    for (const f of c.flags)
      if (!left.includes(f)) {
        flags[f as FlagName]--;
        excluded++;
      }
    if (left.length) flaggedItems++;
  });
  let graded = 0;
  changes.forEach((c, i) => {
    const left = c.flags.filter((f) => !isIntended(marks, "change", i, f));
    for (const f of c.flags)
      if (!left.includes(f)) {
        flags[f as FlagName]--;
        excluded++;
      }
    if (c.graded) {
      graded++;
      if (left.length) flaggedItems++;
    }
  });
  const items = chords.length + graded;
  const cleanliness = items === 0 ? 1 : Math.min(1, Math.max(0, 1 - flaggedItems / items));
  return {
    score: excluded === 0 ? summary.score : score(summary.chordCount, { ...summary.scoreParts, cleanliness }),
    cleanliness,
    flags,
    rootPositionLeaps: flags["root-position-leap"] ?? 0,
    excluded,
  };
}

/**
 * The analysis as the take page shows it: score, clean-playing part and flag counts with the
 * intended flags left out (the flags themselves stay on their chords and changes, marked there).
 */
export function withIntendedMarks(analysis: TakeAnalysis, marks: readonly IntendedMark[]): TakeAnalysis {
  if (marks.length === 0) return analysis;
  const r = scoreWithIntended(analysis, marks);
  if (r.excluded === 0) return analysis;
  return {
    ...analysis,
    summary: {
      ...analysis.summary,
      score: r.score,
      scoreParts: { ...analysis.summary.scoreParts, cleanliness: r.cleanliness },
      flags: r.flags as TakeAnalysis["summary"]["flags"],
      rootPositionLeaps: r.rootPositionLeaps,
    },
  };
}
