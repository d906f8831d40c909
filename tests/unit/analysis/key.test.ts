// RULES.md rule 23: the key is the best correlation of pitch-class durations with the
// Krumhansl–Kessler profiles (C. Krumhansl, Cognitive Foundations of Musical Pitch, 1990; the
// profile values in key.ts are from memory), plus a bonus when the tonic is the bass of the
// first and of the last harmony; on a tie, major. Examples worked by hand from RULES.md rule 23,
// each in its key and transposed into two others.
import { describe, expect, it } from "vitest";
import { BASS_BONUS, estimateKey } from "../../../app/analysis/key";
import { nameChord } from "../../../app/analysis/naming";
import { pc } from "../../../app/analysis/pitch";

/** One note a second, each held a second. */
const notesOf = (midis: number[]) => midis.map((midi, i) => ({ midi, start: i, end: i + 1 }));

// A C E then C E G: the profiles alone hear the relative major
const A_MINOR_OR_C = [57, 60, 64, 60, 64, 67];

describe("rule 23: the bass of the first and last harmony", () => {
  it.each([
    [0, "C", "Am"],
    [2, "D", "Bm"],
    [7, "G", "Em"],
  ])("shifted by %i: the profiles alone say %s; a tonic bass at both ends says %s", (t, alone, withBass) => {
    const notes = notesOf(A_MINOR_OR_C.map((m) => m + t));
    expect(estimateKey(notes).key.name).toBe(alone);
    const minorTonic = pc(9 + t);
    const read = estimateKey(notes, [], { firstBassPc: minorTonic, lastBassPc: minorTonic });
    expect(read.key.name).toBe(withBass);
    // the bonus is added to the score, not to the correlation
    expect(read.score).toBeCloseTo(read.correlation + 2 * BASS_BONUS, 9);
  });

  it("a bass on the major tonic keeps the major reading", () => {
    for (const t of [0, 2, 7]) {
      const notes = notesOf(A_MINOR_OR_C.map((m) => m + t));
      expect(estimateKey(notes, [], { firstBassPc: pc(t), lastBassPc: pc(t) }).key.name).toBe(
        ["C", "D", "G"][[0, 2, 7].indexOf(t)],
      );
    }
  });

  it("no bass given, or a bass on no candidate tonic, changes nothing", () => {
    const notes = notesOf(A_MINOR_OR_C);
    expect(estimateKey(notes, [], {})).toEqual(estimateKey(notes));
    expect(estimateKey(notes, [], { firstBassPc: null, lastBassPc: null })).toEqual(estimateKey(notes));
  });
});

describe("rule 23: on a tie, major", () => {
  it.each([
    [0, "Eb"],
    [2, "F"],
    [7, "Bb"],
  ])(
    "Fm Eb Cm over equal pitch-class durations, Eb in the first bass, shifted by %i: the minor key and its relative major tie, the major wins (%s)",
    (t, major) => {
      // Worked by hand from key.ts's chord weights: C minor 0.5 + 0.1 + 0.1 (ends on its tonic);
      // Eb major 0.5 + 0.1 (its tonic once) + 0.1 (bass bonus); the correlation is 0 for both.
      const chromatic = notesOf([60, 61, 62, 63, 64, 65, 66, 67, 68, 69, 70, 71]);
      const triads = [
        [53, 56, 60],
        [51, 55, 58],
        [48, 51, 55],
      ].map((v) => v.map((m) => m + t));
      const chords = triads.map((v) => nameChord(v, v[0]));
      expect(estimateKey(chromatic, chords).key.mode).toBe("minor");
      const read = estimateKey(chromatic, chords, { firstBassPc: pc(3 + t) });
      expect(read.key.name).toBe(major);
      expect(read.score).toBeCloseTo(0.7, 9);
    },
  );

  it.each([
    [9, "A"],
    [2, "D"],
    [6, "F#"],
  ])(
    "all twelve pitch classes equally long, bass %i at both ends: the major and minor of that tonic tie; major wins (%s)",
    (bass, key) => {
      const chromatic = notesOf([60, 61, 62, 63, 64, 65, 66, 67, 68, 69, 70, 71]);
      const read = estimateKey(chromatic, [], { firstBassPc: bass, lastBassPc: bass });
      expect(read.key.name).toBe(key);
      expect(read.key.mode).toBe("major");
    },
  );
});
