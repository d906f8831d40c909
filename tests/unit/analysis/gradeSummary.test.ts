// Grading of changes (rules 7–10 as the engine applies them, suggestions), the whole-take
// summary, the score and the key estimate.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { analyseMidi } from "../../../app/analysis/index";
import { readMidi } from "../../../app/analysis/readMidi";
import { chordReport } from "../../../app/analysis/chords";
import { chordFlags } from "../../../app/analysis/chordFlags";
import { gradeChange } from "../../../app/analysis/grade";
import { estimateKey } from "../../../app/analysis/key";
import { parseKey } from "../../../app/analysis/pitch";
import { score, scoreParts } from "../../../app/analysis/score";
import type { Strike } from "../../../app/analysis/strikes";
import { smoothnessOf, summarise, tempoSteadiness, topLineNotes } from "../../../app/analysis/summary";
import { ANALYSIS_VERSION } from "../../../app/analysis/version";

const key = parseKey("C");
function chord(pitches: number[], start = 0) {
  const s: Strike = {
    start,
    notes: pitches.map((midi) => ({ midi, start, end: start + 0.9, velocity: 0.7 })),
    graces: [],
    held: [],
  };
  return chordReport(s, key, []);
}
const change = (a: number[], b: number[]) => gradeChange(0, 1, chord(a), chord(b), key);

describe("grading a change (RULES.md worked examples)", () => {
  // Every row of RULES.md's worked-example table, through the engine's naming (inversions
  // decide rule 9) and grading; each also transposed up a minor third.
  it.each([
    [[53, 57, 60], [58, 62, 65], 15, 3, ["root-position-leap"]],
    [[53, 57, 60], [53, 58, 62], 3, 3, []],
    [[60, 64, 67], [60, 65, 69], 3, 3, []],
    [[60, 65, 69], [59, 62, 67], 6, 6, []],
    [[67, 71, 74], [72, 76, 79], 15, 3, ["root-position-leap"]],
    [[45, 60, 64, 69], [41, 60, 65, 69], 5, 5, []],
    [[50, 60, 65, 69], [43, 59, 62, 65], 15, 11, []],
    [[48, 60, 64, 67], [41, 53, 57, 60], 28, 10, ["root-position-leap"]],
    [[60, 64, 67], [60, 64, 67, 70], 3, 2, []],
  ])("%j → %j: motion %i, best %i, flags %j", (a, b, motionValue, best, flags) => {
    for (const t of [0, 3]) {
      const c = change(
        a.map((n) => n + t),
        b.map((n) => n + t),
      );
      expect([c.motion, c.bestMotion, c.flags]).toEqual([motionValue, best, flags]);
    }
  });

  it("F3 A3 C4 → Bb3 D4 F4: motion 15, best 3 (F3 Bb3 D4), root-position leap", () => {
    const c = change([53, 57, 60], [58, 62, 65]);
    expect([c.motion, c.bestMotion, c.bestVoicing, c.flags]).toEqual([15, 3, [53, 58, 62], ["root-position-leap"]]);
    expect(c.bassMotion).toBe(5);
    expect(c.topVoiceInterval).toBe(5);
    expect(c.largestVoiceMove).toBe(5);
    expect(c.commonTones).toBe(0);
  });

  it("transposed down a fourth, and in reverse direction, the same numbers hold", () => {
    const t = change([48, 52, 55], [53, 57, 60]); // C → F, root position
    expect([t.motion, t.bestMotion, t.flags]).toEqual([15, 3, ["root-position-leap"]]);
    const back = change([58, 62, 65], [53, 57, 60]);
    expect([back.motion, back.flags]).toEqual([15, ["root-position-leap"]]);
  });

  it("C4 E4 G4 → C4 F4 A4: motion 3, a common tone, no flags", () => {
    const c = change([60, 64, 67], [60, 65, 69]);
    expect([c.motion, c.bestMotion, c.commonTones, c.flags]).toEqual([3, 3, 1, []]);
  });

  it("G4 B4 D5 → C5 E5 G5: 15 and 3 with a leap; a top line of more than 7 semitones is flagged", () => {
    expect(change([67, 71, 74], [72, 76, 79]).flags).toEqual(["root-position-leap"]);
    expect(change([62, 66, 69], [71, 74, 79]).flags).toEqual(["top-line-leap"]);
    expect(change([62, 66, 69], [69, 73, 76]).flags).toContain("root-position-leap");
  });

  it("suggestions: smoothest, keeping the top, keeping the bass — none raising a chord flag", () => {
    const c = change([53, 57, 60], [58, 62, 65]);
    expect(c.suggestions.map((s) => s.kind)).toContain("smoothest");
    expect(c.suggestions[0]).toMatchObject({ kind: "smoothest", voicing: [53, 58, 62], motion: 3 });
    for (const s of c.suggestions) {
      expect(chordFlags(s.voicing)).toEqual([]);
      expect(s.motion).toBeLessThanOrEqual(c.motion!);
    }
    const keepTop = c.suggestions.find((s) => s.kind === "keep-top");
    if (keepTop) expect(Math.max(...keepTop.voicing)).toBe(65);
    const keepBass = c.suggestions.find((s) => s.kind === "keep-bass");
    if (keepBass) expect(Math.min(...keepBass.voicing)).toBe(58);
    expect(c.suggestions.some((s) => s.kind !== "smoothest")).toBe(true);
  });

  it("a suggestion never doubles the bass third even when that would move less", () => {
    // C4 E4 G4 → Bb/D played D2 Bb3 F4: the smoothest unflagged choice must avoid D above D2 except as top/octave.
    const c = change([38, 60, 64, 67], [38, 58, 62, 65]);
    for (const s of c.suggestions) expect(chordFlags(s.voicing)).toEqual([]);
  });

  it("a chord of more than 8 distinct pitches is not graded", () => {
    const c = change([60, 64, 67], [48, 50, 52, 53, 55, 57, 59, 60, 62]);
    expect([c.graded, c.motion, c.bestMotion, c.suggestions]).toEqual([false, null, null, []]);
  });
});

