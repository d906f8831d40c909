// Edges of the engine that a mutation run showed no test pinned: several tempos, strikes that do
// not begin at 0 s, the lower edge of the grace window, the ends of the 88 keys, a bass kept
// above the previous chord, merges into a lowest note, naming tie-breaks, matching's collapsing
// of repeats, the score's variety part and the exact thresholds of the change flags. Every
// expected value is worked by hand from the rule named beside it, or read from the reference
// named there.
import { Chord, Interval } from "tonal";
import { describe, expect, it } from "vitest";
import { bestMotion } from "../../../app/analysis/bestMotion";
import { isRootPositionLeap, isTopLineLeap } from "../../../app/analysis/changeFlags";
import { matchProgression, type PlayedIdentity } from "../../../app/analysis/matching";
import { addedTones, nameChord } from "../../../app/analysis/naming";
import { parseKey } from "../../../app/analysis/pitch";
import { parseProgression, type Triad } from "../../../app/analysis/progression";
import { score, scoreParts, SCORE_WEIGHTS } from "../../../app/analysis/score";
import { findGraces, findStrikes } from "../../../app/analysis/strikes";
import {
  beatAt,
  bpmAt,
  commonestInterval,
  followsTempoGrid,
  tempoMap,
  tempoSteadiness,
} from "../../../app/analysis/tempo";
import type { NoteEvent, TempoPoint } from "../../../app/analysis/types";
import { motion, voiceLeadingPairs } from "../../../app/analysis/voiceLeading";

const note = (midi: number, start: number, end: number): NoteEvent => ({ midi, start, end, velocity: 0.7 });
const shape = (notes: NoteEvent[], tempos: TempoPoint[] = []) =>
  findStrikes(notes, tempos).map((s) => [s.start, s.notes.map((n) => n.midi).sort((a, b) => a - b)]);

describe("a tempo map with several tempos", () => {
  // Standard MIDI File 1.0 (MMA, RP-001): a tempo event holds until the next one; 120 bpm before
  // the first. Beats counted by hand: 2 s at 120 bpm is 4 beats, then 1 s at 60 bpm is 1 more.
  const tempos: TempoPoint[] = [
    { time: 0, bpm: 120 },
    { time: 2, bpm: 60 },
    { time: 4, bpm: 180 },
  ];

  it("looks up the tempo in force at each time, not the first or the last", () => {
    expect([
      bpmAt(tempos, 0),
      bpmAt(tempos, 1.9),
      bpmAt(tempos, 2),
      bpmAt(tempos, 3.5),
      bpmAt(tempos, 4),
      bpmAt(tempos, 9),
    ]).toEqual([120, 120, 60, 60, 180, 180]);
    // SMF 1.0: no tempo event before the first one means 120 bpm.
    expect(bpmAt([{ time: 1, bpm: 60 }], 0.5)).toBe(120);
  });

  it("counts beats across the tempo changes", () => {
    const map = tempoMap(tempos);
    // SMF 1.0 tempo semantics, by hand: 4 beats at 120, 2 at 60 (2 s), then 3 per second at 180.
    expect(beatAt(map, 3)).toEqual({ beat: 5, secPerBeat: 1 });
    expect(beatAt(map, 4)).toEqual({ beat: 6, secPerBeat: 60 / 180 });
    expect(beatAt(map, 5)).toEqual({ beat: 9, secPerBeat: 60 / 180 });
    expect(beatAt(map, 1)).toEqual({ beat: 2, secPerBeat: 0.5 });
  });

  it("a grace note may last up to a sixteenth at the tempo in force where it is played (rule 2)", () => {
    // Worked by hand from RULES.md rule 2: at 40 bpm a sixteenth lasts 60 / 40 / 4 = 375 ms, so a
    // 300 ms note resolving up a semitone is a grace note; at 120 bpm (125 ms) the 150 ms cap holds.
    const slowLater: TempoPoint[] = [
      { time: 0, bpm: 120 },
      { time: 2, bpm: 40 },
    ];
    const fastLater: TempoPoint[] = [
      { time: 0, bpm: 40 },
      { time: 2, bpm: 120 },
    ];
    const early = [note(63, 0.5, 0.8), note(64, 0.8, 2)];
    const late = [note(63, 2.5, 2.8), note(64, 2.8, 4)];
    expect(findGraces(early, slowLater).size).toBe(0);
    expect(findGraces(late, slowLater).size).toBe(1);
    expect(findGraces(early, fastLater).size).toBe(1);
    expect(findGraces(late, fastLater).size).toBe(0);
  });
});

