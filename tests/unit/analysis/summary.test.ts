// The whole-take summary (summary.ts): totals over graded changes, flags and techniques by
// name, the top line, steady time on the reported onsets, rounding and the score. The reports
// are built by hand (summarise reads only the fields set here), so each expected value is
// worked by hand from RULES.md (rules 1, 8, 13 and 22) and SCORE.md's weights; pitch names use
// middle C = C4, as in the MIDI spec's note numbering (note 60) and common practice.
// Everything is built inside the tests, so that the mutation run sees which test covers what.
import { describe, expect, it } from "vitest";
import { parseKey } from "../../../app/analysis/pitch";
import { smoothnessOf, summarise, tempoSteadiness, topLineNotes } from "../../../app/analysis/summary";
import type {
  ChangeReport,
  ChordReport,
  ChordTechnique,
  FlagName,
  MelodyNote,
  NonChordTone,
} from "../../../app/analysis/types";
import { ANALYSIS_VERSION } from "../../../app/analysis/version";

type ChordBits = {
  startSec: number;
  topNote: number;
  flags?: FlagName[];
  techniques?: ChordTechnique[];
  bassLine?: number[];
  nonChordTones?: number[];
};

/** A chord report with only what the summary reads; bass-line and non-chord-tone onsets in seconds. */
function chord(b: ChordBits): ChordReport {
  return {
    startSec: b.startSec,
    topNote: b.topNote,
    flags: b.flags ?? [],
    techniques: b.techniques ?? [],
    bassLine: (b.bassLine ?? []).map((startSec) => ({ note: 36, noteName: "C2", startSec })),
    nonChordTones: (b.nonChordTones ?? []).map((startSec): NonChordTone => ({
      note: 62,
      noteName: "D4",
      startSec,
      kind: null,
    })),
  } as unknown as ChordReport;
}

function change(graded: boolean, motion: number | null, bestMotion: number | null, flags: string[] = []) {
  return { graded, motion, bestMotion, flags } as unknown as ChangeReport;
}

const tune = (note: number, startSec: number): MelodyNote => ({ startSec, endSec: startSec + 0.5, note, noteName: "" });

function input(over: Partial<Parameters<typeof summarise>[0]> = {}): Parameters<typeof summarise>[0] {
  return {
    chords: [],
    melodyNotes: [],
    changes: [],
    key: parseKey("C"),
    keySource: "given",
    durationSec: 0,
    pedal: [],
    analysisVersion: ANALYSIS_VERSION,
    ...over,
  };
}

