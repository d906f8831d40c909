// RULES.md rule 21: chords spelled from their own root, roots spelled for their function, and
// Roman numerals with quality, extensions and figures. Examples are worked by hand from
// RULES.md rule 21 unless marked; each is checked in its key and transposed into two others.
// tonal (general-purpose music-theory library on npm, 6.5.1) checks that every spelled name
// is the pitch it stands for and what a symbol means.
import fc from "fast-check";
import { Chord, Note } from "tonal";
import { describe, expect, it } from "vitest";
import {
  chordNoteNames,
  nameChord,
  needsContext,
  requiredIntervals,
  romanOf,
  rootName,
  spelledSymbol,
} from "../../../app/analysis/naming";
import { noteName, parseKey, pc } from "../../../app/analysis/pitch";
import type { SpellingContext } from "../../../app/analysis/spelling";
import { parseProgression, targetPcs } from "../../../app/analysis/progression";

const KEYS = ["C", "G", "D", "A", "E", "B", "F#", "C#", "F", "Bb", "Eb", "Ab", "Db", "Gb", "Cb"];
const MINOR_KEYS = ["Am", "Em", "Bm", "F#m", "C#m", "G#m", "Dm", "Gm", "Cm", "Fm", "Bbm", "Ebm"];

function names(pitches: number[], key: string | null, ctx?: { nextBassPc?: number; nextRootPc?: number }) {
  const k = key ? parseKey(key) : null;
  const name = nameChord(pitches, pitches[0]);
  return {
    notes: chordNoteNames(pitches, name, k, ctx),
    root: rootName(name, k, ctx),
    symbol: spelledSymbol(name, pitches[0], k, ctx),
    roman: k ? romanOf(name, k, pitches[0], ctx) : null,
  };
}

describe("a chord's notes are spelled from its own root", () => {
  it("D major is D F# A and A major is A C# E in every key, never D Gb A or Bbb", () => {
    for (const k of [...KEYS, ...MINOR_KEYS, null]) {
      expect(names([62, 66, 69], k).notes, `D in ${k}`).toEqual(["D4", "F#4", "A4"]);
      expect(names([57, 61, 64], k).notes, `A in ${k}`).toEqual(["A3", "C#4", "E4"]);
    }
  });

  it("E7 is E G# B D wherever E is foreign, and the #9 of E7#9 is F## (one letter per chord tone)", () => {
    for (const k of ["C", "F", "Bb", "Eb", "Ab", "Dm", "Gm", "Cm"]) {
      expect(names([52, 56, 59, 62], k).notes, `E7 in ${k}`).toEqual(["E3", "G#3", "B3", "D4"]);
    }
    expect(names([52, 56, 62, 67], "A").notes).toEqual(["E3", "G#3", "D4", "F##4"]);
  });

  it("a foreign root takes the spelling with fewer accidentals: A major in Gb is #II, not bbIII", () => {
    expect(names([57, 61, 64], "Gb")).toMatchObject({ root: "A", roman: "#II", symbol: "A" });
    // transposed: E major in Db, D major in Fb's enharmonic Cb
    expect(names([52, 56, 59], "Db")).toMatchObject({ root: "E", roman: "#II" });
    expect(names([50, 54, 57], "Cb")).toMatchObject({ root: "D", roman: "#II" });
  });

  it("of two foreign spellings with equally few accidentals, the flat one: bII, not #I", () => {
    expect(names([61, 65, 68], "C")).toMatchObject({ root: "Db", roman: "bII", notes: ["Db4", "F4", "Ab4"] });
    expect(names([56, 60, 63], "G")).toMatchObject({ root: "Ab", roman: "bII", notes: ["Ab3", "C4", "Eb4"] });
    expect(names([54, 58, 61], "F")).toMatchObject({ root: "Gb", roman: "bII", notes: ["Gb3", "Bb3", "Db4"] });
  });

  it("the flat one, unless it would spell the chord with double flats: F#°7 in C, not Gb Bbb Dbb Fbb", () => {
    // worked by hand from RULES.md rule 21 (fewer accidentals: the reason A is not Bbb)
    expect(names([54, 57, 60, 63], "C")).toMatchObject({
      root: "F#",
      roman: "#iv°7",
      notes: ["F#3", "A3", "C4", "Eb4"],
    });
    expect(names([61, 64, 67, 70], "G")).toMatchObject({
      root: "C#",
      roman: "#iv°7",
      notes: ["C#4", "E4", "G4", "Bb4"],
    });
    expect(names([56, 59, 62, 65], "D")).toMatchObject({
      root: "G#",
      roman: "#iv°7",
      notes: ["G#3", "B3", "D4", "F4"],
    });
    // a tie with no double flat stays flat: Gb major in C is bV
    expect(names([54, 58, 61], "C")).toMatchObject({ root: "Gb", roman: "bV" });
  });

  it("borrowed chords take the flat degree: bVII and iv", () => {
    for (const [k, bVII, iv] of [
      ["C", [58, 62, 65], [53, 56, 60]],
      ["D", [60, 64, 67], [55, 58, 62]],
      ["Ab", [54, 58, 61], [49, 52, 56]],
    ] as Array<[string, number[], number[]]>) {
      expect(names(bVII, k).roman, k).toBe("bVII");
      expect(names(iv, k).roman, k).toBe("iv");
    }
    expect(names([58, 62, 65], "C").root).toBe("Bb");
    expect(names([54, 58, 61], "Ab").root).toBe("Gb");
    expect(names([49, 52, 56], "Ab").notes).toEqual(["Db3", "Fb3", "Ab3"]);
  });

  it("every chord tone takes its own letter and names its own pitch (tonal's Note.midi), in every key", () => {
    const shapes = [
      [0, 4, 7],
      [0, 3, 7],
      [0, 3, 6, 9],
      [0, 4, 7, 10],
      [0, 4, 10],
      [0, 4, 10, 21],
      [0, 3, 6, 10],
      [0, 4, 7, 11, 14],
    ];
    for (const k of [...KEYS, ...MINOR_KEYS]) {
      for (let root = 48; root < 60; root++) {
        for (const shape of shapes) {
          const pitches = shape.map((s) => root + s);
          const spelled = names(pitches, k).notes;
          expect(
            spelled.map((n) => Note.midi(n)),
            `${pitches} in ${k}`,
          ).toEqual(pitches);
          const letters = new Set(spelled.map((n) => n[0]));
          expect(letters.size, `${spelled} in ${k}`).toBe(new Set(pitches.map(pc)).size);
        }
      }
    }
  });
});