describe("summary", () => {
  it("smoothness is a ratio of sums, 1.0 when nothing moved", () => {
    expect(smoothnessOf(0, 0)).toBe(1);
    expect(smoothnessOf(30, 6)).toBeCloseTo(0.2);
  });

  it("steady time comes from the beat, not from the time between changes (rule 22)", () => {
    expect(tempoSteadiness([0, 1, 2, 3])).toMatchObject({ medianGapSec: 1, spread: 0, steadiness: 1 });
    // changes 0.5, 1.5 and 0.5 s apart: uneven harmonic rhythm, every strike on the 120 bpm beat
    // (the first edition scored this 0.434 from the spread of the gaps)
    expect(tempoSteadiness([0, 0.5, 2, 2.5])).toMatchObject({ steadiness: 1, beatFrom: "tempo-map" });
    expect(tempoSteadiness([0]).medianGapSec).toBeNull();
  });

  it("the summary judges steady time on the strikes it is given, with the file's tempo", () => {
    const chords = [chord([53, 57, 60], 0), chord([58, 62, 65], 4)];
    const base = {
      chords,
      melodyNotes: [],
      changes: [gradeChange(0, 1, chords[0], chords[1], key)],
      key,
      keySource: "given" as const,
      durationSec: 5,
      pedal: [],
      analysisVersion: ANALYSIS_VERSION,
    };
    // the first chord re-struck every beat at 60 bpm, then the second: strict time
    const strikes = [0, 1, 2, 3, 4];
    expect(summarise({ ...base, strikeOnsets: strikes, tempos: [{ time: 0, bpm: 60 }] }).tempo.steadiness).toBe(1);
    // a strike 0.37 s late breaks it
    const late = summarise({ ...base, strikeOnsets: [0, 1, 2.37, 3, 4], tempos: [{ time: 0, bpm: 60 }] }).tempo;
    expect(late.steadiness).toBeLessThan(0.8);
  });

  it("totals, flags and techniques by name, top line and score", () => {
    const chords = [chord([53, 57, 60], 0), chord([58, 62, 65], 1), chord([53, 57, 60], 2)];
    const changes = [gradeChange(0, 1, chords[0], chords[1], key), gradeChange(1, 2, chords[1], chords[2], key)];
    const s = summarise({
      chords,
      melodyNotes: [],
      changes,
      key,
      keySource: "given",
      durationSec: 3,
      pedal: [],
      analysisVersion: ANALYSIS_VERSION,
    });
    expect(s.totalMotion).toBe(30);
    expect(s.bestTotalMotion).toBe(6);
    expect(s.smoothness).toBe(0.2);
    expect(s.rootPositionLeaps).toBe(2);
    expect(s.flags["root-position-leap"]).toBe(2);
    expect(s.techniques["smooth-top-line"]).toBe(0);
    expect(s.topLine).toEqual(["C4", "F4", "C4"]);
    // 0.45·0.2 + 0.30·(1 − 2/5) + 0.15·0 + 0.10·1 = 0.37
    expect(s.score).toBe(37);
    expect(s.analysisVersion).toBe(ANALYSIS_VERSION);
  });
});

