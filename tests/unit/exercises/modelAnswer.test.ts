import { Voicing } from "tonal";
import { describe, expect, it } from "vitest";
import { parseKey, pc } from "~/analysis/pitch";
import { parseProgression } from "~/analysis/progression";
import { motion } from "~/analysis/voiceLeading";
import {
  closeVoicing,
  defaultStart,
  fitsFirstChord,
  modelPath,
  pathPlan,
  shiftStart,
  startForKey,
} from "~/utils/modelAnswer";

const C = parseKey("C");

describe("model answer: the smoothest path from the teacher's starting voicing", () => {
  it("C F G C from C4 E4 G4 moves 3, 6, 3 semitones: the same totals as tonal's Voicing.sequence (RULES.md reference)", () => {
    const path = modelPath(parseProgression("C F G C", C), [60, 64, 67]);
    expect(path.steps.map((s) => s.motion)).toEqual([null, 3, 6, 3]);
    // RULES.md worked examples: C4 E4 G4 -> C4 F4 A4 (3); C4 F4 A4 -> B3 D4 G4 (6, the lower of a tie).
    expect(path.steps.map((s) => s.voicing)).toEqual([
      [60, 64, 67],
      [60, 65, 69],
      [59, 62, 67],
      [60, 64, 67],
    ]);
    // tonal's Voicing.sequence(["C","F","G","C"], ["C3","C5"]) lists C3 E3 G3, C3 F3 A3, D3 G3 B3, E3 G3 C4.
    const tonalPath = Voicing.sequence(["C", "F", "G", "C"], ["C3", "C5"]).map((v) => v.map((n) => noteToMidi(n)));
    const tonalTotal = tonalPath.slice(1).reduce((sum, v, i) => sum + motion(tonalPath[i], v), 0);
    expect(path.totalMotion).toBe(tonalTotal);
    expect(path.totalMotion).toBe(12);
  });

  it("keeps a slash chord's bass lowest (Cm/Bb has B flat at the bottom)", () => {
    const chords = parseProgression("Eb Bb/D Cm Cm/Bb Ab", parseKey("Eb"));
    const path = modelPath(chords, defaultStart(chords[0]));
    expect(pc(path.steps[1].voicing[0])).toBe(2);
    expect(pc(path.steps[3].voicing[0])).toBe(10);
    for (const [i, s] of path.steps.entries())
      if (i > 0) expect(s.motion).toBe(motion(path.steps[i - 1].voicing, s.voicing));
  });

  it("never moves more than the plain close voicing would (best motion never exceeds a candidate)", () => {
    const chords = parseProgression("vi IV I V", parseKey("Ab"));
    const path = modelPath(chords, defaultStart(chords[0]));
    for (let i = 1; i < chords.length; i++) {
      const prev = path.steps[i - 1].voicing;
      expect(path.steps[i].motion!).toBeLessThanOrEqual(motion(prev, closeVoicing(chords[i], prev[0] - 6)));
    }
  });

  it("checks and moves the teacher's start voicing", () => {
    const [first] = parseProgression("I IV V I", parseKey("D"));
    expect(fitsFirstChord([57, 62, 66], first)).toBe(true); // A3 D4 F#4
    expect(fitsFirstChord([57, 62, 65], first)).toBe(false); // F natural is not in D major's I
    expect(shiftStart([57, 62, 66], 2, 7)).toEqual([62, 67, 71]); // D -> G: up a 4th
    expect(shiftStart([57, 62, 66], 2, 9)).toEqual([52, 57, 61]); // D -> A: down a 4th (nearest)
    const [firstInG] = parseProgression("I IV V I", parseKey("G"));
    expect(startForKey([57, 62, 66], 2, 7, firstInG)).toEqual([62, 67, 71]);
    expect(startForKey([57, 62, 65], 2, 7, firstInG)).toEqual(defaultStart(firstInG));
  });

  it("plays each chord for two beats at the exercise's tempo", () => {
    const plan = pathPlan(
      [
        { symbol: "C", roman: "I", voicing: [60, 64, 67], motion: null },
        { symbol: "F", roman: "IV", voicing: [60, 65, 69], motion: 3 },
      ],
      60,
    );
    expect(plan.filter((n) => n.start === 2).map((n) => n.midi)).toEqual([60, 65, 69]);
  });
});

function noteToMidi(name: string): number {
  const m = /^([A-G])([#b]*)(-?\d)$/.exec(name)!;
  const base = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 }[m[1] as "C"];
  const acc = [...m[2]].reduce((a, c) => a + (c === "#" ? 1 : -1), 0);
  return 12 * (Number(m[3]) + 1) + base + acc;
}
