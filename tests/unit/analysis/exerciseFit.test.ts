// Which exercise a take sounds like (exerciseFit.ts): the heard key, each candidate's accuracy,
// and the verdict shown with a take. Chords are written as MIDI note numbers (middle C = 60,
// the MIDI spec's numbering); each triad is checked against tonal's Chord.detect (general-
// purpose music-theory library on npm) so the progressions are what they claim to be. Key
// families are common practice: a minor key shares its notes with the major key a minor third
// above (A minor and C major), not with its parallel major (C minor and C major). The
// thresholds (half the chords, 0.2, 0.6 and 0.25) are the module's own constants.
// Everything is built inside the tests, so that the mutation run sees which test covers what.
import { Chord, Note } from "tonal";
import { describe, expect, it } from "vitest";
import {
  checkAgainstTarget,
  FIT_CHORDS,
  FIT_MIN_ACCURACY,
  FIT_NO_MATCH,
  fitCandidates,
  fitWarning,
  heardKey,
  LIKELY_MARGIN,
  LIKELY_MIN_ACCURACY,
  type FitReport,
} from "../../../app/analysis/exerciseFit";
import { ProgressionError } from "../../../app/analysis/pitch";
import type { ChordReport, NoteEvent } from "../../../app/analysis/types";

// Root-position triads in C major (C4 = 60)
const C = [60, 64, 67];
const F = [53, 57, 60];
const G = [55, 59, 62];
const Am = [57, 60, 64];
const Fs = [54, 58, 61]; // F# major: no note of it in C major's I, IV or V

/** Chord reports with only what the fit reads (the notes, ascending), one a second. */
const reports = (chords: number[][]) => chords.map((notes) => ({ notes }) as unknown as ChordReport);
const notesOf = (chords: number[][]): NoteEvent[] =>
  chords.flatMap((c, i) => c.map((midi) => ({ midi, start: i, end: i + 1, velocity: 80 }) as NoteEvent));

const symbol = (midis: number[]) => Chord.detect(midis.map((m) => Note.fromMidiSharps(m)))[0];

describe("the chords are what they claim (tonal's Chord.detect)", () => {
  it("C, F, G, Am and F# triads", () => {
    expect([C, F, G, Am, Fs].map(symbol)).toEqual(["CM", "FM", "GM", "Am", "F#M"]);
  });
});