describe("a diminished seventh is spelled by the note it leads to", () => {
  it.each([
    // E G Bb Db between Eb and Fm is E°7, #i°7, not Fb°7
    ["Eb", [52, 55, 58, 61], 5, "E", ["E3", "G3", "Bb3", "Db4"]],
    // transposed: D# F# A C between D and Em; A C Eb Gb between Ab and Bbm
    ["D", [51, 54, 57, 60], 4, "D#", ["D#3", "F#3", "A3", "C4"]],
    ["Ab", [57, 60, 63, 66], 10, "A", ["A3", "C4", "Eb4", "Gb4"]],
  ])("in %s, %j before a bass on pitch class %i is %s°7", (k, pitches, nextBass, root, spelled) => {
    const n = names(pitches, k, { nextBassPc: nextBass });
    expect(n.root).toBe(root);
    expect(n.roman).toBe("#i°7");
    expect(n.notes).toEqual(spelled);
    expect(n.symbol).toBe(`${root}dim7`);
  });

  it("the next chord's bass decides the root even when another tone is in the bass", () => {
    // Db E G Bb (Db in the bass) before Fm in Eb: still E°7, now over its 7th
    const n = names([49, 52, 55, 58], "Eb", { nextBassPc: 5 });
    expect(n.root).toBe("E");
    expect(n.symbol).toBe("Edim7/Db");
    expect(n.roman).toBe("#i°42");
  });

  it("only a diminished seventh's spelling depends on what follows", () => {
    expect(needsContext(nameChord([52, 55, 58, 61], 52))).toBe(true);
    expect(needsContext(nameChord([52, 55, 58, 62], 52))).toBe(false); // Em7b5
    expect(needsContext(nameChord([55, 59, 62, 65], 55))).toBe(false);
    // and any other chord is spelled the same whatever follows
    const g7 = nameChord([55, 59, 62, 65], 55);
    expect(chordNoteNames([55, 59, 62, 65], g7, null, { nextBassPc: 0 })).toEqual(
      chordNoteNames([55, 59, 62, 65], g7, null),
    );
  });

  it("without a fitting bass, the next chord's root: E°7 before F/A", () => {
    expect(names([52, 55, 58, 61], "Eb", { nextBassPc: 9, nextRootPc: 5 }).root).toBe("E");
    // no context: the root the naming gives, spelled with fewer accidentals
    expect(names([52, 55, 58, 61], "Eb").root).toBe("E");
  });
});

