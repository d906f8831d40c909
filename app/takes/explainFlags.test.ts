// The flag explanations a student reads, built from real engine output for the RULES.md
// worked examples (derived by hand from its rules 7–12), so the numbers in the words are
// the numbers the rules give.
import { describe, expect, it } from "vitest";
import { chordReport } from "~/analysis/chords";
import { gradeChange } from "~/analysis/grade";
import { parseKey, type Key } from "~/analysis/pitch";
import type { Strike } from "~/analysis/strikes";
import { explainChange, explainChordFlag, FLAG_TITLES } from "./explainFlags";
import { intervalName, pretty, voicingLabel } from "~/utils/noteText";

function chord(pitches: number[], key: Key, start = 0) {
  const s: Strike = {
    start,
    notes: pitches.map((midi) => ({ midi, start, end: start + 0.9, velocity: 0.7 })),
    graces: [],
    held: [],
  };
  return chordReport(s, key, []);
}

function explained(a: number[], b: number[], keyName: string) {
  const key = parseKey(keyName);
  const chords = [chord(a, key, 0), chord(b, key, 1)];
  const change = gradeChange(0, 1, chords[0], chords[1], key);
  return { change, texts: explainChange(change, chords, key) };
}

describe("root-position leap in words", () => {
  it("F3 A3 C4 → B♭3 D4 F4: every note up 5, F–B♭–D would have moved 3 (RULES.md worked example)", () => {
    const { change, texts } = explained([53, 57, 60], [58, 62, 65], "F");
    expect(change.flags).toEqual(["root-position-leap"]);
    expect(texts).toHaveLength(1);
    expect(texts[0].title).toBe(FLAG_TITLES["root-position-leap"]);
    expect(texts[0].text).toBe(
      "Both chords are in root position and every note jumped 5 semitones up; F–B♭–D would have moved 3, against 15 as played.",
    );
  });

  it("G4 B4 D5 → C5 E5 G5 in C: up 5, C–E–G (G4 C5 E5) would have moved 3 (RULES.md worked example)", () => {
    const { texts } = explained([67, 71, 74], [72, 76, 79], "C");
    expect(texts[0].text).toContain("every note jumped 5 semitones up");
    expect(texts[0].text).toContain("G–C–E would have moved 3, against 15 as played");
  });

  it("C3 C4 E4 G4 → F2 F3 A3 C4: every voice down 7 (RULES.md worked example, best 10 = bass 7 + upper 3)", () => {
    const { change, texts } = explained([48, 60, 64, 67], [41, 53, 57, 60], "C");
    expect(change.bestMotion).toBe(10);
    expect(texts[0].text).toMatch(/^Both chords are in root position and every note jumped 7 semitones down; /);
    expect(texts[0].text).toContain("would have moved 10, against 28 as played.");
  });

  it("names the range when the voices jump by different sizes", () => {
    // C4 E4 G4 (C major) → F4 A♭4 C5 (F minor), both in root position: the voices move 5, 4 and 5 up.
    const { change, texts } = explained([60, 64, 67], [65, 68, 72], "Cm");
    expect(change.flags).toContain("root-position-leap");
    expect(texts[0].text).toContain("every note jumped up, by 4 to 5 semitones");
  });

  it("gives no explanation for a smooth change (F3 A3 C4 → F3 B♭3 D4, RULES.md worked example)", () => {
    expect(explained([53, 57, 60], [53, 58, 62], "F").texts).toEqual([]);
  });
});

describe("top-line leap in words", () => {
  it("C4 E4 G4 → F4 A4 C5 moved up an octave: the top leaps 10 and the smoothest voicing keeps it close", () => {
    // C major to F major with every note 5 up and then the top an octave higher: C4 E4 G4 → A4 C5 F5.
    const { change, texts } = explained([60, 64, 67], [69, 72, 77], "C");
    expect(change.flags).toContain("top-line-leap");
    const top = texts.find((t) => t.flag === "top-line-leap")!;
    expect(top.text).toContain("The top note leapt 10 semitones up, from G4 to F5; more than 7");
    // Best voicing C4 F4 A4 (RULES.md: C → F best 3) puts the top on A4, 2 up from G4.
    expect(change.bestVoicing).toEqual([60, 65, 69]);
    expect(top.text).toContain("With C–F–A the top would move 2 semitones up.");
  });
});

describe("chord flags in words", () => {
  const key = parseKey("C");

  it("muddy low interval: C2 and E♭2, a minor 3rd under its limit C3 (Lowell & Pullig via elm-music-theory)", () => {
    const c = chord([36, 39, 43], key);
    expect(c.flags).toContain("muddy-low-interval");
    const e = explainChordFlag("muddy-low-interval", c, key);
    expect(e.text).toBe(
      "The two lowest notes, C2 and E♭2, are a minor 3rd apart. A minor 3rd sounds clear with its lower note on C3 or higher; this one is 12 semitones below that. Spread the low notes wider or play them higher.",
    );
  });

  it("doubled bass third: E3 C4 G4 E5 C6 has the 3rd E in the bass and again at E5 (RULES.md rule 11, common practice)", () => {
    // E4 would be exactly an octave above the bass (allowed), so the doubled 3rd sits at E5, not on top.
    const c = chord([52, 60, 67, 76, 84], key);
    expect(c.flags).toContain("doubled-bass-third");
    const e = explainChordFlag("doubled-bass-third", c, key);
    expect(e.text).toContain("The 3rd of C/E, E, is in the bass and sounds again at E5.");
  });

  it("too many notes: nine distinct pitches are not graded (RULES.md rule 8)", () => {
    const c = chord([48, 50, 52, 53, 55, 57, 59, 60, 62], key);
    expect(c.flags).toContain("too-many-notes");
    expect(explainChordFlag("too-many-notes", c, key).text).toMatch(
      /^This chord has 9 different notes; chords of more than 8 are not graded/,
    );
  });

  it("a change carries the flags of the chord it arrives at after its own", () => {
    const chords = [chord([60, 64, 67], key, 0), chord([36, 39, 43], key, 1)];
    const change = gradeChange(0, 1, chords[0], chords[1], key);
    const flags = explainChange(change, chords, key).map((e) => e.flag);
    expect(flags[flags.length - 1]).toBe("muddy-low-interval");
  });
});

describe("text helpers", () => {
  it("typographic accidentals without touching other letters", () => {
    expect(pretty("Bb4")).toBe("B♭4");
    expect(pretty("Ebm7b5")).toBe("E♭m7♭5");
    expect(pretty("bVII")).toBe("♭VII");
    expect(pretty("Fadd9/A")).toBe("Fadd9/A");
    expect(pretty("Gb/Bb")).toBe("G♭/B♭");
    expect(pretty("F#dim")).toBe("F♯dim");
  });

  it("voicing labels spell in the key", () => {
    expect(voicingLabel([53, 58, 62], parseKey("F"))).toBe("F–B♭–D");
    expect(voicingLabel([66, 70, 73], parseKey("F#"))).toBe("F♯–A♯–C♯");
  });

  it("interval names (common practice)", () => {
    expect([1, 3, 6, 7, 12, 16].map(intervalName)).toEqual([
      "minor 2nd",
      "minor 3rd",
      "tritone",
      "perfect 5th",
      "octave",
      "major 10th",
    ]);
  });
});