describe("rule 3's lone bass, away from time 0", () => {
  // Worked by hand from RULES.md rule 3: a single pitch below every note of a chord merges into
  // it when it starts within 150 ms before or after the chord.
  it("a bass struck 100 ms after a chord at 2 s joins that chord", () => {
    expect(shape([note(60, 2, 3), note(64, 2, 3), note(67, 2, 3), note(48, 2.1, 3)])).toEqual([[2, [48, 60, 64, 67]]]);
  });

  it("a bass struck 100 ms before a chord at 2 s joins it, and the strike begins with the bass", () => {
    expect(shape([note(48, 1.9, 3), note(60, 2, 3), note(64, 2, 3), note(67, 2, 3)])).toEqual([
      [1.9, [48, 60, 64, 67]],
    ]);
  });

  it("150 ms is the limit on either side; 160 ms is a strike of its own", () => {
    const chord = [note(60, 2, 2.9), note(64, 2, 2.9), note(67, 2, 2.9)];
    expect(shape([...chord, note(48, 2.15, 2.9)])).toEqual([[2, [48, 60, 64, 67]]]);
    expect(shape([...chord, note(48, 2.16, 2.9)])).toEqual([
      [2, [60, 64, 67]],
      [2.16, [48]],
    ]);
    expect(shape([note(48, 1.85, 2.9), ...chord])).toEqual([[1.85, [48, 60, 64, 67]]]);
    expect(shape([note(48, 1.84, 2.9), ...chord])).toEqual([
      [1.84, [48]],
      [2, [60, 64, 67]],
    ]);
  });

  it("a single note above the chord's lowest note does not merge", () => {
    expect(shape([note(60, 2, 3), note(64, 2, 3), note(67, 2, 3), note(62, 2.1, 3)])).toEqual([
      [2, [60, 64, 67]],
      [2.1, [62]],
    ]);
  });
});

describe("rule 2's release window, both edges", () => {
  // Worked by hand from RULES.md rule 2: the grace note's release falls from 30 ms before to
  // 100 ms after the higher note's onset.
  const at = (onset: number) => findGraces([note(63, 2, 2.12), note(64, onset, 3)]).size;

  it("a higher note begun 100 ms before the release still takes the grace note; 110 ms before does not", () => {
    expect(at(2.02)).toBe(1);
    expect(at(2.01)).toBe(0);
  });

  it("a higher note begun 30 ms after the release takes it; 40 ms after does not", () => {
    expect(at(2.15)).toBe(1);
    expect(at(2.16)).toBe(0);
  });
});

