// The exercise's target in each of its keys, checked against tonal (a general-purpose music
// theory library on npm) as a second opinion: its Key tables give the diatonic triads of every
// key, and Chord.transpose moves chord symbols. Chords are compared by pitch-class set.
import { Chord, Key, Note } from "tonal";
import { describe, expect, it } from "vitest";
import { pc } from "~/analysis/pitch";
import { targetPcs } from "~/analysis/progression";
import {
  ALL_MAJOR_KEYS,
  ALL_MINOR_KEYS,
  checkProgression,
  splitKeys,
  targetChordsInKey,
  targetTextForKey,
} from "~/utils/exerciseProgression";

const pcsOfSymbol = (symbol: string) =>
  [...new Set(Chord.get(symbol).notes.map((n) => Note.chroma(n)!))].sort((a, b) => a - b);
const pcsInKey = (progression: string, keys: string[], key: string) =>
  targetChordsInKey(progression, keys, key).map(targetPcs);

describe("keys", () => {
  it("splits what the teacher typed", () => {
    expect(splitKeys("D, Ab  Gm;D")).toEqual(["D", "Ab", "Gm"]);
  });
  it("names the twelve major and minor keys once each", () => {
    expect(new Set(ALL_MAJOR_KEYS.map((k) => Note.chroma(k))).size).toBe(12);
    expect(new Set(ALL_MINOR_KEYS.map((k) => Note.chroma(k.replace(/m$/, "")))).size).toBe(12);
  });
});

describe("Roman numerals are read in each key", () => {
  it("I IV V I in all twelve major keys gives tonal's triads on degrees 1, 4, 5", () => {
    for (const key of ALL_MAJOR_KEYS) {
      const t = Key.majorKey(key).triads;
      expect(pcsInKey("I IV V I", ALL_MAJOR_KEYS, key), key).toEqual([t[0], t[3], t[4], t[0]].map(pcsOfSymbol));
    }
  });
  it("iiø7 V7 i in all twelve minor keys: tonal's natural-minor ii, harmonic-minor V7, the tonic triad", () => {
    for (const key of ALL_MINOR_KEYS) {
      const tonic = key.replace(/m$/, "");
      const minor = Key.minorKey(tonic);
      const expected = [minor.natural.chords[1], minor.harmonic.chords[4], `${tonic}m`].map(pcsOfSymbol);
      expect(pcsInKey("iiø7 V7 i", ALL_MINOR_KEYS, key), key).toEqual(expected);
    }
  });
  it("spells Roman numerals in G minor as a handbook does: Am7b5 D7 Gm (common practice)", () => {
    const check = checkProgression("iiø7 V7 i", ["Gm"]);
    expect(check.ok && check.keys[0].chords.map((c) => c.symbol)).toEqual(["Am7b5", "D7", "Gm"]);
  });
});

describe("chord symbols are moved from the first key", () => {
  it("Eb Bb/D Cm Cm/Bb Ab in all twelve major keys equals tonal's Chord.transpose of each symbol", () => {
    const written = ["Eb", "Bb/D", "Cm", "Cm/Bb", "Ab"];
    for (const key of ALL_MAJOR_KEYS) {
      const interval = Note.distance("Eb", key);
      const expected = written.map((s) => pcsOfSymbol(Chord.transpose(s, interval)));
      const chords = targetChordsInKey(written.join(" "), ["Eb", ...ALL_MAJOR_KEYS.filter((k) => k !== "Eb")], key);
      expect(chords.map(targetPcs), key).toEqual(expected);
      // The named bass moves with the chord: Bb/D in Eb has D in the bass, so in F it is E.
      expect(chords[1].bass, key).toBe(pc(Note.chroma("D")! + Note.chroma(key)! - Note.chroma("Eb")!));
    }
  });
  it("grades a take in another key against the moved symbols, and in the first key against the teacher's text", () => {
    expect(targetTextForKey("Eb Bb/D Cm", ["Eb", "F"], "F")).toBe("F C/E Dm");
    expect(targetTextForKey("Eb Bb/D Cm", ["Eb", "F"], "Eb")).toBe("Eb Bb/D Cm");
    expect(targetTextForKey("I IV V", ["D", "Gm"], "Gm")).toBe("I IV V");
  });
});

describe("malformed input is refused with its place named", () => {
  it("names the bad token and its position", () => {
    const check = checkProgression("I IV Q7 I", ["D"]);
    expect(check).toMatchObject({ ok: false, field: "progression", position: 3, token: "Q7" });
    expect(!check.ok && check.message).toContain('Token 3 "Q7"');
  });
  it("refuses an unknown key, an empty key list and chord symbols across major and minor", () => {
    expect(checkProgression("I IV", ["H"])).toMatchObject({ ok: false, field: "keys", token: "H" });
    expect(checkProgression("I IV", [])).toMatchObject({ ok: false, field: "keys" });
    expect(checkProgression("C F G", ["C", "Am"])).toMatchObject({ ok: false, field: "keys" });
    expect(checkProgression("I IV V", ["C", "Am"]).ok).toBe(true);
  });
});
