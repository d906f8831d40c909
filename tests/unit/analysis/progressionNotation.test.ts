// Targets as teachers write them: dashes, bar lines and the lead-sheet marks Δ, ø, -7, °.
// What each symbol means is checked against tonal's Chord.get and RomanNumeral (tonal,
// general-purpose music-theory library on npm) where tonal reads the mark; where it does not
// (Δ7, ø7 with a 7 written out, upper-case numerals with a minor mark) the meaning is
// common practice (lead-sheet notation).
import { Chord, Note, RomanNumeral } from "tonal";
import { describe, expect, it } from "vitest";
import { parseKey } from "../../../app/analysis/pitch";
import { parseProgression, progressionTokens, targetPcs } from "../../../app/analysis/progression";
import { checkProgression, usesChordSymbols } from "../../../app/utils/exerciseProgression";

const C = parseKey("C");
const pcsOfTonal = (symbol: string) =>
  [...new Set(Chord.get(symbol).notes.map((n) => Note.chroma(n)!))].sort((a, b) => a - b);
const symbols = (text: string, key = C) => parseProgression(text, key).map((c) => c.symbol);

describe("separators between chords", () => {
  it("en dash, em dash, hyphen and spaces all give the same ii V I", () => {
    for (const text of ["ii V I", "ii–V–I", "ii—V—I", "ii-V-I", "ii – V – I", "ii, V, I"]) {
      expect(progressionTokens(text), text).toEqual(["ii", "V", "I"]);
      expect(symbols(text), text).toEqual(["Dm", "G", "C"]);
    }
  });

  it("reads the numerals the way tonal's RomanNumeral does: degree 2 minor, 5 and 1 major", () => {
    const chords = parseProgression("ii–V–I", C);
    const tonal = ["ii", "V", "I"].map((r) => RomanNumeral.get(r));
    // tonal: step is the zero-based scale degree, major tells the numeral's case.
    expect(chords.map((c) => c.roman)).toEqual(tonal.map((t) => t.name));
    expect(chords.map((c) => c.triad === "major")).toEqual(tonal.map((t) => t.major));
    expect(chords.map((c) => c.root)).toEqual(tonal.map((t) => [0, 2, 4, 5, 7, 9, 11][t.step ?? 0]));
  });

  it("bar lines and repeat signs separate chords: | Dm7 | G7 | Cmaj7 | and |: … :|", () => {
    expect(symbols("| Dm7 | G7 | Cmaj7 |")).toEqual(["Dm7", "G7", "Cmaj7"]);
    expect(symbols("|: Dm7 G7 | Cmaj7 :|")).toEqual(["Dm7", "G7", "Cmaj7"]);
    expect(symbols("Dm7|G7||Cmaj7")).toEqual(["Dm7", "G7", "Cmaj7"]);
  });

  it("a hyphen between chord symbols separates them, a hyphen as minor mark does not", () => {
    expect(progressionTokens("Dm7-G7-Cmaj7")).toEqual(["Dm7", "G7", "Cmaj7"]);
    expect(progressionTokens("D-7 G7 C")).toEqual(["D-7", "G7", "C"]);
    expect(progressionTokens("D-7-G7-CΔ")).toEqual(["D-7", "G7", "CΔ"]);
    expect(progressionTokens("A- D-")).toEqual(["A-", "D-"]);
    expect(usesChordSymbols("ii–V–I")).toBe(false);
    expect(usesChordSymbols("Dm7–G7–C")).toBe(true);
  });
});

describe("lead-sheet marks", () => {
  // tonal's Chord.get reads CΔ, Cø, C-7, C-, C°, C°7 and C-Δ7: the pitch classes must agree.
  it.each([
    ["CΔ", "CΔ"],
    ["Cø", "Cø"],
    ["C-7", "C-7"],
    ["C-", "C-"],
    ["C°", "C°"],
    ["C°7", "C°7"],
    ["C-Δ7", "C-Δ7"],
    ["Bø", "Bø"],
    ["F#-7", "F#-7"],
  ])("%s holds the pitch classes tonal's Chord.get gives for %s", (ours, tonal) => {
    const [chord] = parseProgression(ours, C);
    expect(Chord.get(tonal).empty).toBe(false);
    expect(targetPcs(chord)).toEqual(pcsOfTonal(tonal));
  });

  it("prints the marks as the symbols Nearnote uses everywhere (maj7, m7b5, m7, dim)", () => {
    expect(symbols("CΔ Bø E-7 F°")).toEqual(["Cmaj7", "Bm7b5", "Em7", "Fdim"]);
  });

  it("Δ7 and ø7 with the 7 written out mean the same as Δ and ø (common practice, lead-sheet notation)", () => {
    expect(symbols("CΔ7 Bø7")).toEqual(symbols("CΔ Bø"));
  });

  it("the look-alike characters teachers type count as the marks: ∆ (increment), º and ˚ (degree), Ø, ♭ (common practice)", () => {
    expect(symbols("C∆7 Bº7 B˚ BØ7 B♭-7")).toEqual(["Cmaj7", "Bdim7", "Bdim", "Bm7b5", "Bbm7"]);
  });

  it("Roman numerals take the marks too: iiø7 V7 IΔ7 and viiº7", () => {
    const chords = parseProgression("iiø7–V7–IΔ7", parseKey("C"));
    expect(chords.map((c) => c.symbol)).toEqual(["Dm7b5", "G7", "Cmaj7"]);
    // tonal's RomanNumeral keeps ø7 as the chord type of viiø7.
    expect(RomanNumeral.get("viiø7").chordType).toBe("ø7");
    expect(symbols("viiø7 vii°7", C)).toEqual(["Bm7b5", "Bdim7"]);
  });

  it("upper-case numerals with a minor mark (II-7, IIm7, VIm) are minor chords (common practice, lead-sheet notation)", () => {
    expect(symbols("II-7 V7 IΔ7")).toEqual(["Dm7", "G7", "Cmaj7"]);
    expect(symbols("IIm7 V7 Imaj7")).toEqual(["Dm7", "G7", "Cmaj7"]);
    expect(symbols("I VIm IIm V")).toEqual(["C", "Am", "Dm", "G"]);
    // A major seventh on an upper-case numeral stays major.
    expect(symbols("IVmaj7")).toEqual(["Fmaj7"]);
  });

  it("the exercise form accepts every notation above in every key it names", () => {
    const check = checkProgression("| ii-7 – V7 | IΔ7 |", ["C", "Bb"]);
    expect(check.ok).toBe(true);
    if (check.ok)
      expect(check.keys.map((k) => k.chords.map((c) => c.symbol))).toEqual([
        ["Dm7", "G7", "Cmaj7"],
        ["Cm7", "F7", "Bbmaj7"],
      ]);
    const symbolsCheck = checkProgression("D-7 | G7 | CΔ", ["C", "D"]);
    expect(symbolsCheck.ok && symbolsCheck.keys[1].chords.map((c) => c.symbol)).toEqual(["Em7", "A7", "Dmaj7"]);
  });

  it("a word that is no chord is still refused, naming it", () => {
    expect(() => parseProgression("ii–V–banana", C)).toThrow(/banana/);
  });
});
