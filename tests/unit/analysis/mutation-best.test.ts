// The helpers of best motion (RULES.md rule 8 and the terms it uses) at their exact bounds:
// when a voicing needs two hands, which bass a two-hand voicing keeps, and rule 8's tie-break.
// Every expected value is worked by hand from the rule or term named beside it.
import { describe, expect, it } from "vitest";
import { beatsOnTie, bestMotion, isTwoHand, keptBass } from "../../../app/analysis/bestMotion";
import { motion } from "../../../app/analysis/voiceLeading";

describe("two-hand voicings (RULES.md terms)", () => {
  it("a span of more than 16 semitones needs two hands; 16 does not", () => {
    expect(isTwoHand([48, 64])).toBe(false); // C3 E4: 16
    expect(isTwoHand([48, 65])).toBe(true); // C3 F4: 17
    expect(isTwoHand([64, 48, 52])).toBe(false); // unsorted C3 E3 E4: gap 4, span 16
  });

  it("a detached bass (7 or more below the next note, three or more notes) needs two hands", () => {
    expect(isTwoHand([48, 55, 59, 62])).toBe(true); // C3, then G3 B3 D4: gap 7
    expect(isTwoHand([48, 54, 58, 62])).toBe(false); // gap 6, span 14
    expect(isTwoHand([48, 55])).toBe(false); // two notes: no detached bass, span 7
    expect(isTwoHand([55, 48, 48, 59, 62])).toBe(true); // repeated notes count once
  });
});

describe("the bass a two-hand voicing keeps (RULES.md rules 6 and 8)", () => {
  it("a left-hand octave 7 or more below the next note is kept with the bass", () => {
    expect(keptBass([36, 48, 55, 60, 64])).toEqual([36, 48]); // C2 C3, then G3: gap 7
    expect(keptBass([36, 48, 54, 60])).toEqual([36]); // gap 6: the octave is part of the upper structure
    expect(keptBass([36, 47, 55, 60])).toEqual([36]); // not an octave
    expect(keptBass([36, 48])).toEqual([36]); // two notes: the octave is all there is
  });

  it("a kept octave stays in the best voicing", () => {
    // C2 C3 G3 C4 E4 → F2 F3 C4 F4 A4: both two-hand, and F3 lies 7 below C4, so F2 F3 stay.
    const r = bestMotion([36, 48, 55, 60, 64], [41, 53, 60, 65, 69])!;
    expect(r.voicing.slice(0, 2)).toEqual([41, 53]);
    expect(r.motion).toBe(motion([36, 48, 55, 60, 64], r.voicing));
  });
});

describe("rule 8's tie-break", () => {
  it("the top note that moves least wins, then the lower top note, then lower note by note from the top", () => {
    // A's top is G4 (67).
    expect(beatsOnTie([60, 64, 67], [64, 67, 72], 67)).toBe(true); // top stays vs up 5
    expect(beatsOnTie([64, 67, 72], [60, 64, 67], 67)).toBe(false);
    expect(beatsOnTie([60, 65, 69], [62, 65, 65 + 0], 67)).toBe(false); // A4 (2 away) vs F4 (2 away): the lower top wins
    expect(beatsOnTie([62, 65, 65], [60, 65, 69], 67)).toBe(true);
    expect(beatsOnTie([55, 60, 67], [57, 60, 67], 67)).toBe(true); // same top, lower below it
    expect(beatsOnTie([57, 60, 67], [55, 60, 67], 67)).toBe(false);
    expect(beatsOnTie([55, 60, 67], [55, 60, 67], 67)).toBe(false); // identical: no change
    expect(beatsOnTie([60, 67], [55, 60, 67], 67)).toBe(false); // equal as far as both go
  });

  it("refuses an empty voicing", () => {
    expect(() => bestMotion([], [60])).toThrow(RangeError);
    expect(() => bestMotion([60], [])).toThrow("bestMotion needs two non-empty voicings");
  });
});
