import { describe, expect, it } from "vitest";
import type { ChordReport } from "~/analysis/types";
import { clock, dayLabel, percent, timeLabel } from "~/utils/noteText";
import { inversionWords, mismatchWords, TECHNIQUE_WORDS } from "./takeWords";
import { TECHNIQUES } from "~/analysis/types";

const chord = (symbol: string | null, noteNames: string[]) => ({ symbol, noteNames }) as unknown as ChordReport;

describe("take words", () => {
  it("names inversions by RULES.md rule 5, using the hand's inversion over a detached bass", () => {
    expect(inversionWords({ inversion: 0, upperInversion: null, detachedBass: null })).toBe("root position");
    expect(inversionWords({ inversion: 1, upperInversion: null, detachedBass: null })).toBe("1st inversion");
    expect(inversionWords({ inversion: null, upperInversion: null, detachedBass: null })).toBe("other bass");
    expect(inversionWords({ inversion: 0, upperInversion: 2, detachedBass: 41 })).toBe("2nd inversion");
    expect(inversionWords({ inversion: 3, upperInversion: null, detachedBass: null }, true)).toBe("3rd inv.");
  });

  it("says each kind of exercise mismatch with chord numbers counted from 1", () => {
    const chords = [chord("Eb", ["Eb4", "G4", "Bb4"]), chord(null, ["C4", "Db4"])];
    expect(
      mismatchWords({ kind: "wrong-chord", targetIndex: 1, playedIndex: 0, expected: "Bb/D", pass: 0 }, chords),
    ).toBe("Chord 2 of the exercise: played E♭, expected B♭/D.");
    expect(mismatchWords({ kind: "missing", targetIndex: 2, playedIndex: null, expected: "Cm", pass: 0 }, chords)).toBe(
      "Chord 3 of the exercise: Cm was not played.",
    );
    expect(
      mismatchWords({ kind: "extra", targetIndex: null, playedIndex: 1, expected: null, pass: null }, chords),
    ).toBe("Played chord 2: C4 D♭4 is not in the exercise.");
    expect(
      mismatchWords({ kind: "wrong-bass", targetIndex: 1, playedIndex: 0, expected: "Bb/D", pass: 0 }, chords),
    ).toContain("played E♭, expected B♭/D");
    // A take that plays the exercise three times says which time through.
    expect(
      mismatchWords({ kind: "wrong-chord", targetIndex: 2, playedIndex: 0, expected: "Db", pass: 1 }, chords, 3),
    ).toBe("Second time through, chord 3: played E♭, expected D♭.");
  });

  it("has plain words for every technique the engine names", () => {
    for (const t of TECHNIQUES) expect(TECHNIQUE_WORDS[t].label.length).toBeGreaterThan(3);
  });
});

describe("dates and figures print the same on server and browser", () => {
  it("formats in UTC, whatever the local zone", () => {
    expect(dayLabel("2026-12-01T23:30:00Z")).toBe("1 Dec 2026");
    expect(timeLabel("2026-12-01T08:05:00Z")).toBe("1 Dec 2026, 08:05 UTC");
    expect(dayLabel("not a date")).toBe("–");
  });

  it("clock and percent", () => {
    expect([clock(0), clock(65.9), clock(600)]).toEqual(["0:00", "1:05", "10:00"]);
    expect([percent(0.286), percent(1), percent(null)]).toEqual(["29%", "100%", "–"]);
  });
});
