// Live grading in the recorder: what the panel shows while the student plays must be what the
// take page shows afterwards. The reference is the engine's own analysis of the finished take
// (itself checked against outside sources in tests/unit/analysis); the chord symbols and
// motions below are the RULES.md worked examples' arithmetic (rule 7 and 8) for D major.
import { describe, expect, it } from "vitest";
import { analyseNotes } from "~/analysis";
import type { NoteEvent } from "~/analysis/types";
import { asRecordedTake, GradeThrottle, gradeSoFar, harmonySettleSeconds, settleSeconds } from "~/browser/liveGrading";

/** The take as the recorder sees it at `now`: later notes not played yet, keys still down end at now. */
function asOf(notes: NoteEvent[], now: number): NoteEvent[] {
  return notes.filter((n) => n.start <= now).map((n) => ({ ...n, end: Math.min(n.end, now) }));
}

const chord = (at: number, pitches: number[], length = 0.42): NoteEvent[] =>
  pitches.map((midi, i) => ({ midi, start: at + i * 0.006, end: at + length, velocity: 0.7 }));

// D4 F#4 A4 → D4 G4 B4 → C#4 E4 A4 → D4 F#4 A4: I, IV/5th in the bass, V/3rd, I (invented).
const PROGRESSION = [
  ...chord(0, [62, 66, 69]),
  ...chord(0.5, [62, 67, 71]),
  ...chord(1, [61, 64, 69]),
  ...chord(1.5, [62, 66, 69], 0.8),
];