describe("summary totals", () => {
  it("counts, motion over graded changes only, flags and techniques by name, rounding and the score", () => {
    const chords = [
      chord({ startSec: 0, topNote: 72, flags: ["muddy-low-interval"], techniques: ["inversion"] }),
      chord({ startSec: 1, topNote: 74, techniques: ["inversion", "open-voicing"] }),
      chord({ startSec: 2, topNote: 76, flags: ["too-many-notes", "muddy-low-interval"] }),
    ];
    // the second change is not graded (its second chord holds more than 8 pitches, rule 8)
    const changes = [change(true, 7, 3, ["root-position-leap"]), change(false, null, null, ["pedal-blur"])];
    const s = summarise(
      input({
        chords,
        changes,
        melodyNotes: [],
        keySource: "estimated",
        durationSec: 3.14159,
        pedal: [
          { start: 0, end: 0.5 },
          { start: 1.25, end: 2.0004 },
        ],
      }),
    );
    expect(s).toMatchObject({
      chordCount: 3,
      melodyNoteCount: 0,
      changeCount: 2,
      gradedChangeCount: 1,
      totalMotion: 7,
      bestTotalMotion: 3,
      smoothness: 0.429, // 3 / 7 to three places
      rootPositionLeaps: 1,
      key: "C",
      keySource: "estimated",
      durationSec: 3.142,
      pedalSec: 1.25, // 0.5 + 0.7504 s to three places
      analysisVersion: ANALYSIS_VERSION,
    });
    expect(s.flags).toEqual({
      "doubled-bass-third": 0,
      "muddy-low-interval": 2,
      "too-many-notes": 1,
      "root-position-leap": 1,
      "top-line-leap": 0,
      "pedal-blur": 1,
    });
    // C5 D5 E5: every step 2 semitones, so the top line is smooth (rule 13: 75% of changes)
    expect(s.techniques).toEqual({
      "added-second": 0,
      inversion: 2,
      "open-voicing": 1,
      "slash-bass": 0,
      "grace-to-third": 0,
      "smooth-top-line": 1,
    });
    expect(s.topLine).toEqual(["C5", "D5", "E5"]);
    expect(s.topLineSmoothShare).toBe(1);
    // steady time on the chords' onsets, 1 s apart
    expect(s.tempo).toEqual(tempoSteadiness([0, 1, 2]));
    // SCORE.md without a target: clean items are the 3 chords and the 1 graded change, of which
    // 3 carry a flag; three distinct techniques give full variety.
    expect(s.scoreParts.smoothness).toBeCloseTo(3 / 7, 12);
    expect(s.scoreParts.cleanliness).toBeCloseTo(0.25, 12);
    expect(s.scoreParts.techniqueVariety).toBe(1);
    expect(s.scoreParts.steadiness).toBe(s.tempo.steadiness);
    expect(s.scoreParts.accuracy).toBeNull();
    // 100 · (0.45 · 3/7 + 0.30 · 0.25 + 0.15 · 1 + 0.10 · 1) = 51.8
    expect(s.tempo.steadiness).toBe(1);
    expect(s.score).toBe(52);
    expect("target" in s || "accuracy" in s || "loops" in s || "mismatches" in s).toBe(false);
  });

  it("an ungraded change with a motion of its own adds nothing to the totals", () => {
    const chords = [chord({ startSec: 0, topNote: 72 }), chord({ startSec: 1, topNote: 72 })];
    const s = summarise(input({ chords, changes: [change(false, 9, 4), change(true, 5, 5)] }));
    expect(s).toMatchObject({ totalMotion: 5, bestTotalMotion: 5, smoothness: 1, gradedChangeCount: 1 });
    // a graded change without numbers counts as no motion
    const none = summarise(input({ chords, changes: [change(true, null, null), change(true, 4, 2)] }));
    expect(none).toMatchObject({ totalMotion: 4, bestTotalMotion: 2, smoothness: 0.5 });
  });

  it("one or two techniques give a third or two thirds of the variety part; a lone top note has no smooth share", () => {
    const one = summarise(input({ chords: [chord({ startSec: 0, topNote: 72, techniques: ["slash-bass"] })] }));
    expect(one.scoreParts.techniqueVariety).toBeCloseTo(1 / 3, 12);
    expect(one.topLineSmoothShare).toBeNull();
    expect(one.techniques["smooth-top-line"]).toBe(0);
    const two = summarise(
      input({
        chords: [
          chord({ startSec: 0, topNote: 72, techniques: ["slash-bass", "slash-bass"] }),
          chord({ startSec: 1, topNote: 79, techniques: ["grace-to-third"] }),
        ],
      }),
    );
    expect(two.scoreParts.techniqueVariety).toBeCloseTo(2 / 3, 12);
    expect(two.techniques).toMatchObject({ "slash-bass": 2, "grace-to-third": 1, "smooth-top-line": 0 });
    expect(two.topLineSmoothShare).toBe(0); // C5 → G5 leaps 7 semitones
  });

  it("a smooth share is rounded to three places: 2 smooth steps of 3 is 0.667, not smooth (under 75%)", () => {
    const tops = [72, 74, 76, 84];
    const s = summarise(input({ chords: tops.map((topNote, i) => chord({ startSec: i, topNote })) }));
    expect(s.topLineSmoothShare).toBe(0.667);
    expect(s.techniques["smooth-top-line"]).toBe(0);
  });

  it("with a target: its name, accuracy to three places, loops and mismatches, and SCORE.md's weights with a target", () => {
    const chords = [chord({ startSec: 0, topNote: 72 }), chord({ startSec: 1, topNote: 72 })];
    const mismatches = [{ index: 1 }] as unknown as NonNullable<Parameters<typeof summarise>[0]["match"]>["mismatches"];
    const s = summarise(
      input({
        chords,
        changes: [change(true, 0, 0)],
        match: { target: "I IV", accuracy: 2 / 3, loops: 2, mismatches },
      }),
    );
    expect(s).toMatchObject({ target: "I IV", accuracy: 0.667, loops: 2 });
    expect(s.mismatches).toBe(mismatches);
    expect(s.scoreParts.accuracy).toBeCloseTo(2 / 3, 12);
    // the repeated top note is a smooth top line, one technique: variety 1/3
    // 100 · (0.35 · 1 + 0.25 · 1 + 0.10 · 1/3 + 0.10 · 1 + 0.20 · 2/3) = 86.7
    expect(s.score).toBe(87);
  });

  it("no chords: no score, nothing moved", () => {
    const s = summarise(input());
    expect(s).toMatchObject({ chordCount: 0, score: 0, smoothness: 1, topLine: [], pedalSec: 0, durationSec: 0 });
    expect(smoothnessOf(0, 0)).toBe(1);
  });
});

