// Places of differences in the chord strip, on takes analysed by the real engine. Expected
// places are worked by hand from RULES.md's matching rule (alignment of take and looped target).
import { describe, expect, it } from "vitest";
import { analyseNotes } from "~/analysis";
import type { NoteEvent } from "~/analysis/types";
import { placeMismatches } from "~/takes/mismatchPlaces";

/** One chord every half second, all notes together. */
function take(chords: number[][]): NoteEvent[] {
  return chords.flatMap((c, i) => c.map((midi) => ({ midi, start: i * 0.5, end: i * 0.5 + 0.45, velocity: 0.7 })));
}
const D = [62, 66, 69];
const G = [62, 67, 71];
const A = [61, 64, 69];
const Bm = [62, 66, 71];

describe("placing mismatches in the chord strip", () => {
  it("a missing V between IV and I sits after the IV (I IV I against I IV V I)", () => {
    const a = analyseNotes(take([D, G, D]), { key: "D", target: "I IV V I" });
    expect(placeMismatches(a)).toEqual([
      { mismatch: expect.objectContaining({ kind: "missing", targetIndex: 2 }), onChord: null, afterChord: 1 },
    ]);
  });

  it("a wrong chord sits on the chord played", () => {
    const a = analyseNotes(take([D, G, Bm, D]), { key: "D", target: "I IV V I" });
    expect(placeMismatches(a)).toEqual([
      { mismatch: expect.objectContaining({ kind: "wrong-chord" }), onChord: 2, afterChord: null },
    ]);
  });

  it("the chords missing from the second time through sit after the last chord played (vi IV I V, one and a half times)", () => {
    const Fm = [65, 68, 72];
    const Db = [65, 68, 73];
    const Ab = [63, 68, 72];
    const Eb = [63, 67, 70];
    const a = analyseNotes(take([Fm, Db, Ab, Eb, Fm, Db]), { key: "Ab", target: "vi IV I V" });
    expect(placeMismatches(a).map((p) => [p.mismatch.kind, p.afterChord])).toEqual([
      ["missing", 5],
      ["missing", 5],
    ]);
  });

  it("a repeated chord is one harmony (RULES.md rule 15): the missing V after IV IV sits after that IV", () => {
    const a = analyseNotes(take([D, G, G, D]), { key: "D", target: "I IV V I" });
    expect(a.chords.map((c) => c.roman)).toEqual(["I", "IV64", "I"]); // D G B over D: G in second inversion
    expect(placeMismatches(a).map((p) => [p.mismatch.kind, p.afterChord])).toEqual([["missing", 1]]);
  });

  it("an extra chord sits on itself and moves later missing chords along", () => {
    const a = analyseNotes(take([D, A, G, D]), { key: "D", target: "I IV V I" });
    const kinds = placeMismatches(a).map((p) => [p.mismatch.kind, p.onChord, p.afterChord]);
    // Hand alignment: D=I, A extra (or wrong), G=IV, V missing after G, D=I.
    expect(kinds).toContainEqual(["missing", null, 2]);
  });
});
