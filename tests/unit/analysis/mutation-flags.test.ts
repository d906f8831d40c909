// Chord and change flags, techniques, the score's clean-playing part and the search budget at
// the edges a mutation run found unpinned: unsorted input, empty and one-note voicings, unnamed
// chords, chords that are not major, the exact bounds of each rule. Expected values are worked
// by hand from the rule named beside each check.
import { describe, expect, it } from "vitest";
import { Budget } from "../../../app/analysis/budget";
import { isRootPositionLeap, isTopLineLeap, rightHandPart } from "../../../app/analysis/changeFlags";
import { chordFlags, isDoubledBassThird } from "../../../app/analysis/chordFlags";
import { AnalysisError } from "../../../app/analysis/errors";
import { isMuddyLowInterval } from "../../../app/analysis/lowInterval";
import { nameChord } from "../../../app/analysis/naming";
import { scoreParts } from "../../../app/analysis/score";
import {
  chordTechniques,
  type ChordShape,
  hasSmoothTopLine,
  smoothTopLineShare,
} from "../../../app/analysis/techniques";
import type { ChordName } from "../../../app/analysis/types";

const UNNAMED: ChordName = { rootPc: null, triad: null, quality: null, suffix: null, intervals: [], intervalNames: {} };

describe("rule 9 with roots, unsorted notes and empty voicings", () => {
  it("reads unsorted voicings in sorted order", () => {
    // RULES.md worked example 1 (F → Bb, every voice up 5), notes given in any order.
    expect(isRootPositionLeap([60, 53, 57], [65, 58, 62], 0, 0)).toBe(true);
    expect(rightHandPart([67, 36, 64, 60])).toEqual([60, 64, 67]);
  });

  it("one-hand voicings with their roots given are judged whole, by their inversions", () => {
    // RULES.md worked example 1 again, with the roots F (5) and Bb (10): still a leap.
    expect(isRootPositionLeap([53, 57, 60], [58, 62, 65], 0, 0, 5, 10)).toBe(true);
    // Worked example 2 (F → Bb/F, up 0, 1, 2): none.
    expect(isRootPositionLeap([53, 57, 60], [53, 58, 62], 0, 2, 5, 10)).toBe(false);
  });

  it("two-hand voicings are judged on the right hand only when both roots are given", () => {
    // RULES.md real-playing example 8: left hand C3 → G2 (down 5), right hand C4 E4 G4 → G4 B4 D5 (up 7).
    const a = [48, 60, 64, 67];
    const b = [43, 67, 71, 74];
    expect(isRootPositionLeap(a, b, 0, 0, 0, 7)).toBe(true);
    // Without both roots the whole voicings are judged: the bass moves the other way, no block.
    expect(isRootPositionLeap(a, b, 0, 0, 0, undefined)).toBe(false);
    expect(isRootPositionLeap(a, b, 0, 0, undefined, 7)).toBe(false);
  });

  it("an unnamed chord on either side of a two-hand change is no root-position leap", () => {
    // Rule 9 asks for both chords in root position; a chord without a root has none. Right hands
    // C4 E4 G4 → C5 E5 G5 (all up 12) over C3 → F2.
    const a = [48, 60, 64, 67];
    const b = [41, 72, 76, 79];
    expect(isRootPositionLeap(a, b, null, null, null, 0)).toBe(false);
    expect(isRootPositionLeap(a, b, null, null, 0, null)).toBe(false);
    expect(isRootPositionLeap(a, b, null, null, 0, 0)).toBe(true);
  });

  it("a right hand not in root position on either side is no root-position leap", () => {
    // Right hands E4 G4 C5 → E5 G5 C6 (C/E, all up 12) over C3 → F2; roots C and C.
    expect(isRootPositionLeap([48, 64, 67, 72], [41, 76, 79, 84], 1, 1, 0, 0)).toBe(false);
    // Only the second right hand inverted: C4 E4 G4 → E5 G5 C6.
    expect(isRootPositionLeap([48, 60, 64, 67], [41, 76, 79, 84], 0, 1, 0, 0)).toBe(false);
    // Only the first: E4 G4 C5 → C5 E5 G5.
    expect(isRootPositionLeap([48, 64, 67, 72], [41, 72, 76, 79], 1, 0, 0, 0)).toBe(false);
  });

  it("no voices, no leap", () => {
    expect(isRootPositionLeap([], [], 0, 0)).toBe(false);
    expect(isTopLineLeap([], [60])).toBe(false);
    expect(isTopLineLeap([60], [])).toBe(false);
  });
});

describe("rule 11 only for major and dominant chords", () => {
  it("an augmented chord read on C with its E in the bass and doubled is not flagged", () => {
    // RULES.md rule 11: "In a major or dominant chord". E2 G#3 C4 E4 G#4 read as Caug/E.
    const caug: ChordName = { ...nameChord([60, 64, 68], 60), rootPc: 0, triad: "augmented" };
    expect(isDoubledBassThird([40, 56, 60, 64, 68], caug)).toBe(false);
    // The same notes read as C major's 3rd in the bass would be (rule 11's own case).
    const cMajor = nameChord([60, 64, 67], 60);
    expect(isDoubledBassThird([40, 55, 60, 64, 67], cMajor)).toBe(true);
  });

  it("an unnamed chord is never flagged, whatever its bass", () => {
    expect(isDoubledBassThird([40, 41, 42, 52, 60], UNNAMED)).toBe(false);
  });
});