describe("best motion at the ends of the keyboard and with a high kept bass", () => {
  // The 88 keys run from A0 (MIDI 21) to C8 (MIDI 108): General MIDI / MMA note numbering with
  // A4 = 69, and the standard piano compass (common practice). No voicing leaves them.
  it("never places a note below A0", () => {
    // Worked by hand from RULES.md rules 7 and 8: A0 C1 E1 → G major. G0 B0 D1 would move
    // 2 + 1 + 2 = 5 but G0 is not on the keyboard; B0 D1 G1 moves 2 + 2 + 3 = 7.
    expect(bestMotion([21, 24, 28], [31, 35, 38])).toEqual({ motion: 7, voicing: [23, 26, 31] });
    expect(bestMotion([21, 24, 28], [31, 35, 38], { accept: () => true })).toEqual({
      motion: 7,
      voicing: [23, 26, 31],
    });
  });

  it("never places a note above C8", () => {
    // By hand: E7 G#7 C8 → A major. E7 A7 C#8 would move 0 + 1 + 1 = 2 but C#8 is off the
    // keyboard; C#7 E7 A7 moves 3 + 4 + 3 = 10 (A6 C#7 E7 as played moves 22).
    expect(motion([100, 104, 108], [93, 97, 100])).toBe(22);
    expect(bestMotion([100, 104, 108], [93, 97, 100])).toEqual({ motion: 10, voicing: [97, 100, 105] });
    expect(bestMotion([100, 104, 108], [93, 97, 100], { accept: () => true })).toEqual({
      motion: 10,
      voicing: [97, 100, 105],
    });
  });

  it("re-voices above a kept bass that lies above the previous chord's top (rule 8)", () => {
    // Worked by hand from RULES.md rule 8: C2 C3 E3 G3 → C4 G4 B4 D5, both two-hand voicings, so
    // C4 stays. G, B and D as low as they go above it: D4 G4 B4, moving 24 + 14 + 15 + 16 = 69
    // (as played 24 + 19 + 19 + 19 = 81).
    expect(motion([36, 48, 52, 55], [60, 67, 71, 74])).toBe(81);
    expect(bestMotion([36, 48, 52, 55], [60, 67, 71, 74])).toEqual({ motion: 69, voicing: [60, 62, 67, 71] });
  });

  it("B as played is the answer when every one of its notes is fixed (rule 8: always a candidate)", () => {
    // By hand: the kept bass C3 under C4 E4 G4 moves 12 + 16 + 19 = 47; nothing else may be played.
    expect(bestMotion([60, 64, 67], [48], { keepBass: true })).toEqual({ motion: 47, voicing: [48] });
    // C2 C3 (a left-hand octave, kept) and the tune's E4 (kept): nothing is left to re-voice.
    expect(bestMotion([48, 55, 60, 64], [36, 48, 64], { keepBass: true, keepTop: true })).toEqual({
      motion: motion([48, 55, 60, 64], [36, 48, 64]),
      voicing: [36, 48, 64],
    });
  });
});

describe("two notes merging into the lowest note of the next chord (rule 7)", () => {
  // Worked by hand from RULES.md rule 7: C4 D4 G4 → C4 G4. C4 and D4 both go to C4 (0 + 2), G4
  // stays: 2. Merging D4 and G4 into G4 instead would cost 0 + 5 + 0 = 5.
  it("motion and its joins", () => {
    expect(motion([60, 62, 67], [60, 67])).toBe(2);
    expect(voiceLeadingPairs([60, 62, 67], [60, 67])).toEqual([
      [60, 60],
      [62, 60],
      [67, 67],
    ]);
    // The reverse change splits C4 into C4 and D4: the same 2.
    expect(motion([60, 67], [60, 62, 67])).toBe(2);
    expect(voiceLeadingPairs([60, 67], [60, 62, 67])).toEqual([
      [60, 60],
      [60, 62],
      [67, 67],
    ]);
  });

  it("best motion finds the voicing that takes the merge", () => {
    // C and G played as C3 G3: the best is C4 G4, moving 2 as above.
    expect(bestMotion([60, 62, 67], [48, 55])).toEqual({ motion: 2, voicing: [60, 67] });
    // Three notes into one: C4 D4 E4 → D4 moves 2 + 0 + 2.
    expect(motion([60, 62, 64], [62])).toBe(4);
    expect(bestMotion([60, 62, 64], [50])).toEqual({ motion: 4, voicing: [62] });
  });
});

