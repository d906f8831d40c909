// Change flags (RULES.md rules 9 and 10) on RULES.md's worked examples. Inversions are given by
// hand here (naming belongs to the engine): F, Bb, C, G, Dm7, G7, C, F in root position, C/F etc.
import { describe, expect, it } from "vitest";
import { isRootPositionLeap, isTopLineLeap } from "../../../app/analysis/changeFlags";

const shift = (v: number[], t: number) => v.map((x) => x + t);

// from, to, inversion of from, inversion of to, root-position-leap expected
const ROWS: Array<[number[], number[], number | null, number | null, boolean]> = [
  [[53, 57, 60], [58, 62, 65], 0, 0, true], // F -> Bb, every voice up 5
  [[53, 57, 60], [53, 58, 62], 0, 2, false], // F -> Bb/F
  [[60, 64, 67], [60, 65, 69], 0, 2, false], // C -> F/C
  [[60, 65, 69], [59, 62, 67], 2, 1, false], // F/C -> G/B
  [[67, 71, 74], [72, 76, 79], 0, 0, true], // G -> C, every voice up 5
  [[45, 60, 64, 69], [41, 60, 65, 69], 0, 0, false], // Am -> F, upper voices barely move
  [[50, 60, 65, 69], [43, 59, 62, 65], 0, 0, false], // Dm7 -> G7: -7, -1, -3, -4
  [[48, 60, 64, 67], [41, 53, 57, 60], 0, 0, true], // C -> F, every voice down 7
  [[60, 64, 67], [60, 64, 67, 70], 0, 0, false], // sizes differ
];

describe("root-position leap (rule 9)", () => {
  it.each(ROWS)("%j -> %j (inversions %s, %s) leap: %s, also reversed and transposed", (a, b, ia, ib, leap) => {
    for (const t of [0, -5, 4, 9]) {
      expect(isRootPositionLeap(shift(a, t), shift(b, t), ia, ib)).toBe(leap);
      expect(isRootPositionLeap(shift(b, t), shift(a, t), ib, ia)).toBe(leap);
    }
  });

  it("needs both chords in root position", () => {
    expect(isRootPositionLeap([53, 57, 60], [58, 62, 65], 1, 0)).toBe(false);
    expect(isRootPositionLeap([53, 57, 60], [58, 62, 65], 0, null)).toBe(false);
  });

  it("needs every voice to move 3 or more the same way", () => {
    expect(isRootPositionLeap([60, 64, 67], [63, 67, 70], 0, 0)).toBe(true); // +3 each
    expect(isRootPositionLeap([60, 64, 67], [62, 66, 69], 0, 0)).toBe(false); // +2 each
    expect(isRootPositionLeap([60, 64, 67], [63, 67, 64 + 12 + 3], 0, 0)).toBe(true);
    expect(isRootPositionLeap([60, 64, 67], [57, 67, 70], 0, 0)).toBe(false); // mixed directions
  });
});

describe("top-line leap (rule 10)", () => {
  it("is a top-note move of more than 7 semitones, either way", () => {
    expect(isTopLineLeap([60, 64, 67], [60, 64, 74])).toBe(false); // 7
    expect(isTopLineLeap([60, 64, 67], [60, 64, 75])).toBe(true); // 8
    expect(isTopLineLeap([60, 64, 75], [60, 64, 67])).toBe(true);
    expect(isTopLineLeap([60, 65, 69], [59, 62, 67])).toBe(false);
  });

  it("flags none of RULES.md's worked examples", () => {
    for (const [a, b] of ROWS) expect(isTopLineLeap(a, b)).toBe(false);
  });
});