describe("Roman numerals as teachers write them", () => {
  // [pitches in C, numeral]; each is also checked a tone and a fifth higher, in D and G
  const cases: Array<[number[], string]> = [
    [[62, 65, 69, 72], "ii7"],
    [[55, 59, 65, 76], "V13"], // shell 13: root, 3rd, 7th, 13th
    [[48, 52, 55, 59, 62], "Imaj9"],
    [[55, 59, 62, 65, 70], "V7#9"],
    [[53, 57, 60, 62], "IVadd6"],
    [[43, 53, 57, 60], "IV/5"], // F/G: the bass an added tone, shown as its degree
    [[59, 62, 65, 69], "viiø7"],
    [[59, 62, 65, 68], "vii°7"],
    // figures, common practice (S. Kostka & D. Payne, Tonal Harmony, from memory)
    [[52, 55, 60], "I6"],
    [[55, 60, 64], "I64"],
    [[55, 59, 62, 65], "V7"],
    [[59, 62, 65, 67], "V65"],
    [[62, 65, 67, 71], "V43"],
    [[53, 55, 59, 62], "V42"],
    [[52, 55, 59, 60], "Imaj65"],
    [[65, 69, 71, 74], "viiø43"],
  ];

  it.each(cases)("%j in C is %s, and the same a tone and a fifth higher in D and G", (pitches, roman) => {
    for (const [k, t] of [
      ["C", 0],
      ["D", 2],
      ["G", 7],
    ] as Array<[string, number]>) {
      expect(
        names(
          pitches.map((p) => p + t),
          k,
        ).roman,
        k,
      ).toBe(roman);
    }
  });

  it.each(cases)("%j read back from %s names the same notes (tonal's Chord.get for the symbol)", (pitches, roman) => {
    const [target] = parseProgression(roman, parseKey("C"));
    expect(target.bass ?? target.root).toBe(pc(pitches[0]));
    // the target's tones are those of its lead-sheet symbol to tonal, and hold what was played
    const symbol = target.symbol.replace(/\/[A-G][#b]?$/, "");
    expect(targetPcs({ ...target, bass: null })).toEqual(
      [...new Set(Chord.get(symbol).notes.map((n) => Note.chroma(n)!))].sort((a, b) => a - b),
    );
  });

  it("minor keys: the leading-tone seventh chord and V7 in A minor, D minor and F# minor", () => {
    for (const [k, t] of [
      ["Am", 0],
      ["Dm", 5],
      ["F#m", -3],
    ] as Array<[string, number]>) {
      expect(
        names(
          [56, 59, 62, 65].map((p) => p + t),
          k,
        ).roman,
        k,
      ).toBe("vii°7");
      expect(
        names(
          [52, 56, 59, 62].map((p) => p + t),
          k,
        ).roman,
        k,
      ).toBe("V7");
      expect(
        names(
          [57, 60, 64].map((p) => p + t),
          k,
        ).roman,
        k,
      ).toBe("i");
    }
  });

  it("whatever numeral is printed reads back as the same root, triad and bass, never as an interval list", () => {
    const keys = [...KEYS, ...MINOR_KEYS];
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 0, max: 11 }), { minLength: 3, maxLength: 5 }),
        fc.integer({ min: 0, max: keys.length - 1 }),
        (pcs, ki) => {
          const pitches = pcs.map((p) => 48 + p);
          const key = parseKey(keys[ki]);
          const name = nameChord(pitches, pitches[0]);
          const roman = romanOf(name, key, pitches[0]);
          if (roman === null) return;
          expect(roman).not.toMatch(/[(),]/);
          const [target] = parseProgression(roman, key);
          expect(target.root, `${roman} in ${key.name}`).toBe(name.rootPc);
          expect(target.triad, `${roman} in ${key.name}`).toBe(name.triad);
          expect(target.bass ?? target.root, `${roman} in ${key.name}`).toBe(pc(pitches[0]));
        },
      ),
      { numRuns: 2000, seed: 21 },
    );
  });
});

