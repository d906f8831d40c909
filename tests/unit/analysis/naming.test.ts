// RULES.md rules 4–6: naming, inversion and voicing, with tonal as the outside reference.
import { Chord, Note } from "tonal";
import { describe, expect, it } from "vitest";
import { chordReport } from "../../../app/analysis/chords";
import { inversionOf, nameChord, romanOf } from "../../../app/analysis/naming";
import { parseKey, pc } from "../../../app/analysis/pitch";
import { parseProgression } from "../../../app/analysis/progression";
import type { Strike } from "../../../app/analysis/strikes";

function chord(pitches: number[], keyName: string | null = "C") {
  const s: Strike = {
    start: 0,
    notes: pitches.map((midi) => ({ midi, start: 0, end: 1, velocity: 0.7 })),
    graces: [],
    held: [],
  };
  return chordReport(s, keyName ? parseKey(keyName) : null, []);
}

/** Pitch classes tonal gives for a symbol (tonal's `Chord.get`, npm package `tonal` 6.5.1). */
const tonalPcs = (symbol: string) => new Set(Chord.get(symbol).notes.map((n) => Note.chroma(n)));
const ourPcs = (pitches: number[]) => new Set(pitches.map(pc));

describe("rule 4: naming", () => {
  // RULES.md tie-break examples.
  it("A C F is F/A, not Am#5 (readings without an altered fifth first)", () => {
    const c = chord([57, 60, 65], "F");
    expect(c.symbol).toBe("F/A");
    expect(c.root).toBe("F");
    expect(c.bass).toBe("A");
    // tonal itself lists Am#5 first: our tie-break, not tonal's order, decides.
    expect(Chord.detect(["A", "C", "F"])[0]).toBe("Am#5");
  });

  it("C E G A is C6, not Am7/C (then a reading whose root is the bass)", () => {
    expect(chord([60, 64, 67, 69]).symbol).toBe("C6");
    // Transposed: the same shape a tone higher in D.
    expect(chord([62, 66, 69, 71], "D").symbol).toBe("D6");
  });

  it("the other way round: A C E G with A in the bass is Am7", () => {
    expect(chord([57, 60, 64, 67]).symbol).toBe("Am7");
  });

  it.each([
    [[53, 57, 60], "F", "F"],
    [[58, 61, 65, 68], "Ab", "Bbm7"],
    [[57, 60, 65, 67], "F", "Fadd9/A"],
    [[48, 53, 55, 58], "F", "C7sus4"],
    [[59, 62, 65], "C", "Bdim"],
    [[52, 55, 58, 62], "F", "Em7b5"],
    [[60, 64, 67, 71], "C", "Cmaj7"],
    [[62, 65, 69, 72], "C", "Dm7"],
    [[55, 59, 62, 65], "C", "G7"],
    [[43, 55, 58, 62, 69], "Gm", "Gmadd9"],
    [[50, 58, 62, 65], "Bb", "Bb/D"],
    [[46, 55, 60, 63], "Eb", "Cm7/Bb"],
    [[57, 60, 63, 67], "Gm", "Am7b5"],
    [[62, 66, 69, 72], "Gm", "D7"],
    [[61, 65, 68], "Db", "Db"],
    [[66, 70, 73], "F#", "F#"],
  ])("%j in %s is %s, and tonal gives the same pitch classes for that symbol", (pitches, key, symbol) => {
    const c = chord(pitches, key);
    expect(c.symbol).toBe(symbol);
    expect(tonalPcs(c.symbol!)).toEqual(ourPcs(pitches));
  });

  it("spells in the key: the same pitches are Bb in F and A# in B", () => {
    expect(chord([58, 62, 65], "F").symbol).toBe("Bb");
    expect(chord([58, 62, 65], "B").symbol).toBe("A#");
    expect(chord([58, 62, 65], "F").topNoteName).toBe("F4");
  });

  it("a chord no reading fits has root, symbol and inversion null and is still reported", () => {
    const c = chord([60, 61, 62]);
    expect([c.root, c.symbol, c.inversion, c.roman]).toEqual([null, null, null, null]);
    expect(c.notes).toEqual([60, 61, 62]);
    expect(c.bass).toBe("C");
  });

  it("reads past tonal joining root and alias ('A' + 'b9sus' printed as 'Ab9sus'), in any key", () => {
    // D E G A Bb over D: tonal's detect lists "Ab9sus/D", which is A with the alias b9sus.
    for (const t of [0, -1, 5]) {
      const pitches = [62, 64, 67, 69, 70].map((n) => n + t);
      const c = chord(pitches, null);
      expect(c.quality).toBe("suspended fourth flat ninth");
      expect(tonalPcs(c.symbol!)).toEqual(ourPcs(pitches));
    }
    expect(chord([62, 64, 67, 69, 70], null).symbol).toBe("A7b9sus4/D");
  });

  it("caches by pitch-class set and bass: octave placement does not change the name", () => {
    expect(nameChord([48, 64, 79], 48)).toBe(nameChord([60, 67, 76], 60));
    expect(nameChord([52, 60, 67], 52)).not.toBe(nameChord([60, 64, 67], 60));
  });
});