describe("steady time on the onsets the reports show (rule 22, with rule 1's 80 ms)", () => {
  it("chords, bass-line notes, non-chord tones and melody notes, in time order, strikes within 80 ms counted once", () => {
    const chords = [
      chord({ startSec: 0, topNote: 72, bassLine: [1], nonChordTones: [0.5] }),
      chord({ startSec: 2, topNote: 74, nonChordTones: [2.5] }),
    ];
    // 0.08 s after the first chord: one strike with it; 1.5 and 3: strikes of their own
    const melodyNotes = [tune(76, 0.08), tune(77, 1.5), tune(79, 3)];
    const s = summarise(input({ chords, melodyNotes }));
    const expected = tempoSteadiness([0, 0.5, 1, 1.5, 2, 2.5, 3]);
    expect(s.tempo).toEqual(expected);
    // the onset 80 ms late, counted on its own, would read differently
    expect(tempoSteadiness([0, 0.08, 0.5, 1, 1.5, 2, 2.5, 3])).not.toEqual(expected);
    expect(s.melodyNoteCount).toBe(3);
  });

  it("a bass-line note or a non-chord tone between two chords is a strike of its own", () => {
    // chords at 0 and 2 s alone are 2 s apart; a note at 1 s halves the gap
    const alone = tempoSteadiness([0, 2]);
    expect(tempoSteadiness([0, 1, 2])).not.toEqual(alone);
    const bass = [chord({ startSec: 0, topNote: 72, bassLine: [1] }), chord({ startSec: 2, topNote: 72 })];
    expect(summarise(input({ chords: bass })).tempo).toEqual(tempoSteadiness([0, 1, 2]));
    const tone = [chord({ startSec: 0, topNote: 72, nonChordTones: [1] }), chord({ startSec: 2, topNote: 72 })];
    expect(summarise(input({ chords: tone })).tempo).toEqual(tempoSteadiness([0, 1, 2]));
  });

  it("the 80 ms window runs from the strike's own onset, late in the take too", () => {
    // a melody note 50 ms after the chord at 2 s is struck with it
    const chords = [
      chord({ startSec: 0, topNote: 72 }),
      chord({ startSec: 1, topNote: 72 }),
      chord({ startSec: 2, topNote: 72 }),
    ];
    const s = summarise(input({ chords, melodyNotes: [tune(76, 2.05)] }));
    expect(s.tempo).toEqual(tempoSteadiness([0, 1, 2]));
    expect(tempoSteadiness([0, 1, 2, 2.05])).not.toEqual(tempoSteadiness([0, 1, 2]));
  });

  it("an onset more than 80 ms after the last counted one is a strike of its own", () => {
    const chords = [chord({ startSec: 0, topNote: 72 }), chord({ startSec: 1, topNote: 72 })];
    const s = summarise(input({ chords, melodyNotes: [tune(79, 0.3)] }));
    expect(s.tempo).toEqual(tempoSteadiness([0, 0.3, 1]));
    expect(s.tempo).not.toEqual(tempoSteadiness([0, 1]));
  });

  it("the file's tempo map is used where it is given: 100 bpm against the default 120 (MIDI spec)", () => {
    // Standard MIDI File 1.0: 120 bpm until a tempo event says otherwise; strikes 0.6 s apart
    // follow a 100 bpm grid, not 120 bpm's
    const chords = [0, 0.6, 1.2, 1.8].map((startSec) => chord({ startSec, topNote: 72 }));
    const tempos = [{ time: 0, bpm: 100 }];
    const s = summarise(input({ chords, tempos }));
    expect(s.tempo).toEqual(tempoSteadiness([0, 0.6, 1.2, 1.8], tempos));
    expect(s.tempo.beatFrom).toBe("tempo-map");
    expect(summarise(input({ chords })).tempo.beatFrom).toBe("strikes");
  });

  it("the strike onsets given win over those the reports show", () => {
    const chords = [chord({ startSec: 0, topNote: 72 }), chord({ startSec: 1, topNote: 72 })];
    const s = summarise(input({ chords, strikeOnsets: [0, 0.25, 1] }));
    expect(s.tempo).toEqual(tempoSteadiness([0, 0.25, 1]));
  });
});

describe("the top line (RULES.md terms; rule 1's 80 ms)", () => {
  it("a melody note struck within 80 ms of a voicing's top counts once, the higher of the two", () => {
    // the voicing's top above the melody note struck with it: the voicing's top stays
    expect(topLineNotes([{ startSec: 0, topNote: 79 }], [tune(76, 0.05)])).toEqual([79]);
    expect(topLineNotes([{ startSec: 0, topNote: 72 }], [tune(76, 0.05)])).toEqual([76]);
    // exactly 80 ms apart is still one strike; 90 ms apart are two
    expect(topLineNotes([{ startSec: 0, topNote: 72 }], [tune(76, 0.08)])).toEqual([76]);
    expect(topLineNotes([{ startSec: 0, topNote: 72 }], [tune(76, 0.09)])).toEqual([72, 76]);
  });

  it("without a melody every voicing's top counts, even two harmonies begun within 80 ms", () => {
    expect(
      topLineNotes(
        [
          { startSec: 0, topNote: 72 },
          { startSec: 0.05, topNote: 74 },
        ],
        [],
      ),
    ).toEqual([72, 74]);
  });

  it("notes are taken in time order, and of two at one time the higher first", () => {
    expect(topLineNotes([{ startSec: 1, topNote: 72 }], [tune(76, 0), tune(74, 2)])).toEqual([76, 72, 74]);
    // at one time: the melody note under the voicing's top merges into it either way round
    expect(
      topLineNotes(
        [
          { startSec: 0, topNote: 67 },
          { startSec: 1, topNote: 65 },
        ],
        [tune(72, 0), tune(64, 1)],
      ),
    ).toEqual([72, 65]);
    // the window runs from the first note of a strike, not from the last merged one
    expect(topLineNotes([{ startSec: 0, topNote: 72 }], [tune(74, 0.06), tune(76, 0.12)])).toEqual([74, 76]);
  });
});
