// Pitch classes, keys and spelling. Spellings follow common practice (key signatures and the
// circle of fifths); the MIDI numbering (middle C = 60 = C4, A4 = 69) is the MIDI standard's,
// cross-checked against tonal's Note.midi (tonal, general-purpose music-theory library on npm).
import { Note } from "tonal";
import { describe, expect, it } from "vitest";
import {
  keyName,
  keySignature,
  noteName,
  parseKey,
  pc,
  ProgressionError,
  spellDegree,
  spellPc,
} from "../../../app/analysis/pitch";

describe("pc", () => {
  it("maps MIDI numbers to pitch classes 0..11, negatives included", () => {
    expect(pc(60)).toBe(0);
    expect(pc(69)).toBe(9);
    expect(pc(59)).toBe(11);
    expect(pc(-1)).toBe(11);
    expect(pc(127)).toBe(7);
  });
});

describe("parseKey", () => {
  it("reads major and minor keys as teachers write them", () => {
    expect(parseKey("D")).toEqual({ tonic: 2, mode: "major", name: "D" });
    expect(parseKey("Ab")).toEqual({ tonic: 8, mode: "major", name: "Ab" });
    expect(parseKey("F#")).toEqual({ tonic: 6, mode: "major", name: "F#" });
    expect(parseKey("Gm")).toEqual({ tonic: 7, mode: "minor", name: "Gm" });
    expect(parseKey("C#m")).toEqual({ tonic: 1, mode: "minor", name: "C#m" });
    expect(parseKey(" eb minor ")).toEqual({ tonic: 3, mode: "minor", name: "Ebm" });
    expect(parseKey("B♭")).toEqual({ tonic: 10, mode: "major", name: "Bb" });
    expect(keyName(parseKey("a min"))).toBe("Am");
  });

  it("refuses anything else with a ProgressionError naming the text", () => {
    for (const bad of ["", "H", "Cx", "C##m", "Dorian", "C7"]) {
      expect(() => parseKey(bad)).toThrow(ProgressionError);
    }
    try {
      parseKey("H");
    } catch (e) {
      expect((e as ProgressionError).token).toBe("H");
      expect((e as Error).message).toContain("H");
    }
  });

  it("counts sharps and flats in the signature (minor keys share their relative major's)", () => {
    expect(keySignature(parseKey("C"))).toBe(0);
    expect(keySignature(parseKey("D"))).toBe(2);
    expect(keySignature(parseKey("Ab"))).toBe(-4);
    expect(keySignature(parseKey("Gm"))).toBe(-2);
    expect(keySignature(parseKey("C#m"))).toBe(4);
    expect(keySignature(parseKey("Am"))).toBe(0);
  });
});

describe("spellPc and spellDegree", () => {
  it("uses the key's letters for its scale notes", () => {
    expect(spellPc(10, parseKey("F"))).toBe("Bb");
    expect(spellPc(10, parseKey("B"))).toBe("A#");
    expect(spellPc(5, parseKey("F#"))).toBe("E#");
    expect(spellPc(11, parseKey("Gb"))).toBe("Cb");
    expect(["Eb", "F", "G", "Ab", "Bb", "C", "D"].map((n) => spellPc(Note.chroma(n)!, parseKey("Eb")))).toEqual([
      "Eb",
      "F",
      "G",
      "Ab",
      "Bb",
      "C",
      "D",
    ]);
  });

  it("keeps the letters of the raised 6th and 7th in minor (F# and E in G minor)", () => {
    expect(spellPc(6, parseKey("Gm"))).toBe("F#");
    expect(spellPc(4, parseKey("Gm"))).toBe("E");
    expect(spellPc(8, parseKey("Am"))).toBe("G#");
  });

  it("spells notes outside the key with sharps in sharp keys and flats in flat keys", () => {
    expect(spellPc(3, parseKey("D"))).toBe("D#");
    expect(spellPc(1, parseKey("Ab"))).toBe("Db"); // diatonic
    expect(spellPc(4, parseKey("Ab"))).toBe("E");
    expect(spellPc(6, parseKey("Ab"))).toBe("Gb");
    expect(spellPc(6, parseKey("C"))).toBe("F#");
    expect(spellPc(10, parseKey("C"))).toBe("Bb");
    expect(spellPc(1, null)).toBe("Db");
    expect(spellPc(6, null)).toBe("F#");
  });

  it("spells altered degrees on their own letter (bVII in D is C, bVI in D is Bb)", () => {
    expect(spellDegree(parseKey("D"), 6, -1)).toBe("C");
    expect(spellDegree(parseKey("D"), 5, -1)).toBe("Bb");
    expect(spellDegree(parseKey("Gm"), 6, 1)).toBe("F#");
    expect(spellDegree(parseKey("Ab"), 5)).toBe("F");
  });
});

describe("noteName", () => {
  it("names middle C C4 and agrees with tonal's Note.midi for every key", () => {
    expect(noteName(60, null)).toBe("C4");
    expect(noteName(58, parseKey("F"))).toBe("Bb3");
    expect(noteName(58, parseKey("B"))).toBe("A#3");
    for (const k of ["C", "G", "D", "A", "E", "B", "F#", "F", "Bb", "Eb", "Ab", "Db", "Gb", "Am", "Gm", "C#m"]) {
      for (let midi = 21; midi <= 108; midi++) {
        // tonal (npm, general-purpose): the MIDI number of the spelled name must round-trip.
        expect(Note.midi(noteName(midi, parseKey(k)))).toBe(midi);
      }
    }
  });

  it("keeps a Cb or B# in the octave of its letter", () => {
    expect(noteName(59, parseKey("Gb"))).toBe("Cb4");
    expect(noteName(60, parseKey("C#"))).toBe("B#3");
  });
});
