// RULES.md rules 4 and 20: the chords of the trade added to tonal's own dictionary, and the
// tie-break that orders readings. Every example is checked in its key and transposed into two
// others; symbols are compared by pitch class (root, suffix, bass) where spelling is not the
// point. tonal (general-purpose music-theory library on npm, 6.5.1) is the outside reference
// for what a symbol means.
import fc from "fast-check";
import { Chord, ChordType, Note } from "tonal";
import { describe, expect, it } from "vitest";
import { displaySuffix, registerTradeChords } from "../../../app/analysis/chordDictionary";
import { inversionOf, nameChord, spelledSymbol } from "../../../app/analysis/naming";
import { pc } from "../../../app/analysis/pitch";

/** Transpositions every example is checked in: as written, up a fourth, down a minor third. */
const SHIFTS = [0, 5, -3];

function symbolOf(pitches: number[]): string | null {
  return spelledSymbol(nameChord(pitches, pitches[0]), pitches[0], null);
}

/** A symbol by pitch class: root, suffix and bass (the bass is the root when there is no slash). */
function parts(symbol: string): { root: number; suffix: string; bass: number } {
  const m = /^([A-G][#b]*)(.*?)(?:\/([A-G][#b]*))?$/.exec(symbol)!;
  const root = Note.chroma(m[1])!;
  return { root, suffix: m[2], bass: m[3] ? Note.chroma(m[3])! : root };
}

/** Expects the chord, moved by each shift, to read as `symbol` moved by the same shift. */
function expectNamed(pitches: number[], symbol: string) {
  const want = parts(symbol);
  for (const t of SHIFTS) {
    const moved = pitches.map((p) => p + t);
    const got = symbolOf(moved);
    expect(got, `${moved.join(" ")}`).not.toBeNull();
    const have = parts(got!);
    expect(have, `${moved.join(" ")} read as ${got}`).toEqual({
      root: pc(want.root + t),
      suffix: want.suffix,
      bass: pc(want.bass + t),
    });
  }
}

const pcsOf = (pitches: number[]) => [...new Set(pitches.map(pc))].sort((a, b) => a - b);
/** tonal's pitch classes for a symbol (`Chord.get(symbol).notes`). */
const tonalPcs = (symbol: string) =>
  [...new Set(Chord.get(symbol).notes.map((n) => Note.chroma(n)!))].sort((a, b) => a - b);

describe("rule 4's tie-break, worked by hand from RULES.md rule 4", () => {
  it.each([
    // (a) no altered fifth: A C F is F/A, not Am#5
    [[57, 60, 65], "F/A"],
    // (a′) whole triad before a shell: C E A is Am/C, not a C6 shell; Ab C F is Fm/Ab
    [[60, 64, 69], "Am/C"],
    [[56, 60, 65], "Fm/Ab"],
    // (b) root in the bass: C E G A is C6, not Am7/C
    [[60, 64, 67, 69], "C6"],
    // (d) nearest root above the bass: F# B E stays Bsus4/F#
    [[54, 59, 64], "Bsus4/F#"],
  ])("%j is %s in three keys", (pitches, symbol) => {
    expectNamed(pitches, symbol);
  });

  it.each([
    // rule 4's lead-sheet symbols
    [[53, 57, 60], "F"],
    [[58, 61, 65, 68], "Bbm7"],
    [[57, 60, 65, 67], "Fadd9/A"],
    [[48, 53, 55, 58], "C7sus4"],
    [[59, 62, 65], "Bdim"],
    [[52, 55, 58, 62], "Em7b5"],
    [[52, 56, 59, 62, 67], "E7#9"],
    [[57, 61, 64, 67, 71, 66], "A13"],
  ])("%j is %s in three keys", (pitches, symbol) => {
    expectNamed(pitches, symbol);
  });

  it("the shells that lose to a whole triad are in the dictionary all the same (tonal's ChordType.get)", () => {
    expect(ChordType.get("6no5").intervals).toEqual(["1P", "3M", "6M"]);
    expect(ChordType.get("m6no5").intervals).toEqual(["1P", "3m", "6M"]);
  });
});

describe("rule 20: shells without a fifth, worked by hand from RULES.md rule 20", () => {
  it.each([
    // E G# D is E7 (root, 3rd, 7th), in either order of 3rd and 7th
    [[52, 56, 62], "E7"],
    [[40, 50, 56], "E7"],
    [[45, 49, 56], "Amaj7"],
    [[41, 57, 63], "F7"],
    [[48, 51, 58], "Cm7"],
    [[48, 58, 63], "Cm7"],
  ])("%j is %s in three keys", (pitches, symbol) => {
    expectNamed(pitches, symbol);
  });

  it("a shell with a 3rd has its triad's quality, and its 3rd and 7th in the bass are inversions 1 and 3", () => {
    for (const t of SHIFTS) {
      const e7 = nameChord([52 + t, 56 + t, 62 + t], 52 + t);
      expect(e7.triad).toBe("major");
      expect(nameChord([48 + t, 51 + t, 58 + t], 48 + t).triad).toBe("minor");
      // G#–D–E: the 3rd in the bass; D–E–G#: the 7th (RULES.md rule 5)
      expect(inversionOf(nameChord([56 + t, 62 + t, 64 + t], 56 + t), 56 + t)).toBe(1);
      expect(inversionOf(nameChord([50 + t, 52 + t, 56 + t], 50 + t), 50 + t)).toBe(3);
    }
  });

  it("each shell holds tonal's full chord less its fifth (tonal's Chord.get as reference)", () => {
    for (const [pitches, full] of [
      [[52, 56, 62], "E7"],
      [[45, 49, 56], "Amaj7"],
      [[48, 51, 58], "Cm7"],
    ] as Array<[number[], string]>) {
      const fifth = pc(Note.chroma(Chord.get(full).tonic!)! + 7);
      expect(tonalPcs(full).filter((p) => p !== fifth)).toEqual(pcsOf(pitches));
      expect(symbolOf(pitches)).toBe(full);
    }
  });
});

describe("rule 20: altered and extended chords of the trade", () => {
  it.each([
    // full chords: the symbol means exactly these pitch classes to tonal
    [[52, 56, 59, 62, 67], "E7#9"],
    [[60, 64, 67, 70, 61], "C7b9"],
    [[60, 64, 67, 70, 66], "C7#11"],
    [[57, 61, 64, 67, 71, 66], "A13"],
    [[60, 65, 67, 70, 62], "C9sus4"],
    [[60, 64, 67, 69, 62], "C69"],
    [[60, 63, 67, 69, 62], "Cm69"],
    [[60, 64, 67, 71, 66], "Cmaj7#11"],
  ])("%j is %s in three keys, the pitch classes tonal gives that symbol", (pitches, symbol) => {
    expectNamed(pitches, symbol);
    for (const t of SHIFTS) {
      const moved = pitches.map((p) => p + t);
      expect(tonalPcs(symbolOf(moved)!)).toEqual(pcsOf(moved));
    }
  });

  it.each([
    // without the fifth (the first tone a pianist leaves out; common practice)
    [[52, 56, 62, 67], "E7#9"],
    [[60, 64, 70, 61], "C7b9"],
    [[60, 64, 70, 68], "C7b13"],
    // 13 with and without its 5th and 9th
    [[57, 61, 67, 66], "A13"],
    [[57, 61, 67, 71, 66], "A13"],
    [[57, 61, 64, 67, 66], "A13"],
    [[60, 64, 67, 70, 69], "C13"],
    // maj7#11 without its 5th: F A B E (the B a #11, not a Cb)
    [[53, 57, 59, 64], "Fmaj7#11"],
  ])("%j is %s in three keys", (pitches, symbol) => {
    expectNamed(pitches, symbol);
  });

  it("a stack of four fourths takes its root-position reading: C F Bb Eb is Cm11 (no 5th, no 9th)", () => {
    expectNamed([48, 53, 58, 63], "Cm11");
    expectNamed([52, 57, 62, 67], "Em11");
    // tonal's own reading puts the quartal type first and F7sus4/C after it: ours prints it as m11
    expect(Chord.detect(["C", "F", "Bb", "Eb"])).toContain("F7sus4/C");
    expect(nameChord([48, 53, 58, 63], 48).triad).toBe("minor");
  });
});

describe("rule 20: added through tonal's own dictionary", () => {
  it("tonal's Chord.detect finds the added shells by itself", () => {
    expect(Chord.detect(["C", "E", "B"])).toContain("Cmaj7no5");
    expect(Chord.detect(["C", "Eb", "Bb"])).toContain("Cm7no5");
    expect(Chord.detect(["A", "C#", "F#", "G"])).toContain("A13no5no9");
  });

  it("registering again adds nothing and leaves tonal's own symbols as they were", () => {
    const before = ChordType.all().length;
    registerTradeChords();
    registerTradeChords();
    expect(ChordType.all().length).toBe(before);
    // tonal: E7 is still the full dominant seventh E G# B D
    expect(Chord.get("E7").notes).toEqual(["E", "G#", "B", "D"]);
    expect(Chord.get("Cmaj7").notes).toEqual(["C", "E", "G", "B"]);
  });

  it("prints shells as the chord they stand for", () => {
    expect(displaySuffix(["7no5"])).toBe("7");
    expect(displaySuffix(["13no5"])).toBe("13");
    expect(displaySuffix(["M7b9"])).toBe("maj7b9");
    expect(displaySuffix(["m7"])).toBeNull();
  });
});

describe("transposition renames consistently (rule 4 with rule 20's dictionary)", () => {
  it("any set of 2 to 6 pitch classes over any bass, moved by any interval, keeps its suffix and moves its root", () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 0, max: 11 }), { minLength: 2, maxLength: 6 }),
        fc.integer({ min: 1, max: 11 }),
        (pcs, t) => {
          const pitches = [48 + pcs[0], ...pcs.slice(1).map((p) => 60 + p)];
          const a = nameChord(pitches, pitches[0]);
          const b = nameChord(
            pitches.map((p) => p + t),
            pitches[0] + t,
          );
          expect(b.suffix).toBe(a.suffix);
          expect(b.triad).toBe(a.triad);
          expect(b.rootPc).toBe(a.rootPc === null ? null : pc(a.rootPc + t));
        },
      ),
      { numRuns: 3000, seed: 20 },
    );
  });
});