describe("gradeSoFar", () => {
  it("shows nothing before the first note", () => {
    expect(gradeSoFar({ notes: [] }, 0)).toMatchObject({ chords: [], settled: 0, changes: [] });
  });

  it("names each chord and grades each change once it has settled", () => {
    // A harmony is final once the next has begun and lasted a beat (rule 15), beyond the
    // strike windows: 0.78 + 0.5 + 0.1 s at 120 bpm.
    expect(harmonySettleSeconds(120)).toBeCloseTo(1.38, 10);
    const early = gradeSoFar({ notes: asOf(PROGRESSION, 1.5) }, 1.5, { key: "D", bpm: 120 });
    // 1.5 s: the second chord began only 1.0 s ago, so every chord is shown, still forming.
    expect(early.settled).toBe(0);
    const settledOne = gradeSoFar({ notes: asOf(PROGRESSION, 1.9) }, 1.9, { key: "D", bpm: 120 });
    expect(settledOne.settled).toBe(1);
    expect(settledOne.chords.map((c) => c.symbol).slice(0, 2)).toEqual(["D", "G/D"]);
    expect(settledOne.changes[0].motion).toBe(3);

    const later = gradeSoFar({ notes: asOf(PROGRESSION, 3.7) }, 3.7, { key: "D", bpm: 120 });
    expect(later.settled).toBe(4);
    expect(later.chords.map((c) => c.symbol)).toEqual(["D", "G/D", "A/C#", "D"]);
    // Rule 7 by hand: D F# A → D G B moves 0+1+2 = 3;
    // D4 G4 B4 → C#4 E4 A4 moves 1+3+2 = 6 (sorted voices), A/C# → D moves 1+2+0 = 3.
    expect(later.changes.map((c) => c.motion)).toEqual([3, 6, 3]);
    // Rule 8: each is already the smallest motion available.
    expect(later.changes.map((c) => c.bestMotion)).toEqual([3, 6, 3]);
    expect(later.key).toBe("D");
    expect(later.keySource).toBe("given");
  });

  it("reports flags on a change as soon as it is graded", () => {
    // G4 B4 D5 → C5 E5 G5: every voice up 5 in root position, motion 15, best 3, a
    // root-position leap (RULES.md worked example).
    const notes = [...chord(0, [67, 71, 74]), ...chord(0.6, [72, 76, 79])];
    const live = gradeSoFar({ notes }, 1.4, { key: "C" });
    expect(live.changes).toHaveLength(1);
    expect(live.changes[0]).toMatchObject({ motion: 15, bestMotion: 3, flags: ["root-position-leap"] });
  });

  it("what it calls settled never changes later: every moment of a take agrees with the finished take", () => {
    // A rolled chord whose last note is a grace note resolving late (rule 2), a lone bass just
    // before a chord (rule 3) and a bass held under a re-struck right hand (rule 3).
    const notes: NoteEvent[] = [
      ...PROGRESSION,
      { midi: 50, start: 2.3, end: 3.9, velocity: 0.7 }, // D3 held under the next two strikes
      ...[57, 62, 69, 74].map((midi, i) => ({ midi, start: 2.4 + i * 0.07, end: 2.9, velocity: 0.7 })),
      { midi: 64, start: 2.68, end: 2.83, velocity: 0.6 }, // grace E4 …
      { midi: 66, start: 2.85, end: 3.05, velocity: 0.6 }, // … resolving late to F#4 (rule 2)
      ...chord(3.1, [67, 71, 74]),
      { midi: 43, start: 3.62, end: 4.2, velocity: 0.7 }, // lone G2 just before the chord
      ...chord(3.7, [62, 67, 71]),
    ].sort((a, b) => a.start - b.start);
    const bpm = 96;
    const final = analyseNotes(asRecordedTake({ notes }, bpm), { key: "D" });
    // The D re-struck over the held D3 is the same harmony as the D before it (rule 15).
    expect(final.chords.map((c) => c.symbol)).toEqual(["D", "G/D", "A/C#", "D", "G/D", "G"]);
    expect(final.chords[3].graceNotes.map((g) => g.note)).toEqual([64]);
    let lastSettled = 0;
    for (let now = 0; now <= 6; now += 0.02) {
      const live = gradeSoFar({ notes: asOf(notes, now) }, now, { key: "D", bpm });
      expect(live.settled, `settled count never goes back (at ${now.toFixed(2)} s)`).toBeGreaterThanOrEqual(
        lastSettled,
      );
      lastSettled = live.settled;
      for (let k = 0; k < live.settled; k++) {
        expect(live.chords[k].notes, `chord ${k} at ${now.toFixed(2)} s`).toEqual(final.chords[k].notes);
        expect(live.chords[k].symbol).toBe(final.chords[k].symbol);
        expect(live.chords[k].flags).toEqual(final.chords[k].flags);
        expect(live.chords[k].techniques).toEqual(final.chords[k].techniques);
      }
      live.changes.forEach((c, i) => {
        if (c.to >= live.settled) return; // still forming: shown, but may change
        expect([c.motion, c.bestMotion, c.flags], `change ${i} at ${now.toFixed(2)} s`).toEqual([
          final.changes[i].motion,
          final.changes[i].bestMotion,
          final.changes[i].flags,
        ]);
      });
    }
    expect(lastSettled).toBe(final.chords.length);
  });

  it("a chord settles after an early bass, the strike window and a grace note's length (rules 1–3)", () => {
    // 120 bpm: a sixteenth is 125 ms, shorter than 150 ms, so 0.15 + 0.3 + 0.15 + 0.03 + 0.15 s.
    expect(settleSeconds(120)).toBeCloseTo(0.78, 10);
    // 40 bpm: a sixteenth is 375 ms, so a grace note (and its resolution) may last that long.
    expect(settleSeconds(40)).toBeCloseTo(0.15 + 0.3 + 0.375 + 0.03 + 0.375, 10);
    const notes = chord(0, [62, 66, 69], 2);
    const at = (now: number) => gradeSoFar({ notes: asOf(notes, now) }, now, { bpm: 120 });
    expect(at(0.05).chords.map((c) => c.symbol)).toEqual(["D"]); // shown at once, forming
    // Held for 2 s: final once every key has been up for the settling time.
    expect(at(1.9).settled).toBe(0);
    expect(at(2 + harmonySettleSeconds(120) - 0.01).settled).toBe(0);
    expect(at(2 + harmonySettleSeconds(120) + 0.01).settled).toBe(1);
  });

  it("estimates the key from the notes so far when none is given", () => {
    const live = gradeSoFar({ notes: PROGRESSION }, 3, {});
    expect(live.keySource).toBe("estimated");
    expect(live.chords.map((c) => c.symbol)).toEqual(["D", "G/D", "A/C#", "D"]);
  });
});

describe("GradeThrottle", () => {
  it("runs at most every minMs, and further apart when a run is slow", () => {
    const t = new GradeThrottle(150, 4);
    expect(t.due(0)).toBe(true);
    t.ran(0, 10);
    expect(t.due(100)).toBe(false);
    expect(t.due(150)).toBe(true);
    t.ran(150, 100); // a slow run: wait 4 × 100 ms
    expect(t.gapMs).toBe(400);
    expect(t.due(500)).toBe(false);
    expect(t.due(550)).toBe(true);
  });
});
