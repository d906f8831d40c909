// Scores with intended flags left out, against SCORE.md's formula worked by hand.
import { describe, expect, it } from "vitest";
import { analyseNotes } from "~/analysis";
import type { NoteEvent } from "~/analysis/types";
import { scoreWithIntended, withIntendedMarks } from "~/takes/intendedScore";

function take(chords: number[][]): NoteEvent[] {
  return chords.flatMap((c, i) => c.map((midi) => ({ midi, start: i * 0.5, end: i * 0.5 + 0.45, velocity: 0.7 })));
}
// D G A D in root position (rule 9): changes 0 and 2 are root-position leaps; no chord flags.
const analysis = analyseNotes(
  take([
    [62, 66, 69],
    [67, 71, 74],
    [69, 73, 76],
    [62, 66, 69],
  ]),
  { key: "D" },
);
// SCORE.md without a target: 100 × (0.45 smoothness + 0.30 clean + 0.15 variety + 0.10 steady).
const byHand = (clean: number) => {
  const p = analysis.summary.scoreParts;
  return Math.round(100 * (0.45 * p.smoothness + 0.3 * clean + 0.15 * p.techniqueVariety + 0.1 * p.steadiness));
};

describe("score with intended flags", () => {
  it("is the engine's score when nothing is marked", () => {
    expect(analysis.changes.map((c) => c.flags)).toEqual([["root-position-leap"], [], ["root-position-leap"]]);
    expect(scoreWithIntended(analysis, [])).toMatchObject({ score: analysis.summary.score, excluded: 0 });
    expect(analysis.summary.score).toBe(byHand(5 / 7));
  });

  it("counts a change as clean once all its flags are intended", () => {
    const one = scoreWithIntended(analysis, [{ on: "change", idx: 0, flag: "root-position-leap" }]);
    expect(one).toMatchObject({ score: byHand(6 / 7), excluded: 1, rootPositionLeaps: 1 });
    const both = scoreWithIntended(analysis, [
      { on: "change", idx: 0, flag: "root-position-leap" },
      { on: "change", idx: 2, flag: "root-position-leap" },
    ]);
    expect(both).toMatchObject({ score: byHand(1), cleanliness: 1, rootPositionLeaps: 0 });
  });

  it("ignores a mark whose flag is not there (e.g. after a re-analysis)", () => {
    expect(scoreWithIntended(analysis, [{ on: "change", idx: 1, flag: "root-position-leap" }])).toMatchObject({
      score: analysis.summary.score,
      excluded: 0,
    });
    expect(withIntendedMarks(analysis, [{ on: "chord", idx: 0, flag: "muddy-low-interval" }])).toBe(analysis);
  });

  it("gives the take page a copy with the shown score, leaving the engine's result alone", () => {
    const shown = withIntendedMarks(analysis, [{ on: "change", idx: 2, flag: "root-position-leap" }]);
    expect(shown.summary.score).toBe(byHand(6 / 7));
    expect(shown.summary.flags["root-position-leap"]).toBe(1);
    expect(analysis.summary.flags["root-position-leap"]).toBe(2);
    expect(shown.changes[2].flags).toEqual(["root-position-leap"]);
  });
});
