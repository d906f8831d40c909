import { describe, expect, it } from "vitest";
import { chordReport } from "~/analysis/chords";
import { gradeChanges } from "~/analysis/grade";
import { parseKey } from "~/analysis/pitch";
import type { Strike } from "~/analysis/strikes";
import {
  chordIndexAt,
  chordPlan,
  midiFrequency,
  notesInWindow,
  pairPlan,
  planEnd,
  smootherPathPlan,
  takePlan,
} from "./playbackPlan";

const key = parseKey("F");
function chord(pitches: number[], start: number) {
  const s: Strike = {
    start,
    notes: pitches.map((midi) => ({ midi, start, end: start + 0.9, velocity: 0.7 })),
    graces: [],
    held: [],
  };
  return chordReport(s, key, []);
}

describe("playback plan", () => {
  it("tunes A4 (MIDI 69) to 440 Hz and middle C (60) to 261.63 Hz (MIDI Tuning Standard, equal temperament)", () => {
    expect(midiFrequency(69)).toBe(440);
    expect(midiFrequency(81)).toBe(880);
    expect(midiFrequency(60)).toBeCloseTo(261.626, 3);
  });

  it("plays the take's notes in onset order and keeps very short notes audible", () => {
    const plan = takePlan([
      { midi: 64, start: 1, end: 1.5, velocity: 0.5 },
      { midi: 60, start: 0, end: 0.01, velocity: 0.8 },
    ]);
    expect(plan.map((n) => n.midi)).toEqual([60, 64]);
    expect(plan[0].end).toBeCloseTo(0.06);
    expect(planEnd(plan)).toBe(1.5);
  });

  it("the smoother path re-voices each chord with its change's best voicing (RULES.md: F A C → B♭ D F best F3 B♭3 D4)", () => {
    const chords = [chord([53, 57, 60], 0), chord([58, 62, 65], 1)];
    const changes = gradeChanges(chords, key);
    const plan = smootherPathPlan(chords, changes, [{ startSec: 2, endSec: 2.5, note: 72, noteName: "C5" }]);
    expect(plan.filter((n) => n.start === 0).map((n) => n.midi)).toEqual([53, 57, 60]);
    expect(plan.filter((n) => n.start === 1).map((n) => n.midi)).toEqual([53, 58, 62]);
    expect(plan.filter((n) => n.start === 2).map((n) => n.midi)).toEqual([72]);
  });

  it("finds the sounding chord by time", () => {
    const chords = [{ startSec: 0.5 }, { startSec: 1.5 }, { startSec: 3 }];
    expect(chordIndexAt(chords, 0.2)).toBe(-1);
    expect(chordIndexAt(chords, 0.5)).toBe(0);
    expect(chordIndexAt(chords, 2.9)).toBe(1);
    expect(chordIndexAt(chords, 99)).toBe(2);
  });

  it("hands out notes window by window, each once", () => {
    const plan = takePlan(
      Array.from({ length: 10 }, (_, i) => ({ midi: 60 + i, start: i * 0.25, end: i * 0.25 + 0.2, velocity: 0.7 })),
    );
    const seen: number[] = [];
    let cursor = 0;
    for (let t = 0; t < 3; t += 0.4) {
      const w = notesInWindow(plan, cursor, t, t + 0.4);
      cursor = w.cursor;
      seen.push(...w.notes.map((n) => n.midi));
    }
    expect(seen).toEqual(plan.map((n) => n.midi));
  });

  it("a suggestion is one chord; a pair is the chord before, then the suggestion", () => {
    expect(chordPlan([60, 64, 67]).every((n) => n.start === 0)).toBe(true);
    const pair = pairPlan([53, 57, 60], [53, 58, 62], 1);
    expect(pair.filter((n) => n.start === 1).map((n) => n.midi)).toEqual([53, 58, 62]);
  });
});
