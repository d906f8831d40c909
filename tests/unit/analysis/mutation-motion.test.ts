// Motion and its joins (RULES.md rule 7) against the rule read literally: for chords of
// different sizes, every non-decreasing map from the larger chord's notes onto the smaller's
// (each note of the larger joined to exactly one of the smaller, each of the smaller used at
// least once, no crossings), enumerated in full. Also what motion must not do: alter or accept
// empty inputs.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { motion, voiceLeadingPairs } from "../../../app/analysis/voiceLeading";

const asc = (v: readonly number[]) => [...v].sort((x, y) => x - y);

/** RULES.md rule 7 read literally, by enumeration (small chords only). */
function literalMotion(a: readonly number[], b: readonly number[]): number {
  const sa = asc(a);
  const sb = asc(b);
  if (sa.length === sb.length) return sa.reduce((s, x, i) => s + Math.abs(x - sb[i]), 0);
  const [large, small] = sa.length > sb.length ? [sa, sb] : [sb, sa];
  let best = Infinity;
  // f(k) for k = 0.. large.length - 1, non-decreasing, onto 0..small.length - 1, f(0) = 0.
  const walk = (k: number, at: number, cost: number) => {
    if (k === large.length) {
      if (at === small.length - 1) best = Math.min(best, cost);
      return;
    }
    for (const next of k === 0 ? [0] : [at, at + 1]) {
      if (next >= small.length) continue;
      // Enough notes must be left to reach the smaller chord's top note.
      if (small.length - 1 - next > large.length - 1 - k) continue;
      walk(k + 1, next, cost + Math.abs(large[k] - small[next]));
    }
  };
  walk(0, 0, 0);
  return best;
}

const voicing = (max: number, min = 40, top = 90) =>
  fc.uniqueArray(fc.integer({ min, max: top }), { minLength: 1, maxLength: max });

describe("motion against rule 7 read literally (fast-check)", () => {
  it("equals the cheapest non-crossing joins, for every pair of sizes from 1 to 6", () => {
    fc.assert(
      fc.property(voicing(6), voicing(6), (a, b) => {
        expect(motion(a, b)).toBe(literalMotion(a, b));
      }),
      { numRuns: 400, seed: 7 },
    );
  });

  it("its joins add up to the motion, join every note of both chords, never cross, and use each note of the larger chord once", () => {
    fc.assert(
      fc.property(voicing(6), voicing(6), (a, b) => {
        const pairs = voiceLeadingPairs(a, b);
        expect(pairs.reduce((s, [x, y]) => s + Math.abs(x - y), 0)).toBe(motion(a, b));
        expect(new Set(pairs.map((p) => p[0]))).toEqual(new Set(a));
        expect(new Set(pairs.map((p) => p[1]))).toEqual(new Set(b));
        for (let k = 1; k < pairs.length; k++) {
          expect(pairs[k][0]).toBeGreaterThanOrEqual(pairs[k - 1][0]);
          expect(pairs[k][1]).toBeGreaterThanOrEqual(pairs[k - 1][1]);
        }
        const larger = a.length >= b.length ? 0 : 1;
        expect(pairs).toHaveLength(Math.max(a.length, b.length));
        expect(new Set(pairs.map((p) => p[larger])).size).toBe(pairs.length);
      }),
      { numRuns: 400, seed: 11 },
    );
  });

  it("also among neighbouring keys, where many joins cost the same", () => {
    fc.assert(
      fc.property(voicing(5, 58, 66), voicing(5, 58, 66), (a, b) => {
        expect(motion(a, b)).toBe(literalMotion(a, b));
        const pairs = voiceLeadingPairs(a, b);
        expect(pairs.reduce((s, [x, y]) => s + Math.abs(x - y), 0)).toBe(motion(a, b));
        expect(pairs).toHaveLength(Math.max(a.length, b.length));
        expect(new Set(pairs.map((p) => p[0]))).toEqual(new Set(a));
        expect(new Set(pairs.map((p) => p[1]))).toEqual(new Set(b));
      }),
      { numRuns: 400, seed: 13 },
    );
  });

  it("one note splitting into its neighbour and itself, and the reverse merge", () => {
    // Worked by hand from RULES.md rule 7: C4 → C4 C#4 is C4 staying and C4 going up 1.
    expect(voiceLeadingPairs([60], [60, 61])).toEqual([
      [60, 60],
      [60, 61],
    ]);
    expect(voiceLeadingPairs([60, 61], [60])).toEqual([
      [60, 60],
      [61, 60],
    ]);
    expect(voiceLeadingPairs([60], [57, 60, 64])).toEqual([
      [60, 57],
      [60, 60],
      [60, 64],
    ]);
  });
});

describe("motion's inputs", () => {
  it("sorts its inputs itself and leaves the caller's arrays as they were", () => {
    // Worked by hand from RULES.md rule 7: G4 C4 E4 → E4 C4 G4 is the same C major triad: 0.
    const a = [67, 60, 64];
    const b = [64, 60, 67];
    expect(motion(a, b)).toBe(0);
    expect(voiceLeadingPairs(a, b)).toEqual([
      [60, 60],
      [64, 64],
      [67, 67],
    ]);
    // Different sizes, unsorted: C4 E4 G4 → G4 Bb4 C4 E4 is 3 (RULES.md worked example 9).
    const c = [70, 60, 67, 64];
    expect(motion(b, c)).toBe(3);
    expect(voiceLeadingPairs(b, c)).toEqual([
      [60, 60],
      [64, 64],
      [67, 67],
      [67, 70],
    ]);
    expect([a, b, c]).toEqual([
      [67, 60, 64],
      [64, 60, 67],
      [70, 60, 67, 64],
    ]);
  });

  it("refuses an empty voicing on either side", () => {
    expect(() => motion([60], [])).toThrow(RangeError);
    expect(() => motion([], [60])).toThrow(RangeError);
    expect(() => voiceLeadingPairs([60], [])).toThrow(/non-empty/);
    expect(() => voiceLeadingPairs([], [60])).toThrow(/non-empty/);
    expect(() => motion([], [])).toThrow("motion needs two non-empty voicings");
  });

  it("one note to one note is their distance", () => {
    expect(motion([60], [67])).toBe(7);
    expect(voiceLeadingPairs([60], [67])).toEqual([[60, 67]]);
  });
});