describe("naming tie-breaks of rule 4", () => {
  it("F# B E is Bsus4/F#, not Esus2/F#, in every key", () => {
    // tonal (6.5.1) as reference: Chord.detect lists both readings, Esus2/F# first.
    expect(Chord.detect(["F#", "B", "E"])).toEqual(["Esus2/F#", "Bsus4/F#"]);
    // Worked by hand from RULES.md rule 4: both readings are complete, neither has its root in
    // the bass and neither has added tones, so naming.ts's last step takes the root nearest
    // above the bass: B is 5 semitones above F#, E is 10.
    for (let t = 0; t < 12; t++) {
      const n = nameChord([54 + t, 59 + t, 64 + t], 54 + t);
      expect([n.rootPc, n.suffix, n.triad], `transposed by ${t}`).toEqual([(11 + t) % 12, "sus4", "sus4"]);
    }
  });

  it("an augmented triad is named on its bass, with triad 'augmented'", () => {
    // tonal as reference: Caug is C E G#, intervals 1P 3M 5A. Rule 4(b): the bass is the root.
    expect(Chord.get("Caug").intervals).toEqual(["1P", "3M", "5A"]);
    for (let t = 0; t < 12; t++) {
      const n = nameChord([60 + t, 64 + t, 68 + t], 60 + t);
      expect([n.rootPc, n.triad, n.suffix, n.intervals], `transposed by ${t}`).toEqual([
        t,
        "augmented",
        "aug",
        [0, 4, 8],
      ]);
    }
  });

  it("added tones carry their accidentals: b9, #9, #11", () => {
    // tonal as reference for the intervals: C7b9 has 9m, C7#9 has 9A, Cmaj7#11 has 11A.
    const semis = (sym: string) => Chord.get(sym).intervals.map((i) => Interval.semitones(i)! % 12);
    expect(Chord.get("C7b9").intervals).toContain("9m");
    expect(
      addedTones(
        nameChord(
          semis("C7b9").map((s) => 60 + s),
          60,
        ),
      ),
    ).toEqual(["b9"]);
    expect(Chord.get("C7#9").intervals).toContain("9A");
    expect(
      addedTones(
        nameChord(
          semis("C7#9").map((s) => 60 + s),
          60,
        ),
      ),
    ).toEqual(["#9"]);
    expect(Chord.get("Cmaj7#11").intervals).toContain("11A");
    expect(
      addedTones(
        nameChord(
          semis("Cmaj7#11").map((s) => 60 + s),
          60,
        ),
      ),
    ).toEqual(["#11"]);
    // Plain added tones have none (tonal: Cadd9 is 1P 3M 5P 9M).
    expect(addedTones(nameChord([60, 62, 64, 67], 60))).toEqual(["9"]);
  });
});

describe("matching: neighbours that differ are not collapsed", () => {
  // RULES.md "Matching a take to a target": runs of the same chord count once. Cmaj7 and C7
  // share root, triad and bass but are different chords; so are I and i.
  const played = (root: number, triad: Triad, pcs: number[]): PlayedIdentity => ({ root, triad, bass: root, pcs });
  const cmaj7 = played(0, "major", [0, 4, 7, 11]);
  const c7 = played(0, "major", [0, 4, 7, 10]);
  const c = played(0, "major", [0, 4, 7]);
  const cm = played(0, "minor", [0, 3, 7]);

  it("Cmaj7 then C7 is two chords, in the take and in the target", () => {
    const r = matchProgression([cmaj7, c7], parseProgression("Imaj7 I7", parseKey("C")));
    expect(r).toMatchObject({ accuracy: 1, matched: 2, targetLength: 2, loops: 1, mismatches: [] });
    // Played twice over, neither collapses: both targets are matched in both passes.
    expect(matchProgression([cmaj7, c7, cmaj7, c7], parseProgression("Cmaj7 C7", parseKey("C")))).toMatchObject({
      accuracy: 1,
      matched: 4,
      targetLength: 4,
      loops: 2,
    });
  });

  it("a target I then i is two chords; playing C then Cm matches both", () => {
    const target = parseProgression("I i", parseKey("C"));
    expect(target).toHaveLength(2);
    expect(matchProgression([c, cm], target)).toMatchObject({ accuracy: 1, matched: 2, targetLength: 2 });
    // C alone matches half of it.
    expect(matchProgression([c], target)).toMatchObject({ accuracy: 0.5, matched: 1, targetLength: 2 });
  });

  it("a repeated identical chord still collapses", () => {
    expect(matchProgression([c7, c7, cmaj7], parseProgression("I7 Imaj7", parseKey("C")))).toMatchObject({
      accuracy: 1,
      matched: 2,
      targetLength: 2,
      mismatches: [],
    });
  });
});

