// The check of a free-practice take: the open exercise it likely is and a progression a person
// names. Chords spelled from the keys' scale degrees (common practice: I IV V I in D is D G A D,
// vi IV I V in A♭ is Fm D♭ A♭ E♭); the loop example is DOMAIN's worked example of matching.
import { describe, expect, it } from "vitest";
import { analyseNotes } from "~/analysis";
import { FIT_CHORDS } from "~/analysis/exerciseFit";
import type { NoteEvent } from "~/analysis/types";
import { practiceCheck } from "~/takes/practiceCheck";

/** One chord a second, each held for 0.9 s. */
function take(chords: number[][]): NoteEvent[] {
  return chords.flatMap((c, i) => c.map((midi) => ({ midi, start: i, end: i + 0.9, velocity: 0.7 })));
}
const D = [50, 62, 66, 69];
const G = [43, 62, 67, 71];
const A = [45, 61, 64, 69];
const FM = [41, 60, 65, 68];
const DB = [49, 61, 65, 68];
const AB = [44, 60, 63, 68];
const EB = [51, 58, 63, 67];
const EXERCISES = [
  { id: "smoothing", title: "Three-chord smoothing", keys: ["D"], progression: "I IV V I" },
  { id: "ballad", title: "Ballad", keys: ["Ab", "G"], progression: "vi IV I V" },
];

describe("practiceCheck", () => {
  it("names the open exercise, in the key, that the take plays", () => {
    const notes = take([FM, DB, AB, EB, FM, DB, AB, EB]);
    const { chords } = analyseNotes(notes);
    const check = practiceCheck(notes, chords, EXERCISES, null);
    expect(check.likely).toEqual({ exerciseId: "ballad", key: "Ab", title: "Ballad", accuracy: 1 });
    expect(check.compared).toBe(2);
    expect(check.asked).toBeNull();
  });

  it("checks a named progression: vi IV I V played one and a half times is 6 of 8, 75%", () => {
    const notes = take([FM, DB, AB, EB, FM, DB]);
    const { chords } = analyseNotes(notes);
    const check = practiceCheck(notes, chords, [], { target: "vi IV I V", key: "Ab" });
    expect(check.asked).toMatchObject({ target: "vi IV I V", key: "Ab", accuracy: 0.75, loops: 2 });
    expect(check.asked?.error).toBeUndefined();
    expect(check.likely).toBeNull();
  });

  it("answers a target it cannot read with the reason, naming the chord", () => {
    const notes = take([D, G, A, D]);
    const { chords } = analyseNotes(notes);
    const check = practiceCheck(notes, chords, EXERCISES, { target: "I IV Q I", key: "D" });
    expect(check.asked).toMatchObject({ target: "I IV Q I", key: "D" });
    expect(check.asked?.error).toMatch(/Q/);
    expect(check.likely).toMatchObject({ exerciseId: "smoothing", key: "D", accuracy: 1 });
  });

  it("reads a long take's likely exercise from its first chords, the check from all of them", () => {
    const loops = Math.ceil((FIT_CHORDS * 2) / 4);
    const chordsPlayed = Array.from({ length: loops }, () => [D, G, A, D]).flat();
    const notes = take(chordsPlayed);
    const { chords } = analyseNotes(notes);
    expect(chords.length).toBeGreaterThan(FIT_CHORDS);
    const check = practiceCheck(notes, chords, EXERCISES, { target: "I IV V I", key: "D" });
    // The first FIT_CHORDS chords stop inside a loop: nearly every chord of the looped target.
    expect(check.likely).toMatchObject({ exerciseId: "smoothing", key: "D" });
    expect(check.likely!.accuracy).toBeGreaterThan(0.9);
    expect(check.heardKey).toBe("D");
    // Repeats collapse across loops (D G A D G A D …): every chord of the looped target matched.
    // One harmony per chord change (D D joins into one), D G A D G A … D: loops = (harmonies − 1) / 3.
    expect(check.asked).toMatchObject({ accuracy: 1, loops: (chords.length - 1) / 3 });
  });
});