describe("Roman numerals in the key", () => {
  it.each([
    ["D", [62, 66, 69], "I"],
    // Inversions take figured-bass figures (RULES.md rule 21; Kostka & Payne, from memory):
    // G/D is IV64, A/C♯ is V6.
    ["D", [62, 67, 71], "IV64"],
    ["D", [61, 64, 69], "V6"],
    ["Ab", [53, 60, 68], "vi"],
    ["Gm", [57, 60, 63, 67], "iiø7"],
    ["Gm", [62, 66, 69, 72], "V7"],
    ["Gm", [55, 58, 62, 69], "iadd9"],
    ["D", [60, 64, 67], "bVII"],
    ["C", [59, 62, 65], "vii°"],
    ["Gm", [54, 57, 60], "vii°"],
    ["D", [58, 62, 65], "bVI"],
    ["Ab", [60, 64, 67], "III"],
    ["Ab", [55, 59, 62], "VII"],
    ["C", [60, 64, 67, 71], "Imaj7"],
    ["C", [62, 65, 69, 72], "ii7"],
  ])("in %s, %j is %s", (key, pitches, roman) => {
    expect(chord(pitches, key).roman).toBe(roman);
  });

  it("a chromatic root is spelled by its numeral's degree: bVI in D is Bb, vii° in G minor is F#", () => {
    expect(chord([58, 62, 65], "D").symbol).toBe("Bb");
    expect(chord([54, 57, 60], "Gm").symbol).toBe("F#dim");
    expect(chord([60, 63, 67], "E").symbol).toBe("Cm");
  });

  it("every numeral we print reads back through the exercise parser as the same chord", () => {
    const cases: Array<[string, number[]]> = [
      ["D", [62, 67, 71]],
      ["Gm", [57, 60, 63, 67]],
      ["Gm", [62, 66, 69, 72]],
      ["Gm", [55, 58, 62, 69]],
      ["D", [60, 64, 67]],
      ["C", [59, 62, 65]],
      ["Eb", [55, 60, 63, 70]],
      ["F", [48, 53, 55, 58]],
    ];
    for (const [k, pitches] of cases) {
      const c = chord(pitches, k);
      const [target] = parseProgression(c.roman!, parseKey(k));
      expect(target.root, `${c.roman} in ${k}`).toBe(nameChord(pitches, pitches[0]).rootPc);
      expect(target.triad, `${c.roman} in ${k}`).toBe(c.triad);
    }
  });

  it("no key, no numeral", () => {
    expect(chord([60, 64, 67], null).roman).toBeNull();
    expect(romanOf(nameChord([60, 61, 62], 60), parseKey("C"))).toBeNull();
  });
});

describe("rule 5: inversion", () => {
  it("by the chord tone in the bass: root 0, third 1, fifth 2, seventh 3", () => {
    expect(chord([60, 64, 67]).inversion).toBe(0);
    expect(chord([64, 67, 72]).inversion).toBe(1);
    expect(chord([67, 72, 76]).inversion).toBe(2);
    expect(chord([58, 64, 67, 72]).inversion).toBe(3);
  });

  it("null for a 9th, 6th or suspended note in the bass", () => {
    const add9 = chord([62, 64, 67, 72]);
    expect(add9.symbol).toBe("Cadd9/D");
    expect(add9.inversion).toBeNull();
    // A 6th or a suspended 4th in the bass, read against a fixed naming of the chord.
    expect(inversionOf(nameChord([60, 64, 67, 69], 60), 57)).toBeNull();
    expect(inversionOf(nameChord([60, 65, 67], 60), 53)).toBeNull();
    expect(inversionOf(nameChord([60, 65, 67], 60), 55)).toBe(2);
  });

  it("upperInversion reads the lowest note above a detached bass", () => {
    // C2 under E4 G4 C5: root in the bass, first inversion in the right hand.
    const c = chord([36, 64, 67, 72]);
    expect(c.detachedBass).toBe(36);
    expect(c.inversion).toBe(0);
    expect(c.upperInversion).toBe(1);
    expect(c.techniques).toContain("inversion");
    // Without a detached bass there is no upper inversion.
    expect(chord([60, 64, 67]).upperInversion).toBeNull();
  });
});

describe("rule 6: close or open voicing", () => {
  it("close when no chord tone fits between adjacent upper-structure notes", () => {
    expect(chord([60, 64, 67]).voicing).toBe("close");
    expect(chord([60, 64, 67, 72]).voicing).toBe("close");
    expect(chord([36, 64, 67, 72]).voicing).toBe("close"); // the detached bass does not count
  });

  it("open when one does: the close triad's middle note dropped an octave", () => {
    expect(chord([52, 60, 67]).voicing).toBe("open"); // E3 C4 G4
    expect(chord([60, 67, 76]).voicing).toBe("open");
    expect(chord([52, 60, 67]).techniques).toContain("open-voicing");
  });
});

describe("added tones and top note", () => {
  it("names the added tones", () => {
    expect(chord([60, 62, 64, 67]).addedTones).toEqual(["9"]);
    expect(chord([60, 64, 67, 69]).addedTones).toEqual(["6"]);
    expect(chord([60, 64, 67]).addedTones).toEqual([]);
  });

  it("reports the top note", () => {
    const c = chord([48, 64, 67, 74]);
    expect(c.topNote).toBe(74);
    expect(c.topNoteName).toBe("D5");
  });
});
