// Grading changes in the context of a whole take (RULES.md rules 8–10 with a melody and
// two-hand voicings), and the whole-take budget. The expected values are RULES.md's worked
// examples for rules 8, 9 and 10 (worked by hand from RULES.md rules 8, 9 and 10), each in its
// key and transposed into two others.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { isTwoHand, keptBass } from "../../../app/analysis/bestMotion";
import { Budget } from "../../../app/analysis/budget";
import { chordFlags } from "../../../app/analysis/chordFlags";
import { AnalysisError } from "../../../app/analysis/errors";
import { gradeChange, gradeChanges, previousTopNote } from "../../../app/analysis/grade";
import { parseKey } from "../../../app/analysis/pitch";
import type { ChordReport, MelodyNote } from "../../../app/analysis/types";
import { motion } from "../../../app/analysis/voiceLeading";

const key = parseKey("C");
const shift = (v: number[], t: number) => v.map((x) => x + t);
const NAMES = ["C", "Db", "D", "Eb", "E", "F", "Gb", "G", "Ab", "A", "Bb", "B"];

/** A harmony as grading sees it: its voicing, root, inversion and start (naming is not under test here). */
function harmony(notes: number[], rootPc: number | null, inversion: number | null, startSec: number): ChordReport {
  const partial: Partial<ChordReport> = {
    startSec,
    endSec: startSec + 1,
    notes,
    root: rootPc === null ? null : NAMES[((rootPc % 12) + 12) % 12],
    inversion,
    topNote: notes[notes.length - 1],
    flags: [],
    techniques: [],
  };
  return partial as ChordReport;
}
const melodyNote = (note: number, startSec: number): MelodyNote => ({
  note,
  startSec,
  endSec: startSec + 0.5,
  noteName: "",
});

describe("a tune over two-hand voicings (RULES.md rule 8 worked example)", () => {
  // left hand C3 G3 E4 with melody G5 struck with it and E5 after; then F3 A3 E4 under melody F5
  it.each([0, 2, -3])("every suggestion keeps F3 and F5, transposed %i", (t) => {
    const a = harmony(shift([48, 55, 64, 79], t), 0 + t, 0, 0);
    const melody = [melodyNote(79 + t, 0), melodyNote(76 + t, 1)];
    for (const played of [
      [53, 57, 64, 77], // F3 A3 E4 F5 as in RULES.md: nothing between moves less
      [53, 64, 69, 77], // F3 E4 A4 F5: the middle re-voiced moves less
      [53, 69, 76, 77], // F3 A4 E5 F5
    ]) {
      const b = harmony(shift(played, t), 5 + t, 0, 2);
      const [change] = gradeChanges([a, b], key, { hasMelody: true, melodyNotes: melody });
      expect(change.bestVoicing![0]).toBe(53 + t);
      expect(change.bestVoicing![3]).toBe(77 + t);
      for (const s of change.suggestions) {
        expect(s.voicing[0], `${s.kind} ${s.voicing}`).toBe(53 + t);
        expect(s.voicing[s.voicing.length - 1], `${s.kind} ${s.voicing}`).toBe(77 + t);
        expect(s.motion).toBeLessThan(change.motion!);
      }
      if (played[1] === 57) expect(change.suggestions).toEqual([]);
      else expect(change.suggestions.map((s) => s.voicing)).toContainEqual(shift([53, 57, 64, 77], t));
    }
  });

  it("without a melody the same change may re-voice the top, which the tune forbids", () => {
    const a = harmony([48, 55, 64, 79], 0, 0, 0);
    const b = harmony([53, 57, 64, 89], 5, 0, 2); // the tune leaps up to F6
    const free = gradeChanges([a, b], key, { hasMelody: false });
    expect(free[0].suggestions.some((s) => s.voicing[s.voicing.length - 1] !== 89)).toBe(true);
    const tune = gradeChanges([a, b], key, { hasMelody: true, melodyNotes: [melodyNote(79, 0)] });
    expect(tune[0].suggestions.every((s) => s.voicing[s.voicing.length - 1] === 89)).toBe(true);
  });
});

describe("suggestions obey rule 8's limits and move less than played (fast-check)", () => {
  const voicing = (min: number, max: number, size: number) =>
    fc.uniqueArray(fc.integer({ min, max }), { minLength: size, maxLength: size }).map((v) => v.sort((x, y) => x - y));
  const chord = fc.oneof(
    fc.integer({ min: 3, max: 4 }).chain((n) => voicing(55, 79, n)),
    fc.tuple(fc.integer({ min: 36, max: 50 }), voicing(58, 79, 3)).map(([bass, upper]) => [bass, ...upper]),
    fc.tuple(voicing(48, 57, 2), voicing(72, 84, 2)).map(([low, high]) => [...low, ...high]),
  );
  it("never a new bass under a two-hand voicing, never a new tune, never a flag, always less motion", () => {
    fc.assert(
      fc.property(chord, chord, fc.boolean(), (va, vb, hasMelody) => {
        const c = gradeChange(0, 1, harmony(va, null, null, 0), harmony(vb, null, null, 1), key, { hasMelody });
        for (const s of c.suggestions) {
          expect(s.motion).toBeLessThan(c.motion!);
          expect(motion(va, s.voicing)).toBe(s.motion);
          expect(chordFlags(s.voicing)).toEqual([]);
          if (isTwoHand(vb)) expect(s.voicing.slice(0, keptBass(vb).length)).toEqual(keptBass(vb));
          if (hasMelody) expect(s.voicing[s.voicing.length - 1]).toBe(vb[vb.length - 1]);
        }
        expect(c.bestMotion!).toBeLessThanOrEqual(c.motion!);
        if (hasMelody) expect(c.bestVoicing![c.bestVoicing!.length - 1]).toBe(vb[vb.length - 1]);
      }),
      { numRuns: 200, seed: 812 },
    );
  });

  it("offers nothing when no voicing moves less (F3 A3 C4 -> F3 Bb3 D4 moves 3, its best)", () => {
    for (const t of [0, 2, -5]) {
      const c = gradeChange(
        0,
        1,
        harmony(shift([53, 57, 60], t), 5 + t, 0, 0),
        harmony(shift([53, 58, 62], t), 10 + t, 2, 1),
        key,
      );
      expect([c.motion, c.bestMotion, c.suggestions]).toEqual([3, 3, []]);
    }
  });
});