describe("rule 12's edges", () => {
  it("intervals without a limit are never muddy, however low", () => {
    // RULES.md rule 12: unisons, octaves and intervals wider than a major 10th have no limit.
    expect(isMuddyLowInterval([24, 36])).toBe(false); // C1 C2, an octave
    expect(isMuddyLowInterval([24, 41])).toBe(false); // C1 F2, an 11th
    expect(isMuddyLowInterval([24, 24])).toBe(false);
  });

  it("reads the two lowest notes of an unsorted voicing; one note has no interval", () => {
    // Low-interval table (Lowell & Pullig via elm-music-theory): a M3 needs its bottom at Bb2 (46).
    expect(isMuddyLowInterval([67, 40, 44])).toBe(true); // E2 G#2 under G4
    expect(isMuddyLowInterval([67, 46, 50])).toBe(false); // Bb2 D3 under G4
    expect(isMuddyLowInterval([40])).toBe(false);
    expect(isMuddyLowInterval([])).toBe(false);
    // Two notes are enough for an interval: E2 G#2.
    expect(isMuddyLowInterval([40, 44])).toBe(true);
    expect(chordFlags([40, 44])).toEqual(["muddy-low-interval"]);
  });
});

describe("rule 14's techniques at their edges", () => {
  const shape = (notes: number[], over: Partial<ChordShape> = {}): ChordShape => ({
    name: nameChord(notes, notes[0]),
    inversion: 0,
    upperInversion: null,
    detachedBass: null,
    voicing: "close",
    graces: [],
    ...over,
  });

  it("a seventh in the bass (inversion 3) counts as an inversion (RULES.md rules 5 and 14)", () => {
    // C7/Bb: Bb3 C4 E4 G4.
    expect(chordTechniques(shape([58, 60, 64, 67], { inversion: 3 }))).toContain("inversion");
    expect(chordTechniques(shape([58, 60, 64, 67], { inversion: 0 }))).not.toContain("inversion");
  });

  it("grace-to-third: from a half or whole step below the 3rd, never from above or further", () => {
    // RULES.md rule 14: "a grace note a half or whole step below the chord's 3rd that resolves to it".
    const c = (note: number) => chordTechniques(shape([60, 64, 67], { graces: [{ note, resolvesTo: 64 }] }));
    expect(c(63)).toContain("grace-to-third");
    expect(c(62)).toContain("grace-to-third");
    expect(c(61)).not.toContain("grace-to-third");
    expect(c(65)).not.toContain("grace-to-third");
    expect(c(66)).not.toContain("grace-to-third");
    // Into the 5th, not the 3rd: none.
    expect(chordTechniques(shape([60, 64, 67], { graces: [{ note: 66, resolvesTo: 67 }] }))).not.toContain(
      "grace-to-third",
    );
  });

  it("a sus chord has no 3rd, so no grace note earns grace-to-third there", () => {
    // Csus4 (C F G): rule 14's technique needs a 3rd; Eb or E are not chord tones here.
    const sus = shape([60, 65, 67], {
      graces: [
        { note: 62, resolvesTo: 63 },
        { note: 62, resolvesTo: 64 },
      ],
    });
    expect(sus.name.triad).toBe("sus4");
    expect(chordTechniques(sus)).not.toContain("grace-to-third");
    // Cm's 3rd is Eb: D → Eb does.
    expect(chordTechniques(shape([60, 63, 67], { graces: [{ note: 62, resolvesTo: 63 }] }))).toContain(
      "grace-to-third",
    );
  });

  it("a take's top line needs changes to be smooth (rule 13)", () => {
    expect(smoothTopLineShare([67])).toBeNull();
    expect(smoothTopLineShare([])).toBeNull();
    expect(hasSmoothTopLine([67])).toBe(false);
    // 3 of 4 changes by 2 or less: exactly 75%.
    expect(smoothTopLineShare([67, 69, 67, 72, 71])).toBe(0.75);
    expect(hasSmoothTopLine([67, 69, 67, 72, 71])).toBe(true);
  });
});

describe("the clean-playing part of the score", () => {
  it("is full when nothing could be flagged, and the flagged share otherwise (RULES.md Score)", () => {
    const parts = (flaggedItems: number, items: number) =>
      scoreParts({
        chordCount: 1,
        smoothness: 1,
        flaggedItems,
        items,
        distinctTechniques: 0,
        steadiness: 1,
        accuracy: null,
      });
    expect(parts(0, 0).cleanliness).toBe(1);
    expect(parts(1, 4).cleanliness).toBe(0.75);
  });
});

describe("the search budget", () => {
  it("refuses a negative size and accepts none at all", () => {
    expect(() => new Budget(-1)).toThrow(RangeError);
    expect(() => new Budget(Number.NaN)).toThrow("a budget needs a non-negative number of steps");
    expect(new Budget(0).remaining).toBe(0);
  });

  it("spending exactly the budget is allowed; one step more is too complex", () => {
    const b = new Budget(10);
    b.spend(4);
    expect(b.remaining).toBe(6);
    b.spend(6);
    expect([b.spent, b.remaining]).toEqual([10, 0]);
    expect(() => b.spend()).toThrow(AnalysisError);
    expect(b.remaining).toBe(0);
  });
});