describe("edges of rule 21's spelling", () => {
  const spelled = (pitches: number[], key: string | null, ctx?: SpellingContext) => {
    const k = key ? parseKey(key) : null;
    const name = nameChord(pitches, pitches[0]);
    return {
      notes: chordNoteNames(pitches, name, k, ctx),
      root: rootName(name, k, ctx),
      symbol: spelledSymbol(name, pitches[0], k, ctx),
      roman: k ? romanOf(name, k, pitches[0], ctx) : null,
    };
  };

  it("only a diminished seventh moves its root for what follows: G7 before B stays G7 (not a Bb chord)", () => {
    // B is a half step above Bb, a minor third above G: it would be a diminished seventh's target
    for (const [pitches, nextBassPc, key, names] of [
      [[55, 59, 62, 65], 11, "C", ["G3", "B3", "D4", "F4"]],
      [[57, 61, 64, 67], 1, "D", ["A3", "C#4", "E4", "G4"]],
      [[50, 54, 57, 60], 4, "G", ["D3", "F#3", "A3", "C4"]],
    ] as Array<[number[], number, string, string[]]>) {
      const s = spelled(pitches, key, { nextBassPc });
      expect(s.notes, key).toEqual(names);
      expect(s.symbol, key).toBe(`${names[0].slice(0, -1)}7`);
      expect(s.roman, key).toBe("V7");
    }
    // a chord with no name never needs the context
    expect(needsContext(nameChord([60], 60))).toBe(false);
    expect(needsContext(nameChord([55, 59, 62], 55))).toBe(false);
  });

  it("a context without a next bass or root spells a diminished seventh as it does without one", () => {
    // D F Ab B: B is a half step below C, which a missing (null) target must not stand for
    for (const key of ["C", "Eb", "A"]) {
      const none = spelled([62, 65, 68, 71], key);
      expect(spelled([62, 65, 68, 71], key, { nextBassPc: null, nextRootPc: null }), key).toEqual(none);
      expect(spelled([62, 65, 68, 71], key, { nextBassPc: undefined }), key).toEqual(none);
    }
  });

  it("a leading tone that would need a double sharp is spelled with fewer accidentals: G°7 before G#m in E, not F##°7", () => {
    // rule 21 (fewer accidentals, as A, not Bbb): the root a half step below G# on the letter F
    // would be F##; G is the spelling with fewer accidentals
    expect(spelled([55, 58, 61, 64], "E", { nextBassPc: 8 })).toMatchObject({
      root: "G",
      notes: ["G3", "Bb3", "Db4", "Fb4"],
    });
    // transposed: A°7 before A#m in F# (not G##°7), D°7 before D#m in B (not C##°7)
    expect(spelled([57, 60, 63, 66], "F#", { nextBassPc: 10 }).root).toBe("A");
    expect(spelled([62, 65, 68, 71], "B", { nextBassPc: 3 }).root).toBe("D");
    // a single sharp is kept: D#°7 before Em in G (rule 21's example shape)
    expect(spelled([51, 54, 57, 60], "G", { nextBassPc: 4 }).root).toBe("D#");
  });

  it("a foreign root whose flat spelling needs a double flat takes the sharp one: F#m in C, not Gb Bbb Db", () => {
    for (const [pitches, key, root, names] of [
      [[54, 57, 61], "C", "F#", ["F#3", "A3", "C#4"]],
      [[54, 57, 61], "Bb", "F#", ["F#3", "A3", "C#4"]],
      [[59, 62, 66], "F", "B", ["B3", "D4", "F#4"]],
    ] as Array<[number[], string, string, string[]]>) {
      expect(spelled(pitches, key), key).toMatchObject({ root, notes: names });
      // tonal agrees that these are the chord's pitches
      expect(
        names.map((n) => Note.midi(n)),
        key,
      ).toEqual(pitches);
    }
  });

  it("single accidentals do not count against the flat spelling: G#/Ab minor in C is Ab Cb Eb (the flat one on a tie)", () => {
    expect(spelled([56, 59, 63], "C")).toMatchObject({ root: "Ab", notes: ["Ab3", "Cb4", "Eb4"] });
    // transposed: Eb minor in G, Db minor in F
    expect(spelled([51, 54, 58], "G")).toMatchObject({ root: "Eb", notes: ["Eb3", "Gb3", "Bb3"] });
    expect(spelled([49, 52, 56], "F")).toMatchObject({ root: "Db", notes: ["Db3", "Fb3", "Ab3"] });
  });

  it("a root in the key keeps the key's letter even when its chord needs a double flat: Bb°7 in F", () => {
    expect(spelled([58, 61, 64, 67], "F")).toMatchObject({ root: "Bb", notes: ["Bb3", "Db4", "Fb4", "Abb4"] });
    expect(spelled([51, 54, 57, 60], "Bb")).toMatchObject({ root: "Eb", notes: ["Eb3", "Gb3", "Bbb3", "Dbb4"] });
  });

  it("a natural foreign root stays natural: F°7 in G is F Ab Cb Ebb, not E# G# B D", () => {
    // fewer accidentals on the root first (rule 21); the double-flat test is only between two
    // roots of one accidental each
    expect(spelled([53, 56, 59, 62], "G")).toMatchObject({ root: "F", notes: ["F3", "Ab3", "Cb4", "Ebb4"] });
    expect(spelled([60, 63, 66, 69], "D")).toMatchObject({ root: "C", notes: ["C4", "Eb4", "Gb4", "Bbb4"] });
  });

  it("no tone is spelled with three accidentals: Cb°7 in Gb spells its 7th as the key does (Ab, not Bbbb)", () => {
    const s = spelled([59, 62, 65, 68], "Gb");
    expect(s.root).toBe("Cb");
    // Cb4 is MIDI 59: octave numbers go with the letter (tonal's Note.midi agrees below)
    expect(s.notes).toEqual(["Cb4", "Ebb4", "Gbb4", "Ab4"]);
    expect(s.notes.map((n) => Note.midi(n))).toEqual([59, 62, 65, 68]);
  });

  it("notes outside the named chord, and every note of a chord with no name, are spelled as noteName spells them", () => {
    const c = parseKey("C");
    expect(chordNoteNames([60, 64, 67, 61], nameChord([60, 64, 67], 60), c)).toEqual([
      "C4",
      "E4",
      "G4",
      noteName(61, c),
    ]);
    const unnamed = nameChord([60, 61], 60);
    expect(unnamed.rootPc).toBeNull();
    expect(chordNoteNames([60, 61], unnamed, c)).toEqual([noteName(60, c), noteName(61, c)]);
    expect(spelledSymbol(unnamed, 60, c)).toBeNull();
    expect(rootName(unnamed, c)).toBeNull();
    expect(romanOf(unnamed, c, 60)).toBeNull();
  });

  it("a chord with a root but no triad (a bare fifth) has no required tones and no Roman numeral", () => {
    const fifth = nameChord([48, 55], 48);
    expect(fifth.rootPc).toBe(0);
    expect(fifth.triad).toBeNull();
    expect(requiredIntervals(fifth)).toEqual([]);
    expect(romanOf(fifth, parseKey("C"), 48)).toBeNull();
    expect(romanOf(fifth, parseKey("C"))).toBeNull();
  });

  it("without a bass an added sixth stays in the numeral: Eb6 in Bb is IVadd6 (bass unknown, or on the root)", () => {
    for (const [pitches, key] of [
      [[51, 55, 58, 60], "Bb"],
      [[53, 57, 60, 62], "C"],
      [[55, 59, 62, 64], "D"],
    ] as Array<[number[], string]>) {
      const k = parseKey(key);
      const name = nameChord(pitches, pitches[0]);
      expect(romanOf(name, k), key).toBe("IVadd6");
      expect(romanOf(name, k, null), key).toBe("IVadd6");
      expect(romanOf(name, k, pitches[0]), key).toBe("IVadd6");
    }
  });

  it("a major seventh in the bass takes the figure 42: Cmaj7 over B is Imaj42 (common practice figures)", () => {
    // figured bass: the seventh in the bass is 4/2 (S. Kostka & D. Payne, Tonal Harmony, from memory)
    expect(spelled([47, 52, 55, 60], "C").roman).toBe("Imaj42");
    expect(spelled([54, 59, 62, 67], "G").roman).toBe("Imaj42");
    expect(spelled([52, 57, 60, 65], "F").roman).toBe("Imaj42");
  });
});
