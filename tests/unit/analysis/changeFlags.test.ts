// Change flags (RULES.md rules 9 and 10) on RULES.md's worked examples. Inversions are given by
// hand here (naming belongs to the engine): F, Bb, C, G, Dm7, G7, C, F in root position, C/F etc.
import { describe, expect, it } from "vitest";
import { isRootPositionLeap, isTopLineLeap, rightHandPart } from "../../../app/analysis/changeFlags";

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

// Rule 9 on the right hand (worked by hand from RULES.md rule 9): between two-hand voicings
// only the notes above each voicing's widest gap count, whatever the left hand does. Roots are
// pitch classes (C 0, G 7, F 5, ...), as naming gives them.
describe("root-position leap on the right hand (rule 9, two-hand voicings)", () => {
  it.each([0, 5, -3])("left C3 -> G2, right C4 E4 G4 -> G4 B4 D5 is a block leap (transposed %i)", (t) => {
    const a = shift([48, 60, 64, 67], t);
    const b = shift([43, 67, 71, 74], t);
    const rootA = (0 + t + 12) % 12;
    const rootB = (7 + t + 12) % 12;
    expect(isRootPositionLeap(a, b, 0, 0, rootA, rootB)).toBe(true);
    expect(isRootPositionLeap(b, a, 0, 0, rootB, rootA)).toBe(true);
    // judged on whole voicings (the first edition), the left hand moving the other way hid it
    expect(isRootPositionLeap(a, b, 0, 0)).toBe(false);
  });

  it.each([0, 2, -7])("the right hand decides, not the left (transposed %i)", (t) => {
    // right hand F4 A4 C5 -> Bb4 D5 F5 (root position, every note up 5), left F2 -> Bb1 or held
    expect(
      isRootPositionLeap(
        shift([41, 65, 69, 72], t),
        shift([34, 70, 74, 77], t),
        0,
        0,
        (5 + t + 12) % 12,
        (10 + t + 12) % 12,
      ),
    ).toBe(true);
    // right hand not in root position: A4 C5 F5 -> Bb4 D5 F5 over the same basses
    expect(
      isRootPositionLeap(
        shift([41, 69, 72, 77], t),
        shift([34, 70, 74, 77], t),
        0,
        0,
        (5 + t + 12) % 12,
        (10 + t + 12) % 12,
      ),
    ).toBe(false);
    // the right hand moves less than 3 in one voice: C4 E4 G4 -> B3 D4 G4 over C3 -> G2
    expect(
      isRootPositionLeap(
        shift([48, 60, 64, 67], t),
        shift([43, 59, 62, 67], t),
        0,
        0,
        (0 + t + 12) % 12,
        (7 + t + 12) % 12,
      ),
    ).toBe(false);
  });

  it("keeps RULES.md's worked examples of two-hand voicings as they were", () => {
    // roots: Am 9, F 5, Dm7 2, G7 7, C 0 (worked by hand from RULES.md rule 9)
    expect(isRootPositionLeap([45, 60, 64, 69], [41, 60, 65, 69], 0, 0, 9, 5)).toBe(false);
    expect(isRootPositionLeap([50, 60, 65, 69], [43, 59, 62, 65], 0, 0, 2, 7)).toBe(false);
    expect(isRootPositionLeap([48, 60, 64, 67], [41, 53, 57, 60], 0, 0, 0, 5)).toBe(true);
  });

  it("takes the right hand above the widest gap, the higher of two equal ones", () => {
    expect(rightHandPart([36, 48, 60, 64, 67])).toEqual([60, 64, 67]); // C2 C3 | C4 E4 G4
    expect(rightHandPart([43, 67, 71, 74])).toEqual([67, 71, 74]);
    expect(rightHandPart([48, 52, 67])).toEqual([67]);
  });
});

// Rule 10 from the melody (worked by hand from RULES.md rule 10): the leap is measured from
// the last top-voice note before the change.
describe("top-line leap from the last top-voice note (rule 10)", () => {
  it.each([0, 4, -5])("measures from the melody's last note, not the previous voicing's top (transposed %i)", (t) => {
    // previous voicing topped by G5, the melody then fell to A4; the new voicing tops at F5
    expect(isTopLineLeap(69 + t, 77 + t)).toBe(true); // A4 -> F5: 8
    expect(isTopLineLeap(79 + t, 77 + t)).toBe(false); // G5 -> F5 as voicings alone: 2
    // previous voicing topped by E4, the melody rose to E5; the new voicing tops at F5
    expect(isTopLineLeap(76 + t, 77 + t)).toBe(false);
    expect(isTopLineLeap(64 + t, 77 + t)).toBe(true);
  });
});
