// Checks against outside references for voice-leading size.
import { Note, Voicing } from "tonal";
import { describe, expect, it } from "vitest";
import { bestMotion } from "../../../app/analysis/bestMotion";
import { motion } from "../../../app/analysis/voiceLeading";

/** Close voicing of pitch classes `pcs` (in the order given, first one lowest) starting at MIDI `start`'s octave. */
function close(pcs: number[], bottom: number): number[] {
  const out: number[] = [];
  let note = bottom - (((bottom % 12) - pcs[0] + 12) % 12);
  for (const p of pcs) {
    while (((note % 12) + 12) % 12 !== p || (out.length > 0 && note <= out[out.length - 1])) note++;
    out.push(note);
  }
  return out;
}

/** Every inversion of the close voicing: [0,4,7] -> [0,4,7], [4,7,0], [7,0,4]. */
function rotations(pcs: number[]): number[][] {
  return pcs.map((_, i) => [...pcs.slice(i), ...pcs.slice(0, i)]);
}

// Source: D. Tymoczko, "The Geometry of Musical Chords", Science 313 (2006), supporting
// material, and his voiceleading_utilities.py v1.0 (2015): minimal voice leading between
// pitch-class sets, taxicab norm. Rows marked † are also asserted in the tests of the
// open-source R package minVL (pmcharrison/minVL). "Same size" column, except G7 -> C
// (doubling column: sizes differ there, so our rule 7 allows the merge).
const TYMOCZKO: Array<[string, number[], number[], number]> = [
  ["C -> F †", [0, 4, 7], [5, 9, 0], 3],
  ["C -> Am", [0, 4, 7], [9, 0, 4], 2],
  ["C -> G", [0, 4, 7], [7, 11, 2], 3],
  ["C -> Em", [0, 4, 7], [4, 7, 11], 1],
  ["C -> Cm †", [0, 4, 7], [0, 3, 7], 1],
  ["C -> Dm", [0, 4, 7], [2, 5, 9], 5],
  ["F -> Bb", [5, 9, 0], [10, 2, 5], 3],
  ["Bb -> C", [10, 2, 5], [0, 4, 7], 6],
  ["C -> Db", [0, 4, 7], [1, 5, 8], 3],
  ["C -> F# †", [0, 4, 7], [6, 10, 1], 6],
  ["G7 -> C (doubling column)", [7, 11, 2, 5], [0, 4, 7], 4],
  ["Cmaj7 -> Emaj7", [0, 4, 7, 11], [4, 8, 11, 3], 4],
  ["{0,4,7,10} -> {1,3,7,10}", [0, 4, 7, 10], [1, 3, 7, 10], 2],
];

describe("best motion equals Tymoczko's minimal voice leading (Science 313, 2006)", () => {
  it.each(TYMOCZKO)("%s = %i from every close voicing, in several octaves and keys", (_name, from, to, expected) => {
    for (const t of [0, 2, 5, 7, 10]) {
      const fromT = from.map((p) => (p + t) % 12);
      const toT = to.map((p) => (p + t) % 12);
      for (const order of rotations(fromT)) {
        for (const bottom of [55, 60, 64]) {
          const a = close(order, bottom);
          const b = close(toT, 48); // B as played: any voicing of its pitch classes
          const r = bestMotion(a, b);
          expect(r, `${a} -> ${b}`).not.toBeNull();
          expect(r!.motion, `${a} -> ${b}`).toBe(expected);
          expect(r!.voicing.map((n) => n % 12).sort((x, y) => x - y)).toEqual(toT.slice().sort((x, y) => x - y));
        }
      }
    }
  });

  it("G7 -> C: D->C, F->E, G=G, B->C as Tymoczko's doubling column lists", () => {
    // G3 B3 D4 F4 -> the best C triad G3 C4 E4
    expect(bestMotion([55, 59, 62, 65], [48, 52, 55])).toEqual({ motion: 4, voicing: [55, 60, 64] });
  });
});

describe("tonal's Voicing.sequence as a second opinion", () => {
  it("C F G C from C3..C5 moves 3, 6, 3 by rule 7", () => {
    // Source: tonal (general-purpose music-theory library on npm), Voicing.sequence; RULES.md
    // lists its answer C3 E3 G3, C3 F3 A3, D3 G3 B3, E3 G3 C4.
    const voicings = Voicing.sequence(["C", "F", "G", "C"], ["C3", "C5"]);
    expect(voicings).toEqual([
      ["C3", "E3", "G3"],
      ["C3", "F3", "A3"],
      ["D3", "G3", "B3"],
      ["E3", "G3", "C4"],
    ]);
    const midi = voicings.map((v) => v.map((n) => Note.midi(n)!));
    const motions = midi.slice(1).map((v, i) => motion(midi[i], v));
    expect(motions).toEqual([3, 6, 3]);
    // tonal's choices are minimal by our best motion too
    for (let i = 1; i < midi.length; i++) expect(bestMotion(midi[i - 1], midi[i])!.motion).toBe(motions[i - 1]);
  });
});
