// RULES.md rule 20: rootless voicings (3rd and 7th with two of the 5th, 9th and 13th, no root)
// are named by their own sound alone, but match a target chord whose 3rd and 7th they hold and
// which explains every note, and against it they are named by that reading. Examples worked by
// hand from RULES.md rule 20, each in its key and transposed into two others.
import { describe, expect, it } from "vitest";
import {
  isRootlessOf,
  matchProgression,
  type PlayedIdentity,
  rootlessReading,
  rootlessSymbol,
} from "../../../app/analysis/matching";
import { nameChord, romanOf, spelledSymbol } from "../../../app/analysis/naming";
import { type Key, parseKey, pc } from "../../../app/analysis/pitch";
import { parseProgression } from "../../../app/analysis/progression";

/** What the engine hands matching for a played voicing (bass = its lowest note). */
function played(pitches: number[]): PlayedIdentity {
  const name = nameChord(pitches, pitches[0]);
  return {
    root: name.rootPc,
    triad: name.triad,
    bass: pc(pitches[0]),
    pcs: [...new Set(pitches.map(pc))].sort((a, b) => a - b),
  };
}

const KEYS: Array<[string, number]> = [
  ["C", 0],
  ["F", 5],
  ["A", -3],
];
const up = (pitches: number[], t: number) => pitches.map((p) => p + t);

// Left-hand rootless ii–V–I in C, in either order (3rd or 7th at the bottom)
const DM9 = [53, 57, 60, 64]; // F A C E: 3rd, 5th, 7th, 9th of D minor
const G13 = [53, 57, 59, 64]; // F A B E: 7th, 9th, 3rd, 13th of G
const CMAJ9 = [52, 55, 59, 62]; // E G B D: 3rd, 5th, 7th, 9th of C

describe("rootless ii7 V7 Imaj7", () => {
  it.each(KEYS)("F A C E, F A B E, E G B D match ii7 V7 Imaj7 in C, and transposed in %s: accuracy 100%%", (k, t) => {
    const key = parseKey(k);
    const target = parseProgression("ii7 V7 Imaj7", key);
    const take = [DM9, G13, CMAJ9].map((v) => played(up(v, t)));
    const r = matchProgression(take, target);
    expect(r).toMatchObject({ accuracy: 1, matched: 3, mismatches: [] });
    expect(r.rootless).toEqual([
      { playedIndex: 0, targetIndex: 0 },
      { playedIndex: 1, targetIndex: 1 },
      { playedIndex: 2, targetIndex: 2 },
    ]);
  });

  it.each(KEYS)("against its target each is named by that reading (%s)", (k, t) => {
    const key = parseKey(k);
    const target = parseProgression("ii7 V7 Imaj7", key);
    const symbols = [DM9, G13, CMAJ9].map((v, i) => rootlessSymbol(up(v, t).map(pc), target[i], key));
    const roots = target.map((c) => c.symbol.replace(/(m7|7|maj7)$/, ""));
    expect(symbols).toEqual([`${roots[0]}m9`, `${roots[1]}13`, `${roots[2]}maj9`]);
  });

  it("the same voicings with the root in the bass match as plain chords (no rootless reading needed)", () => {
    const key = parseKey("C");
    const target = parseProgression("ii7 V7 Imaj7", key);
    const r = matchProgression([played([38, ...DM9]), played([43, ...G13]), played([36, ...CMAJ9])], target);
    expect(r).toMatchObject({ accuracy: 1 });
    expect(r.rootless).toBeUndefined();
  });
});

describe("B D F# A, on its own and against Imaj7 in G", () => {
  it.each([
    ["G", 0],
    ["Bb", 3],
    ["E", -3],
  ] as Array<[string, number]>)("in %s: Bm7 (iii7) alone, a rootless Gmaj9 against Imaj7, accuracy 100%%", (k, t) => {
    const key: Key = parseKey(k);
    const voicing = up([59, 62, 66, 69], t);
    const alone = nameChord(voicing, voicing[0]);
    expect(alone.rootPc).toBe(pc(key.tonic + 4));
    expect(alone.suffix).toBe("m7");
    expect(romanOf(alone, key, voicing[0])).toBe("iii7");
    const [imaj7] = parseProgression("Imaj7", key);
    expect(matchProgression([played(voicing)], [imaj7])).toMatchObject({
      accuracy: 1,
      rootless: [{ playedIndex: 0, targetIndex: 0 }],
    });
    const reading = rootlessReading(voicing.map(pc), imaj7)!;
    expect(reading.rootPc).toBe(key.tonic);
    expect(spelledSymbol(reading, key.tonic, key)).toBe(`${k}maj9`);
  });
});

describe("what is not a rootless voicing of the target", () => {
  // Parsed inside each test, never at collection, so that a mutation run knows which tests
  // reach the parser.
  const targets = () => {
    const key = parseKey("C");
    const [dm7, g7, cmaj7] = parseProgression("ii7 V7 Imaj7", key);
    const [iv] = parseProgression("IV", key);
    return { key, dm7, g7, cmaj7, iv };
  };

  it("a triad target that names no 7th: A C E G does not pass for F", () => {
    const { iv } = targets();
    expect(isRootlessOf([9, 0, 4, 7], iv)).toBe(false);
    expect(matchProgression([played([57, 60, 64, 67])], [iv]).accuracy).toBe(0);
  });

  it("no 3rd, or no 7th, or a note the target does not explain", () => {
    const { dm7, g7, cmaj7 } = targets();
    expect(isRootlessOf([2, 5, 9, 0], g7)).toBe(false); // D F A C: no B
    expect(isRootlessOf([4, 7, 11, 2], dm7)).toBe(false); // E G B D: no F, no C
    expect(isRootlessOf([4, 7, 11, 1], cmaj7)).toBe(false); // C# is no tension of Cmaj7
    expect(isRootlessOf([4, 7, 11], cmaj7)).toBe(false); // three notes: 3rd and 7th with only one more
  });

  it("a voicing that holds the root is not rootless", () => {
    const { cmaj7 } = targets();
    expect(isRootlessOf([0, 4, 7, 11], cmaj7)).toBe(false);
  });

  it("a dominant explains its altered 9ths and flat 13th (common practice): B Eb F Ab is a rootless G7", () => {
    const { g7, cmaj7 } = targets();
    // B (3rd) Eb (b13) F (7th) Ab (b9)
    expect(isRootlessOf([11, 3, 5, 8], g7)).toBe(true);
    expect(isRootlessOf([11, 3, 5, 8], cmaj7)).toBe(false);
  });

  it("a target with a slash still asks for its bass", () => {
    const { key } = targets();
    const [slash] = parseProgression("G7/D", key);
    const r = matchProgression([played(G13)], [slash]);
    expect(r.mismatches.map((m) => m.kind)).toEqual(["wrong-bass"]);
  });
});

describe("a 13th chord with or without its 9th (rule 20)", () => {
  it("G B F E matches the target V13 in C, F and A", () => {
    for (const [k, t] of KEYS) {
      const [v13] = parseProgression("V13", parseKey(k));
      expect(matchProgression([played(up([43, 59, 65, 76], t))], [v13]).accuracy, k).toBe(1);
    }
  });
});