describe("the variety part of the score between 0 and 3 techniques", () => {
  // RULES.md "Score": distinct techniques counted up to 3, one gives 1/3.
  const parts = (distinctTechniques: number) =>
    scoreParts({
      chordCount: 4,
      smoothness: 1,
      flaggedItems: 0,
      items: 7,
      distinctTechniques,
      steadiness: 1,
      accuracy: null,
    });

  it("one technique is a third, two are two thirds, four count as three", () => {
    expect(parts(1).techniqueVariety).toBeCloseTo(1 / 3, 12);
    expect(parts(2).techniqueVariety).toBeCloseTo(2 / 3, 12);
    expect(parts(4).techniqueVariety).toBe(1);
  });

  it("the score moves by the variety weight per third", () => {
    // RULES.md "Score" weights without a target: 0.45 + 0.30 + 0.15 × variety + 0.10, × 100, rounded.
    expect(SCORE_WEIGHTS.withoutTarget.techniqueVariety).toBe(0.15);
    expect([0, 1, 2, 3].map((n) => score(4, parts(n)))).toEqual([85, 90, 95, 100]);
  });
});

describe("change flags at their exact thresholds", () => {
  it("every voice down by exactly 3 is a root-position leap; by 2 it is not (rule 9)", () => {
    // Worked by hand from RULES.md rule 9 ("by 3 semitones or more"): F4 A4 C5 → D4 F#4 A4.
    expect(isRootPositionLeap([65, 69, 72], [62, 66, 69], 0, 0)).toBe(true);
    expect(isRootPositionLeap([62, 66, 69], [65, 69, 72], 0, 0)).toBe(true);
    // F4 A4 C5 → Eb4 G4 Bb4: every voice down 2.
    expect(isRootPositionLeap([65, 69, 72], [63, 67, 70], 0, 0)).toBe(false);
  });

  it("chords of different sizes are no block leap, even when every shared voice leaps (rule 9)", () => {
    // RULES.md rule 9 asks for the same number of notes: C4 E4 G4 → F4 A4 C5 Eb5 (all up 5 or more).
    expect(isRootPositionLeap([60, 64, 67], [65, 69, 72, 75], 0, 0)).toBe(false);
    expect(isRootPositionLeap([65, 69, 72, 75], [60, 64, 67], 0, 0)).toBe(false);
  });

  it("a top line moving by exactly 7 is no leap, by 8 it is (rule 10)", () => {
    // RULES.md rule 10: "by more than 7 semitones".
    expect(isTopLineLeap(67, 74)).toBe(false);
    expect(isTopLineLeap(67, 75)).toBe(true);
    expect(isTopLineLeap(75, 67)).toBe(true);
    expect(isTopLineLeap([60, 64, 67], [62, 67, 74])).toBe(false);
    expect(isTopLineLeap([60, 64, 67], [])).toBe(false);
  });
});