describe("fitCandidates", () => {
  it("I IV V I played in C: heard in C, a full match in C, none in F#, and a target that does not parse is left out", () => {
    const take = [C, F, G, C];
    const report = fitCandidates(notesOf(take), reports(take), [
      { exerciseId: "cadence", key: "C", target: "I IV V I" },
      { exerciseId: "cadence", key: "F#", target: "I IV V I" },
      { exerciseId: "broken", key: "C", target: "I IV )(" },
      { exerciseId: "no-key", key: "H", target: "I IV V I" },
    ]);
    expect(report.heardKey).toBe("C");
    expect(report.fits).toEqual([
      { exerciseId: "cadence", key: "C", accuracy: 1 },
      { exerciseId: "cadence", key: "F#", accuracy: 0 },
    ]);
  });

  it("a take without chords matches nothing, and chords without notes are skipped", () => {
    expect(fitCandidates([], [], [{ exerciseId: "x", key: "C", target: "I" }]).fits).toEqual([
      { exerciseId: "x", key: "C", accuracy: 0 },
    ]);
    const take = [C, [], C];
    const fit = fitCandidates(notesOf([C, C]), reports(take), [{ exerciseId: "x", key: "C", target: "I" }]);
    expect(fit.fits[0].accuracy).toBe(1);
    // I V I looped twice, with an empty report between the loops: still every chord played
    // (were it read as a wrong chord, the best alignment would play the target three times
    // with one chord wrong: 6 of 7)
    const looped = [C, G, C, [], C, G, C];
    expect(fitCandidates([], reports(looped), [{ exerciseId: "x", key: "C", target: "I V I" }]).fits[0].accuracy).toBe(
      1,
    );
  });

  it(`only the first ${FIT_CHORDS} chords are compared`, () => {
    const target = [{ exerciseId: "x", key: "C", target: "I" }];
    // the C chord counts for the target inside the window, not after it
    const within = [...Array<number[]>(FIT_CHORDS - 1).fill(Fs), C];
    const beyond = [...Array<number[]>(FIT_CHORDS).fill(Fs), C, C];
    expect(fitCandidates([], reports(within), target).fits[0].accuracy).toBe(1);
    expect(fitCandidates([], reports(beyond), target).fits[0].accuracy).toBe(0);
  });

  it("the chord's pitch classes count: C E G B is Imaj7, not I7, and C E G is neither", () => {
    // tonal's Chord.detect names C E G B Cmaj7
    expect(symbol([60, 64, 67, 71])).toBe("Cmaj7");
    const fits = fitCandidates([], reports([[60, 64, 67, 71]]), [
      { exerciseId: "maj7", key: "C", target: "Imaj7" },
      { exerciseId: "dom7", key: "C", target: "I7" },
    ]).fits;
    expect(fits.map((f) => f.accuracy)).toEqual([1, 0]);
    expect(fitCandidates([], reports([C]), [{ exerciseId: "maj7", key: "C", target: "Imaj7" }]).fits[0].accuracy).toBe(
      0,
    );
  });

  it("an error other than a progression error is not swallowed", () => {
    const broken = [{ exerciseId: "x", key: "C", target: null as unknown as string }];
    expect(() => fitCandidates([], reports([C]), broken)).toThrow(TypeError);
  });
});

describe("heardKey: the notes, the chords and the first and last basses (rule 23)", () => {
  it("A C E then C E G: C major from the notes alone, A minor with A in the first or the last bass", () => {
    // Krumhansl–Kessler profiles (key.ts): the notes correlate best with C major; rule 23's
    // bonus for a tonic bass tips them to A minor (the example of key.test.ts). Single notes
    // and bare fifths name no triad, so only their basses count here.
    const notes = notesOf([[57], [60], [64], [60], [64], [67]]);
    expect(heardKey(notes, []).name).toBe("C");
    expect(heardKey(notes, reports([[57], [64]])).name).toBe("Am");
    expect(heardKey(notes, reports([[64], [57, 64]])).name).toBe("Am");
    // C in one bass and A in the other: each key gets one bonus, and the notes decide
    expect(heardKey(notes, reports([[48], [57]])).name).toBe("C");
    expect(heardKey(notes, reports([[57], [48]])).name).toBe("C");
  });

  it("the chords' names count as evidence: Dm G C Am ends on A minor's tonic triad", () => {
    // A minor is C major's relative minor (common practice): the notes alone cannot tell them
    // apart and read as C; a progression ending on the A minor triad over A reads as A minor.
    const take = [[50, 53, 57], G, C, Am];
    expect(heardKey(notesOf(take), []).name).toBe("C");
    expect(heardKey(notesOf(take), reports(take)).name).toBe("Am");
  });
});

/** A fit report in which every candidate was scored. */
const report = (heard: string, fits: Array<[string, string, number]>): FitReport => ({
  heardKey: heard,
  fits: fits.map(([exerciseId, key, accuracy]) => ({ exerciseId, key, accuracy })),
});

