// Edges of grade.ts: a change of chords too big to grade (rule 8's 8 pitches), the prefix test
// the suggestion search uses (rules 11 and 12), and the melody read in time order (rule 10).
// Voicings are MIDI note numbers (middle C = 60, the MIDI spec's numbering); the expected
// values are worked by hand from RULES.md rules 8, 10, 11, 12 and 19, and the low-interval
// limits are checked against lowInterval.ts's own test (common practice, from memory).
import { Note } from "tonal";
import { describe, expect, it } from "vitest";
import { cleanPrefix, gradeChange, gradeChanges } from "../../../app/analysis/grade";
import { isMuddyLowInterval } from "../../../app/analysis/lowInterval";
import { parseKey } from "../../../app/analysis/pitch";
import type { ChordReport, MelodyNote } from "../../../app/analysis/types";

const NAMES = ["C", "Db", "D", "Eb", "E", "F", "Gb", "G", "Ab", "A", "Bb", "B"];
function harmony(notes: number[], rootPc: number | null, inversion: number | null, startSec: number): ChordReport {
  const partial: Partial<ChordReport> = {
    startSec,
    endSec: startSec + 1,
    notes,
    root: rootPc === null ? null : NAMES[rootPc % 12],
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

describe("a change with more than 8 distinct pitches (rule 8) is not graded", () => {
  // nine pitches: C major spread over four octaves; then C major in close position
  const big = [36, 43, 48, 52, 55, 60, 64, 67, 72];
  const close = [48, 52, 55];
  it.each([0, 2, -3])("its common tones are still counted, and the pedal still heard (rule 19), shifted %i", (t) => {
    const a = harmony(
      big.map((n) => n + t),
      t,
      0,
      0,
    );
    const b = harmony(
      close.map((n) => n + t),
      t,
      0,
      1,
    );
    const c = gradeChange(0, 1, a, b, parseKey("C"), { blurredNotes: [62 + t] });
    expect(c.graded).toBe(false);
    expect(c.motion).toBeNull();
    // C3 E3 G3 are all in the big voicing
    expect(c.commonTones).toBe(3);
    expect(c.flags).toEqual(["pedal-blur"]);
    const quiet = gradeChange(0, 1, a, b, parseKey("C"));
    expect(quiet.flags).toEqual([]);
    // the other way round too: the second chord is the big one
    const back = gradeChange(0, 1, b, a, parseKey("C"));
    expect(back.graded).toBe(false);
    expect(back.commonTones).toBe(3);
  });

  it("eight pitches are still graded", () => {
    const eight = [36, 43, 48, 52, 55, 60, 64, 67];
    expect(gradeChange(0, 1, harmony(eight, 0, 0, 0), harmony([48, 52, 55], 0, 0, 1), null).graded).toBe(true);
  });
});

describe("cleanPrefix: the low notes of a suggestion already decide rules 11 and 12", () => {
  const cMajorOverE = [40, 48, 55, 64]; // E2 C3 G3 E4: C major in first inversion
  it("one note decides nothing", () => {
    expect(cleanPrefix([36], 1, [36, 48, 52, 55])).toBe(true);
    expect(cleanPrefix([], 0, [36, 48, 52, 55])).toBe(true);
  });

  it("the two lowest notes decide rule 12: a third at C2 is muddy, at C4 it is not", () => {
    expect(isMuddyLowInterval([36, 40])).toBe(true);
    expect(isMuddyLowInterval([60, 64])).toBe(false);
    expect(cleanPrefix([36, 40], 2, [36, 40, 43])).toBe(false);
    expect(cleanPrefix([60, 64], 2, [60, 64, 67])).toBe(true);
    // with three notes placed the low interval was judged before
    expect(cleanPrefix([36, 40, 43], 3, [36, 40, 43])).toBe(true);
  });

  it("rule 11: the bass 3rd doubled two octaves up below the top is flagged; an octave up is not tested here", () => {
    // E2 with E4 doubling it, in C major over E (the 3rd in the bass)
    expect(cleanPrefix([40, 55, 64], 3, cMajorOverE)).toBe(false);
    // the octave just above the bass is left to the full test
    expect(cleanPrefix([40, 52], 2, cMajorOverE)).toBe(true);
    // a note that does not double the bass, or a bass that is the root
    expect(cleanPrefix([40, 55, 60], 3, cMajorOverE)).toBe(true);
    expect(cleanPrefix([36, 55, 60], 3, [36, 55, 60, 64])).toBe(true);
  });
});

describe("rule 10: the melody is read in time order whatever order it is given in", () => {
  it("the last melody note before the change is the top line's source", () => {
    const a = harmony([48, 52, 55, 72], 0, 0, 0);
    const b = harmony([53, 57, 60, 84], 5, 0, 2);
    const melody = [melodyNote(74, 0.5), melodyNote(83, 1.5)];
    const inOrder = gradeChanges([a, b], parseKey("C"), { melodyNotes: melody });
    const reversed = gradeChanges([a, b], parseKey("C"), { melodyNotes: [...melody].reverse() });
    // B5 (83) to C6 (84): a step, not the leap from C5
    expect(inOrder[0].topLineFrom).toBe(83);
    expect(reversed[0].topLineFrom).toBe(83);
    expect(reversed[0].flags).not.toContain("top-line-leap");
  });
});

describe("the suggestions of a change (rule 8): each kind at most once, each moving less than played", () => {
  it.each([0, 2, -3])("F3 A3 C4 → Bb3 D4 F4 (RULES.md worked example), shifted %i", (t) => {
    const a = harmony(
      [53, 57, 60].map((n) => n + t),
      5 + t,
      0,
      0,
    );
    const b = harmony(
      [58, 62, 65].map((n) => n + t),
      10 + t,
      0,
      1,
    );
    const c = gradeChange(0, 1, a, b, null);
    expect(c.motion).toBe(15);
    // the smoothest moves the top (F4 to D4), so a voicing keeping F4 on top is offered too
    expect(c.suggestions.map((s) => s.kind).slice(0, 2)).toEqual(["smoothest", "keep-top"]);
    const [smoothest, keepTop] = c.suggestions;
    const keepBass = c.suggestions.find((s) => s.kind === "keep-bass");
    expect(smoothest).toMatchObject({ voicing: [53 + t, 58 + t, 62 + t], motion: 3 });
    expect(keepTop.voicing[keepTop.voicing.length - 1]).toBe(65 + t);
    if (keepBass) expect(keepBass.voicing[0]).toBe(58 + t);
    for (const s of c.suggestions) {
      expect(s.motion).toBeLessThan(15);
      expect(s.motion).toBeGreaterThanOrEqual(3);
      // each names its notes (tonal's Note.midi reads them back)
      expect(s.noteNames.map((n) => Note.midi(n))).toEqual(s.voicing);
    }
    // no two suggestions, and none the voicing as played
    const seen = new Set(c.suggestions.map((s) => s.voicing.join(",")));
    expect(seen.size).toBe(c.suggestions.length);
    expect(seen.has(b.notes.join(","))).toBe(false);
  });
});