describe("score", () => {
  it("weights without a target: smoothness 45, clean chords and changes 30, variety 15, steadiness 10", () => {
    const parts = scoreParts({
      chordCount: 4,
      smoothness: 1,
      flaggedItems: 0,
      items: 7,
      distinctTechniques: 3,
      steadiness: 1,
      accuracy: null,
    });
    expect(score(4, parts)).toBe(100);
    expect(score(4, { ...parts, smoothness: 0 })).toBe(55);
    expect(score(4, { ...parts, techniqueVariety: 0 })).toBe(85);
  });

  it("with a target, accuracy weighs 20", () => {
    const parts = scoreParts({
      chordCount: 4,
      smoothness: 1,
      flaggedItems: 0,
      items: 7,
      distinctTechniques: 3,
      steadiness: 1,
      accuracy: 0.5,
    });
    expect(score(4, parts)).toBe(90);
  });

  it("no chords, no score", () => {
    expect(
      score(
        0,
        scoreParts({
          chordCount: 0,
          smoothness: 1,
          flaggedItems: 0,
          items: 0,
          distinctTechniques: 0,
          steadiness: 1,
          accuracy: null,
        }),
      ),
    ).toBe(0);
  });
});

describe("key estimate (Krumhansl–Schmuckler)", () => {
  const notesOf = (pcsWithOctave: number[]) => pcsWithOctave.map((midi, i) => ({ midi, start: i, end: i + 1 }));

  it("finds D major from its scale and tonic triads, and Gm from its own", () => {
    expect(estimateKey(notesOf([62, 66, 69, 62, 64, 66, 67, 69, 71, 73, 74, 62, 66, 69])).key.name).toBe("D");
    expect(estimateKey(notesOf([55, 58, 62, 55, 57, 58, 60, 62, 63, 66, 67, 55, 58, 62])).key.name).toBe("Gm");
  });

  it("chord evidence settles a short ii–V–i: the G minor sample reads as Gm, the profile alone says otherwise", () => {
    const bytes = new Uint8Array(readFileSync(join(__dirname, "../../../samples/minor-colour-g.mid")));
    expect(analyseMidi(bytes).summary.key).toBe("Gm");
    expect(analyseMidi(bytes).summary.keySource).toBe("estimated");
    expect(estimateKey(readMidi(bytes).notes).key.name).not.toBe("Gm");
  });

  it("transposing the notes transposes the key", () => {
    const c = [60, 64, 67, 60, 62, 64, 65, 67, 69, 71, 72, 60, 64, 67];
    expect(estimateKey(notesOf(c)).key.name).toBe("C");
    expect(estimateKey(notesOf(c.map((n) => n + 8))).key.name).toBe("Ab");
  });
});

describe("top line (RULES.md terms: the melody where the take has one)", () => {
  const chordAt = (top: number, startSec: number) => ({ startSec, topNote: top });
  const tune = (note: number, startSec: number) => ({ startSec, note });
  it("is the voicings' top notes without a melody, and follows the melody with one", () => {
    expect(topLineNotes([chordAt(64, 0), chordAt(65, 1)], [])).toEqual([64, 65]);
    // C3 G3 E4 under melody G5 (struck with it) and E5, then F3 A3 E4 under F5 (worked by hand from RULES.md rule 18)
    for (const t of [0, 2, -3]) {
      expect(
        topLineNotes([chordAt(79 + t, 0), chordAt(77 + t, 2)], [tune(79 + t, 0.01), tune(76 + t, 1), tune(77 + t, 2)]),
      ).toEqual([79 + t, 76 + t, 77 + t]);
    }
  });
});
