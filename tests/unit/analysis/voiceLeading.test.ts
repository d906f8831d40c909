// Motion (RULES.md rule 7), detached bass and upper structure. Values are RULES.md's worked
// examples, derived by hand from the rules; each is checked both ways and transposed.
import { describe, expect, it } from "vitest";
import { detachedBass, motion, upperStructure, voiceLeadingPairs } from "../../../app/analysis/voiceLeading";

/** RULES.md "Worked examples": from, to, motion. */
const WORKED_MOTION: Array<[number[], number[], number]> = [
  [[53, 57, 60], [58, 62, 65], 15],
  [[53, 57, 60], [53, 58, 62], 3],
  [[60, 64, 67], [60, 65, 69], 3],
  [[60, 65, 69], [59, 62, 67], 6],
  [[67, 71, 74], [72, 76, 79], 15],
  [[45, 60, 64, 69], [41, 60, 65, 69], 5],
  [[50, 60, 65, 69], [43, 59, 62, 65], 15],
  [[48, 60, 64, 67], [41, 53, 57, 60], 28],
  [[60, 64, 67], [60, 64, 67, 70], 3],
];

const shift = (v: number[], t: number) => v.map((x) => x + t);

describe("motion (rule 7)", () => {
  it.each(WORKED_MOTION)("%j -> %j moves %i semitones, both ways and transposed", (a, b, expected) => {
    for (const t of [0, -7, -2, 3, 5, 11]) {
      expect(motion(shift(a, t), shift(b, t))).toBe(expected);
      expect(motion(shift(b, t), shift(a, t))).toBe(expected);
    }
  });

  it("never lets same-sized chords split and merge: D4 F#4 A4 -> G4 B4 D5 is 15, not 13", () => {
    expect(motion([62, 66, 69], [67, 71, 74])).toBe(15);
  });

  it("sorts its inputs defensively", () => {
    expect(motion([60, 53, 57], [65, 58, 62])).toBe(15);
  });

  it("splits a note of the smaller chord when the sizes differ (G4 -> G4 and Bb4)", () => {
    expect(voiceLeadingPairs([60, 64, 67], [60, 64, 67, 70])).toEqual([
      [60, 60],
      [64, 64],
      [67, 67],
      [67, 70],
    ]);
  });

  it("merges notes of the larger chord into one (G7 to a C triad: D4 and B3 both reach C4)", () => {
    // G3 B3 D4 F4 -> G3 C4 E4: G=G, B->C 1, D->C 2, F->E 1 (Tymoczko's G7 -> C, doubling allowed: 4)
    expect(motion([55, 59, 62, 65], [55, 60, 64])).toBe(4);
    expect(voiceLeadingPairs([55, 59, 62, 65], [55, 60, 64])).toEqual([
      [55, 55],
      [59, 60],
      [62, 60],
      [65, 64],
    ]);
  });

  it("finds the cheapest non-crossing joins, not just the first ones (two notes to four)", () => {
    // C4 G4 -> B3 C4 F#4 G4: C splits to B3, C4; G splits to F#4, G4 = 1 + 0 + 1 + 0
    expect(motion([60, 67], [59, 60, 66, 67])).toBe(2);
    const pairs = voiceLeadingPairs([60, 67], [59, 60, 66, 67]);
    expect(pairs.reduce((s, [x, y]) => s + Math.abs(x - y), 0)).toBe(2);
    // every note of both chords is joined
    expect(new Set(pairs.map((p) => p[0]))).toEqual(new Set([60, 67]));
    expect(new Set(pairs.map((p) => p[1]))).toEqual(new Set([59, 60, 66, 67]));
  });

  it("voice-leading pairs always add up to the motion", () => {
    for (const [a, b, expected] of WORKED_MOTION) {
      const pairs = voiceLeadingPairs(a, b);
      expect(pairs.reduce((s, [x, y]) => s + Math.abs(x - y), 0)).toBe(expected);
    }
  });

  it("refuses an empty voicing", () => {
    expect(() => motion([], [60])).toThrow(RangeError);
  });
});

describe("detached bass and upper structure", () => {
  it("is the lowest of three or more notes lying 7 or more semitones below the next", () => {
    expect(detachedBass([45, 60, 64, 69])).toBe(45);
    expect(detachedBass([53, 60, 64])).toBe(53); // exactly 7 below
    expect(detachedBass([54, 60, 64])).toBeNull(); // 6 below
    expect(detachedBass([40, 60])).toBeNull(); // two notes only
    expect(detachedBass([64, 45, 60])).toBe(45); // unsorted input
  });

  it("upper structure drops a detached bass and keeps everything otherwise", () => {
    expect(upperStructure([43, 59, 62, 65])).toEqual([59, 62, 65]);
    expect(upperStructure([60, 64, 67])).toEqual([60, 64, 67]);
  });
});