describe("root-position leap on the right hand through grading (RULES.md rule 9 worked example)", () => {
  it.each([0, 2, -5])("left C3 -> G2, right C4 E4 G4 -> G4 B4 D5, transposed %i", (t) => {
    const a = harmony(shift([48, 60, 64, 67], t), 0 + t, 0, 0);
    const b = harmony(shift([43, 67, 71, 74], t), 7 + t, 0, 1);
    expect(gradeChange(0, 1, a, b, key).flags).toContain("root-position-leap");
  });
});

describe("top-line leap from the melody (RULES.md rule 10)", () => {
  it.each([0, 4, -2])("from the melody's last note before the change, transposed %i", (t) => {
    const a = harmony(shift([48, 55, 64, 79], t), t, 0, 0); // C3 G3 E4 under G5
    const b = harmony(shift([53, 57, 64, 77], t), 5 + t, 0, 2); // F3 A3 E4 under F5
    // the tune fell from G5 to A4 before the change: A4 -> F5 is 8, a leap
    const fell = gradeChanges([a, b], key, {
      hasMelody: true,
      melodyNotes: [melodyNote(79 + t, 0), melodyNote(69 + t, 1)],
    });
    expect(fell[0].flags).toContain("top-line-leap");
    // the tune stepped from G5 to E5: E5 -> F5 is 1, no leap
    const stepped = gradeChanges([a, b], key, {
      hasMelody: true,
      melodyNotes: [melodyNote(79 + t, 0), melodyNote(76 + t, 1)],
    });
    expect(stepped[0].flags).not.toContain("top-line-leap");
    // without a melody, voicing top to voicing top (G5 -> F5)
    expect(gradeChanges([a, b], key)[0].flags).not.toContain("top-line-leap");
  });

  it("the last top-voice note is a melody note begun during the previous harmony, else its top", () => {
    const a = harmony([48, 55, 64], 0, 0, 1);
    const b = harmony([53, 57, 64], 5, 0, 2);
    expect(previousTopNote(a, b, [melodyNote(76, 1.2), melodyNote(74, 1.5), melodyNote(72, 2)])).toBe(74);
    expect(previousTopNote(a, b, [melodyNote(76, 0.5)])).toBe(64); // before the harmony began
    expect(previousTopNote(a, b, [melodyNote(72, 1.5), melodyNote(79, 1.5)])).toBe(79); // begun together: the higher
  });
});

describe("the whole-take budget", () => {
  it("refuses a take whose searches outrun it as too complex", () => {
    const chords = [
      harmony([36, 43, 50, 57, 64, 71, 78, 85], null, null, 0),
      harmony([38, 45, 52, 59, 66, 73, 80, 87], null, null, 1),
      harmony([37, 44, 51, 58, 65, 72, 79, 86], null, null, 2),
    ];
    expect(() => gradeChanges(chords, key, { budget: new Budget(200) })).toThrow(AnalysisError);
    try {
      gradeChanges(chords, key, { budget: new Budget(200) });
    } catch (e) {
      expect((e as AnalysisError).code).toBe("too-complex");
    }
    // with the default budget the same take is graded, and each change only once per take
    const budget = new Budget();
    const graded = gradeChanges([...chords, chords[0], chords[1]], key, { budget });
    expect(graded).toHaveLength(4);
    expect(graded[3]).toEqual({ ...graded[0], from: 3, to: 4 });
  });
});

describe("pedal blur handed in by the segmentation (RULES.md rule 19 worked example)", () => {
  it.each([0, 2, -5])("C3 E4 G4 C5 pedalled into D3 F4 A4 D5 is flagged with the carried notes, transposed %i", (t) => {
    const a = harmony(shift([48, 64, 67, 72], t), t, 0, 0);
    const b = harmony(shift([50, 65, 69, 74], t), 2 + t, 0, 1);
    const [change] = gradeChanges([a, b], key, { blurredNotes: [undefined, shift([72, 48, 64, 67], t)] });
    expect(change.flags).toContain("pedal-blur");
    expect(change.blurredNotes).toEqual(shift([48, 64, 67, 72], t));
    expect(gradeChanges([a, b], key)[0].flags).not.toContain("pedal-blur");
  });
});