describe("rules 1–3: which notes pair up", () => {
  // Worked by hand from RULES.md rules 2 and 3.
  const graces = (notes: NoteEvent[]) =>
    findStrikes(notes).flatMap((s) => s.graces.map((g) => [g.note.midi, g.target.midi]));

  it("a resolution held no longer than the grace note is no resolution", () => {
    expect(graces([note(63, 0, 0.09), note(64, 0.09, 0.18)])).toEqual([]);
    expect(graces([note(63, 0, 0.09), note(64, 0.09, 0.19)])).toEqual([[63, 64]]);
  });

  it("of two possible resolutions, the one beginning nearest the release is taken", () => {
    // D#4 released at 0.1 s; both E4 and F4 begin inside the window (100 ms before to 30 ms
    // after the release): the one 10 ms after the release wins over the one 80 ms before it.
    expect(graces([note(63, 0, 0.1), note(64, 0.02, 1), note(65, 0.11, 1)])).toEqual([[63, 65]]);
    expect(graces([note(63, 0, 0.1), note(64, 0.11, 1), note(65, 0.02, 1)])).toEqual([[63, 64]]);
  });

  it("a resolution struck before its grace note still takes it into its strike", () => {
    // E4 from 0.02 s, D#4 from 0.05 to 0.1 s: released 80 ms after E4 began (rule 2's 100 ms).
    const strikes = findStrikes([note(64, 0.02, 1), note(63, 0.05, 0.1), note(60, 0.02, 1)]);
    expect(strikes).toHaveLength(1);
    expect(strikes[0].notes.map((n) => n.midi).sort((a, b) => a - b)).toEqual([60, 64]);
    expect(strikes[0].graces.map((g) => [g.note.midi, g.target.midi])).toEqual([[63, 64]]);
  });

  it("a bass approached by a grace note is two keys struck, not a lone bass (rule 3)", () => {
    // B2 → C3 grace, then C4 E4 G4 150 ms after: the C3 strike holds two pitches and stays apart.
    const strikes = findStrikes([
      note(47, 0, 0.05),
      note(48, 0.05, 1),
      note(60, 0.15, 1),
      note(64, 0.15, 1),
      note(67, 0.15, 1),
    ]);
    expect(strikes.map((s) => s.notes.map((n) => n.midi).sort((a, b) => a - b))).toEqual([[48], [60, 64, 67]]);
    expect(strikes[0].graces).toHaveLength(1);
  });

  it("two lone notes never pair up, and a lone note on the chord's own bass key does not merge", () => {
    expect(shape([note(48, 2, 3), note(60, 2.1, 3)])).toEqual([
      [2, [48]],
      [2.1, [60]],
    ]);
    expect(shape([note(48, 2, 2.05), note(48, 2.1, 3), note(52, 2.1, 3), note(55, 2.1, 3)])).toEqual([
      [2, [48]],
      [2.1, [48, 52, 55]],
    ]);
  });
});

describe("steady time worked through by hand (rule 22)", () => {
  it("the commonest interval is the median of the largest cluster within 5% + 30 ms", () => {
    // By hand: around 0.5 s the window 0.445–0.555 holds 0.5, 0.5, 0.52 (three); median 0.5.
    expect(commonestInterval([0.5, 0.5, 0.52, 1.0, 1.5])).toBe(0.5);
    // Intervals shorter than half the 300 bpm beat (0.1 s) are not beats.
    expect(commonestInterval([0.05, 0.05, 0.05, 0.5])).toBe(0.5);
    expect(commonestInterval([0.05])).toBeNull();
    // An even cluster: the mean of its middle two.
    expect(commonestInterval([0.5, 0.52])).toBeCloseTo(0.51, 12);
  });

  it("one late strike on a 120 bpm map: spread 0.68, steadiness 0.32", () => {
    // Worked by hand from RULES.md rule 22 as tempo.ts states it (its tuning constants are our
    // own): onsets 0, 0.5, 1, 1.5, 2.1 s; four of five lie on the half-beat grid (80%), so the
    // map's beat (0.5 s) is used, and since 120 ms of tolerance is under half of a 250 ms half
    // beat, it is used whatever the strikes' own beat. Only the 0.6 s interval is off the grid:
    // 0.1 s from 0.5, less 20 ms unnoticed = 0.08. Chance per interval: (0.125 − 0.02)² / 0.25 =
    // 0.0441, four intervals 0.1764; spread = 0.08 / (2/3 × 0.1764) = 0.680.
    expect(tempoSteadiness([0, 0.5, 1, 1.5, 2.1], [{ time: 0, bpm: 120 }])).toEqual({
      medianGapSec: 0.5,
      spread: 0.68,
      steadiness: 0.32,
      beatSec: 0.5,
      beatFrom: "tempo-map",
    });
  });
});

