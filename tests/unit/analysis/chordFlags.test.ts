// Chord flags (RULES.md rules 11, 12 and too-many-notes) and techniques (rules 13, 14), through
// whole chords built from hand-made strikes.
import { describe, expect, it } from "vitest";
import { chordFlags, isDoubledBassThird, raisesNoChordFlag } from "../../../app/analysis/chordFlags";
import { chordReport } from "../../../app/analysis/chords";
import { nameChord } from "../../../app/analysis/naming";
import { parseKey } from "../../../app/analysis/pitch";
import type { Strike } from "../../../app/analysis/strikes";
import { hasSmoothTopLine, smoothTopLineShare } from "../../../app/analysis/techniques";

function chord(pitches: number[], graces: Array<[number, number]> = []) {
  const mk = (midi: number) => ({ midi, start: 0, end: 1, velocity: 0.7 });
  const s: Strike = {
    start: 0,
    notes: pitches.map(mk),
    graces: graces.map(([g, t]) => ({ note: { midi: g, start: -0.09, end: 0, velocity: 0.5 }, target: mk(t) })),
    held: [],
  };
  return chordReport(s, parseKey("C"), []);
}
const transpose = (v: number[], by: number) => v.map((n) => n + by);

describe("rule 11: doubled bass third (common practice, no source)", () => {
  it("flags a major chord with its 3rd in the bass sounding again above, in any key", () => {
    for (const t of [0, 3, -4]) {
      // Bb/D: D2 | Bb3 D4 F4 — D4 is neither the top note nor D3.
      expect(chord(transpose([38, 58, 62, 65], t)).flags).toContain("doubled-bass-third");
    }
    // A dominant seventh counts too: C7/E with E doubled inside.
    expect(chord([40, 58, 60, 64, 67]).symbol).toBe("C7/E");
    expect(chord([40, 58, 60, 64, 67]).flags).toContain("doubled-bass-third");
  });

  it("allows the doubling as the top note or exactly one octave above the bass", () => {
    expect(chord([38, 58, 65, 74]).flags).not.toContain("doubled-bass-third"); // D5 on top
    expect(chord([38, 50, 58, 65]).flags).not.toContain("doubled-bass-third"); // D2 D3 octave
  });

  it("does not flag a minor chord, a root-position chord, or an undoubled third", () => {
    expect(chord([39, 55, 60, 63]).flags).toEqual([]); // Cm/Eb with Eb doubled: minor
    expect(chord([36, 60, 64, 67, 72]).flags).toEqual([]); // C in root position, root doubled
    expect(chord([38, 58, 65]).flags).toEqual([]); // Bb/D, D not doubled
    expect(isDoubledBassThird([38, 58, 62, 65], nameChord([38, 58, 62, 65], 38))).toBe(true);
  });
});

describe("rule 12: muddy low interval", () => {
  it("flags two lowest notes a third apart below the limit (M3 below Bb2) and not at it", () => {
    expect(chord([44, 48, 56, 60, 63]).flags).toContain("muddy-low-interval"); // Ab2 C3
    expect(chord([46, 50, 58, 62, 65]).flags).not.toContain("muddy-low-interval"); // Bb2 D3
  });

  it("octaves and wide intervals have no limit", () => {
    expect(chord([28, 40, 59, 64, 67]).flags).not.toContain("muddy-low-interval"); // E1 E2
    expect(chord([28, 48, 64, 67]).flags).not.toContain("muddy-low-interval"); // E1 to C3: 20 semitones
  });
});

describe("too-many-notes", () => {
  it("flags more than 8 distinct pitches, not 8", () => {
    expect(chord([48, 50, 52, 53, 55, 57, 59, 60, 62]).flags).toContain("too-many-notes");
    expect(chord([48, 50, 52, 53, 55, 57, 59, 60]).flags).not.toContain("too-many-notes");
  });

  it("the suggestion filter refuses any flagged voicing", () => {
    expect(raisesNoChordFlag([58, 62, 65])).toBe(true);
    expect(raisesNoChordFlag([38, 58, 62, 65])).toBe(false);
    expect(chordFlags([38, 58, 62, 65])).toEqual(["doubled-bass-third"]);
  });
});

describe("rule 14: chord techniques", () => {
  it("added-second: a major or minor triad with its 2nd/9th, not a sus chord", () => {
    expect(chord([60, 62, 64, 67]).techniques).toContain("added-second");
    expect(chord([43, 58, 62, 69]).techniques).toContain("added-second"); // Gm add9
    expect(chord([60, 62, 67]).techniques).not.toContain("added-second"); // Csus2: no 3rd
    expect(chord([60, 64, 67]).techniques).not.toContain("added-second");
  });

  it("inversion: inversion 1–3 without a detached bass, or upperInversion 1–3 over one", () => {
    expect(chord([64, 67, 72]).techniques).toContain("inversion");
    expect(chord([60, 64, 67]).techniques).not.toContain("inversion");
    expect(chord([36, 64, 67, 72]).techniques).toContain("inversion");
    expect(chord([36, 60, 64, 67]).techniques).not.toContain("inversion");
  });

  it("slash-bass: a detached bass that is a chord tone other than the root", () => {
    expect(chord([40, 60, 64, 67]).techniques).toContain("slash-bass"); // C/E, E2 under C4
    expect(chord([36, 60, 64, 67]).techniques).not.toContain("slash-bass"); // root below
    expect(chord([52, 55, 60]).techniques).not.toContain("slash-bass"); // no detached bass
  });

  it("grace-to-third: a grace note a half or whole step below the chord's 3rd", () => {
    expect(chord([60, 64, 67], [[63, 64]]).techniques).toContain("grace-to-third");
    expect(chord([43, 58, 62, 69], [[57, 58]]).techniques).toContain("grace-to-third"); // A → Bb in Gm
    expect(chord([60, 64, 67], [[65, 67]]).techniques).not.toContain("grace-to-third"); // into the 5th
  });
});

describe("rule 13: smooth top line", () => {
  it("needs at least 75% of changes moving the top note by 2 semitones or less", () => {
    expect(hasSmoothTopLine([69, 71, 69, 69, 74])).toBe(true); // 3 of 4
    expect(hasSmoothTopLine([69, 71, 76, 69, 74])).toBe(false); // 1 of 4
    expect(smoothTopLineShare([69, 71, 76])).toBe(0.5);
    expect(hasSmoothTopLine([69])).toBe(false);
  });
});
