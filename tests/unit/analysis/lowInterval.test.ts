// Low-interval limits (RULES.md rule 12). Source of the table: Lowell & Pullig, "Arranging for
// Large Jazz Ensemble", as tabulated in the open-source elm-music-theory package.
import { describe, expect, it } from "vitest";
import { isMuddyLowInterval, lowIntervalLimit } from "../../../app/analysis/lowInterval";

// interval name, semitones, limit as a note name, limit as MIDI (middle C = C4 = 60)
const TABLE: Array<[string, number, string, number]> = [
  ["m2", 1, "E3", 52],
  ["M2", 2, "Eb3", 51],
  ["m3", 3, "C3", 48],
  ["M3", 4, "Bb2", 46],
  ["P4", 5, "Bb2", 46],
  ["tritone", 6, "Bb2", 46],
  ["P5", 7, "Bb1", 34],
  ["m6", 8, "G2", 43],
  ["M6", 9, "F2", 41],
  ["m7", 10, "F2", 41],
  ["M7", 11, "F2", 41],
  ["m9", 13, "E2", 40],
  ["M9", 14, "Eb2", 39],
  ["m10", 15, "C2", 36],
  ["M10", 16, "Bb1", 34],
];

describe("low-interval limits (Lowell & Pullig via elm-music-theory)", () => {
  it.each(TABLE)("%s (%i semitones) is clear from %s (MIDI %i) up", (_name, semis, _note, midi) => {
    expect(lowIntervalLimit(semis)).toBe(midi);
    // at the limit: clear; one semitone lower: muddy
    expect(isMuddyLowInterval([midi, midi + semis, midi + semis + 7])).toBe(false);
    expect(isMuddyLowInterval([midi - 1, midi - 1 + semis, midi + semis + 7])).toBe(true);
  });

  it("has no limit for unisons, octaves and intervals wider than a major 10th", () => {
    expect(lowIntervalLimit(0)).toBeNull();
    expect(lowIntervalLimit(12)).toBeNull();
    expect(lowIntervalLimit(17)).toBeNull();
    expect(lowIntervalLimit(24)).toBeNull();
    expect(isMuddyLowInterval([24, 36, 40])).toBe(false); // C1 C2 E2: octave at the bottom
    expect(isMuddyLowInterval([24, 41, 45])).toBe(false); // an 11th
  });

  it("looks only at the two lowest notes, in any input order", () => {
    expect(isMuddyLowInterval([64, 48, 51])).toBe(false); // C3 Eb3: m3 at its limit
    expect(isMuddyLowInterval([64, 47, 50])).toBe(true); // B2 D3
    expect(isMuddyLowInterval([60])).toBe(false);
  });
});