describe("fitWarning", () => {
  it("no verdict for an exercise that was not scored, or one the take plays at least half of", () => {
    const r = report("G", [["a", "C", 0.5]]);
    expect(fitWarning(r, { exerciseId: "b", key: "C" })).toBeNull();
    expect(fitWarning(r, { exerciseId: "a", key: "D" })).toBeNull();
    expect(FIT_MIN_ACCURACY).toBe(0.5);
    expect(fitWarning(r, { exerciseId: "a", key: "C" })).toBeNull();
    expect(fitWarning(report("G", [["a", "C", 0.49]]), { exerciseId: "a", key: "C" })).toMatchObject({
      reason: "key",
      heardKey: "G",
      filedKey: "C",
      accuracy: 0.49,
      likely: null,
    });
  });

  it("the filed exercise is the one with its id and its key, wherever it stands in the list", () => {
    const fits: Array<[string, string, number]> = [
      ["b", "C", 0.1],
      ["a", "D", 0.1],
      ["a", "C", 0.9],
    ];
    // a/C plays 90% of its chords: no verdict (another exercise in C, or a in D, would give one)
    expect(fitWarning(report("C", fits), { exerciseId: "a", key: "C" })).toBeNull();
    expect(fitWarning(report("C", fits), { exerciseId: "a", key: "D" })).toMatchObject({
      filedKey: "D",
      accuracy: 0.1,
    });
  });

  it("a filed key of null takes the exercise in whatever key it was scored", () => {
    expect(fitWarning(report("G", [["a", "C", 0.1]]), { exerciseId: "a", key: null })).toMatchObject({
      filedKey: "C",
      reason: "key",
    });
  });

  it("relative keys are one family (common practice): C heard as A minor, G as E minor, Cm as Eb", () => {
    for (const [heard, filed] of [
      ["Am", "C"],
      ["C", "Am"],
      ["Em", "G"],
      ["Eb", "Cm"],
      ["C", "C"],
    ]) {
      // a take playing a third of its chords, in the family of its key: no verdict
      expect(
        fitWarning(report(heard, [["a", filed, 0.3]]), { exerciseId: "a", key: filed }),
        `${heard}/${filed}`,
      ).toBeNull();
    }
    // parallel keys, and keys a third apart the other way, are not (C major and C minor; C and E minor)
    for (const [heard, filed] of [
      ["Cm", "C"],
      ["A", "Am"],
      ["Em", "C"],
      ["C", "Em"],
      ["Am", "G"],
      ["D", "C"],
    ]) {
      expect(
        fitWarning(report(heard, [["a", filed, 0.3]]), { exerciseId: "a", key: filed })?.reason,
        `${heard}/${filed}`,
      ).toBe("key");
    }
  });

  it("in its own key, a take matching under 0.2 of its exercise is flagged; from 0.2 it is not", () => {
    expect(FIT_NO_MATCH).toBe(0.2);
    expect(fitWarning(report("C", [["a", "C", 0.2]]), { exerciseId: "a", key: "C" })).toBeNull();
    expect(fitWarning(report("C", [["a", "C", 0.19]]), { exerciseId: "a", key: "C" })).toEqual({
      heardKey: "C",
      filedKey: "C",
      accuracy: 0.19,
      reason: "chords",
      likely: null,
    });
  });

  it("an unreadable heard or filed key never says 'another key'", () => {
    expect(fitWarning(report("", [["a", "C", 0.3]]), { exerciseId: "a", key: "C" })).toBeNull();
    expect(fitWarning(report("C", [["a", "H", 0.3]]), { exerciseId: "a", key: "H" })).toBeNull();
    expect(fitWarning(report("C", [["a", "H", 0.1]]), { exerciseId: "a", key: "H" })?.reason).toBe("chords");
  });

  it(`another exercise is likely from ${LIKELY_MIN_ACCURACY}, and only ${LIKELY_MARGIN} above the filed one`, () => {
    const filed = { exerciseId: "a", key: "C" };
    // 0.3 against 0.6: clearly better, offered
    const offered = fitWarning(
      report("C", [
        ["a", "C", 0.3],
        ["b", "C", 0.6],
      ]),
      filed,
    );
    expect(offered).toEqual({
      heardKey: "C",
      filedKey: "C",
      accuracy: 0.3,
      reason: "chords",
      likely: { exerciseId: "b", key: "C", accuracy: 0.6 },
    });
    // 0.35 against 0.6: exactly the margin, still offered
    expect(
      fitWarning(
        report("C", [
          ["a", "C", 0.35],
          ["b", "C", 0.6],
        ]),
        filed,
      )?.likely?.exerciseId,
    ).toBe("b");
    // 0.4 against 0.6: not clearly better; 0.3 against 0.59: too weak itself
    for (const [own, other] of [
      [0.4, 0.6],
      [0.3, 0.59],
    ]) {
      expect(
        fitWarning(
          report("C", [
            ["a", "C", own],
            ["b", "C", other],
          ]),
          filed,
        ),
        `${own} against ${other}`,
      ).toBeNull();
    }
  });

  it("the likely exercise is the best match; on a tie, the one in the heard key's family", () => {
    const filed = { exerciseId: "a", key: "C" };
    const best = (fits: Array<[string, string, number]>) => fitWarning(report("D", fits), filed)?.likely;
    expect(
      best([
        ["a", "C", 0.1],
        ["b", "C", 0.7],
        ["c", "D", 0.9],
        ["d", "C", 0.8],
      ]),
    ).toEqual({ exerciseId: "c", key: "D", accuracy: 0.9 });
    // a tie between C and D (heard in D): D wins whichever comes first; Bm is D's family
    expect(
      best([
        ["a", "C", 0.1],
        ["b", "C", 0.8],
        ["c", "D", 0.8],
      ])?.exerciseId,
    ).toBe("c");
    expect(
      best([
        ["a", "C", 0.1],
        ["c", "Bm", 0.8],
        ["b", "C", 0.8],
      ])?.exerciseId,
    ).toBe("c");
    // the heard key's family only breaks ties: a better match in another key still wins
    expect(
      best([
        ["a", "C", 0.1],
        ["b", "C", 0.9],
        ["c", "D", 0.7],
      ])?.exerciseId,
    ).toBe("b");
    // an unreadable key, or an unreadable heard key, is in no family
    expect(
      best([
        ["a", "C", 0.1],
        ["h", "H", 0.8],
        ["c", "D", 0.8],
      ])?.exerciseId,
    ).toBe("c");
    expect(
      fitWarning(
        report("", [
          ["a", "C", 0.1],
          ["b", "C", 0.8],
          ["c", "D", 0.8],
        ]),
        filed,
      )?.likely?.exerciseId,
    ).toBe("b");
    // of two outside the heard key's family, the first found stays
    expect(
      best([
        ["a", "C", 0.1],
        ["b", "C", 0.8],
        ["e", "F", 0.8],
      ])?.exerciseId,
    ).toBe("b");
    // the filed exercise itself is never the likely one, even when another entry equals it
    expect(
      best([
        ["a", "C", 0.1],
        ["a", "D", 0.9],
      ]),
    ).toEqual({ exerciseId: "a", key: "D", accuracy: 0.9 });
  });
});

describe("checkAgainstTarget: every chord against a progression a person names", () => {
  it("I IV V I in C, written with spaces around and the key in lower case", () => {
    const take = reports([C, F, G, C]);
    expect(checkAgainstTarget(take, "  I IV V I ", "c")).toEqual({
      target: "I IV V I",
      key: "C",
      accuracy: 1,
      loops: 1,
      mismatches: [],
    });
  });

  it("no chords: nothing played, one pass, no differences listed", () => {
    expect(checkAgainstTarget([], "I V", "G")).toEqual({
      target: "I V",
      key: "G",
      accuracy: 0,
      loops: 1,
      mismatches: [],
    });
  });

  it("a key or a target that does not parse is refused", () => {
    expect(() => checkAgainstTarget(reports([C]), "I", "H")).toThrow(ProgressionError);
    expect(() => checkAgainstTarget(reports([C]), "I )(", "C")).toThrow(ProgressionError);
  });
});