describe("steady time: where the beat comes from (rule 22)", () => {
  // Worked by hand from RULES.md rule 22 as tempo.ts states it. SMF 1.0: no tempo event is 120 bpm.
  it("strikes every 0.7 s with no tempo map: the beat is read from the strikes", () => {
    // 0.7 s is off the 120 bpm half-beat grid for 2 of 5 onsets (1.4 and 2.8 beats are 0.1 s
    // away), so only the strikes' own beat counts: 0.7 s fits every interval exactly; halves
    // and thirds fit no better, so the commonest interval stays the beat.
    expect(tempoSteadiness([0, 0.7, 1.4, 2.1, 2.8])).toEqual({
      medianGapSec: 0.7,
      spread: 0,
      steadiness: 1,
      beatSec: 0.7,
      beatFrom: "strikes",
    });
  });

  it("a dense map followed only by chance gives way to the strikes' own beat", () => {
    // 240 bpm: a half beat of 125 ms, of which the ±60 ms tolerance covers 96%, so the map
    // counts only if it fits about as well as the strikes. Strikes every 0.3 s sit 50 ms off its
    // grid each time; the strikes' own 0.3 s beat fits exactly.
    const r = tempoSteadiness([0, 0.3, 0.6, 0.9, 1.2], [{ time: 0, bpm: 240 }]);
    expect(r).toMatchObject({ beatFrom: "strikes", beatSec: 0.3, steadiness: 1 });
    // Strikes right on that grid: the map fits as well, and is taken.
    expect(tempoSteadiness([0, 0.25, 0.5, 0.75, 1], [{ time: 0, bpm: 240 }])).toMatchObject({
      beatFrom: "tempo-map",
      beatSec: 0.25,
      steadiness: 1,
    });
  });

  it("two strikes already give a beat; strikes too close for a beat give none", () => {
    expect(tempoSteadiness([0, 0.5], [{ time: 0, bpm: 120 }])).toEqual({
      medianGapSec: 0.5,
      spread: 0,
      steadiness: 1,
      beatSec: 0.5,
      beatFrom: "tempo-map",
    });
    // 50 ms apart: shorter than half the 300 bpm beat, and off the 120 bpm grid (0.1 s at 0.1 s).
    expect(tempoSteadiness([0, 0.05, 0.1])).toEqual({
      medianGapSec: 0.05,
      spread: null,
      steadiness: 1,
      beatSec: null,
      beatFrom: null,
    });
    expect(followsTempoGrid([], [{ time: 0, bpm: 120 }])).toBe(false);
  });

  it("onsets in any order, repeated or not numbers, give the same answer", () => {
    const clean = tempoSteadiness([0, 0.5, 1, 1.5, 2.1], [{ time: 0, bpm: 120 }]);
    expect(tempoSteadiness([2.1, 1, 0, 1.5, 0.5, 1, Number.NaN], [{ time: 0, bpm: 120 }])).toEqual(clean);
  });

  it("the commonest interval: a single interval, and the first of two equal clusters", () => {
    expect(commonestInterval([0.5])).toBe(0.5);
    expect(commonestInterval([0.5, 0.5, 1, 1])).toBe(0.5);
  });

  it("a tempo point without a usable tempo is ignored", () => {
    const map = tempoMap([
      { time: 0, bpm: 120 },
      { time: 1, bpm: 0 },
      { time: 2, bpm: Number.NaN },
    ]);
    expect(beatAt(map, 3)).toEqual({ beat: 6, secPerBeat: 0.5 });
  });
});

describe("rules 1–3 with notes out of pitch order", () => {
  it("a chord struck top first: a lone note above its lowest note stays apart (rule 3)", () => {
    // G4, C4, E4 struck top first, then D4 alone 100 ms after E4 (a strike of its own by rule
    // 1) and 120 ms after the chord began: D4 is not below C4, so it does not merge.
    expect(shape([note(67, 2, 3), note(60, 2.01, 3), note(64, 2.02, 3), note(62, 2.12, 3)])).toEqual([
      [2, [60, 64, 67]],
      [2.12, [62]],
    ]);
  });

  it("a key struck again on another track while held is the new strike's own note, not a held one (rule 3)", () => {
    const strikes = findStrikes([note(60, 0, 3), note(64, 0, 3), note(60, 1, 2), note(67, 1, 2)]);
    expect(strikes).toHaveLength(2);
    expect(strikes[1].held.map((n) => n.midi)).toEqual([64]);
  });
});
