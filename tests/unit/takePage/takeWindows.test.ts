import { describe, expect, it } from "vitest";
import { analyseMidi, readMidi } from "~/analysis";
import { packNotes, unpackNotes } from "~/takes/packNotes";
import {
  allWindows,
  packMelody,
  unpackMelody,
  readTimeline,
  stitchWindows,
  timelineOf,
  windowOf,
  windowStart,
  WINDOW_SIZE,
  type TakeWindow,
} from "~/takes/takeWindows";
import { generateLongTake, generateTake, EXERCISES } from "../../../scripts/lib/takeGenerator";

// The take page carries one window of a long take's analysis and fetches the rest; these
// checks stitch every window back together and compare it with the whole analysis.
const bytes = generateLongTake(10);
const analysis = analyseMidi(bytes);
const notes = readMidi(bytes).notes;

function stitchAll(windows: TakeWindow[]) {
  return stitchWindows(timelineOf(analysis, notes), new Map(windows.map((w) => [w.from, w])));
}

describe("take windows", () => {
  it("a ten-minute take has many windows", () => {
    expect(analysis.changes.length).toBeGreaterThan(10 * WINDOW_SIZE);
    expect(analysis.chords.length).toBe(analysis.changes.length + 1);
  });

  it("stitched back together, the windows equal the whole analysis: changes, chords, melody notes and notes", () => {
    const windows = allWindows(analysis, notes);
    const whole = stitchAll(windows);
    expect(whole.changes).toEqual(analysis.changes);
    expect(whole.chords).toEqual(analysis.chords);
    // Melody notes travel packed too (whole milliseconds).
    expect(whole.melodyNotes).toEqual(unpackMelody(packMelody(analysis.melodyNotes)));
    expect(whole.melodyNotes.map((m) => [m.note, m.noteName])).toEqual(
      analysis.melodyNotes.map((m) => [m.note, m.noteName]),
    );
    // Notes travel packed (whole milliseconds, velocity in 0–127), so compare with the packed take.
    expect(whole.notes).toEqual(unpackNotes(packNotes(notes)));
    // Every note travels exactly once.
    expect(windows.reduce((n, w) => n + w.notes.length / 4, 0)).toBe(notes.length);
  });

  it("a window holds its changes and the chords they join", () => {
    const from = 5 * WINDOW_SIZE;
    const w = windowOf(analysis, notes, from + 7);
    expect(w.from).toBe(from);
    expect(w.changes).toEqual(analysis.changes.slice(from, from + WINDOW_SIZE));
    for (const c of w.changes) {
      expect(w.chords[c.from - w.from]).toEqual(analysis.chords[c.from]);
      expect(w.chords[c.to - w.from]).toEqual(analysis.chords[c.to]);
    }
    // Its notes start inside its stretch of time.
    const start = analysis.chords[from].startSec;
    const end = analysis.chords[from + WINDOW_SIZE].startSec;
    for (const n of unpackNotes(w.notes)) expect(n.start >= start - 0.0005 && n.start < end + 0.0005).toBe(true);
  });

  it("an out-of-range start gives the last window", () => {
    const last = windowStart(analysis.changes.length - 1);
    expect(windowOf(analysis, notes, 1e9).from).toBe(last);
    expect(windowOf(analysis, notes, Number.NaN).from).toBe(0);
  });

  it("with only some windows here, the rest are stubs from the time line with the right places, names and flags", () => {
    const partial = stitchWindows(timelineOf(analysis, notes), new Map([[0, windowOf(analysis, notes, 0)]]));
    expect(partial.chords).toHaveLength(analysis.chords.length);
    expect(partial.changes).toHaveLength(analysis.changes.length);
    analysis.chords.forEach((c, i) => {
      const s = partial.chords[i];
      expect(Math.abs(s.startSec - c.startSec)).toBeLessThanOrEqual(0.0051);
      expect(Math.abs(s.endSec - c.endSec)).toBeLessThanOrEqual(0.0101);
      expect([s.symbol, s.roman, s.flags]).toEqual([c.symbol, c.roman, c.flags]);
    });
    analysis.changes.forEach((c, i) =>
      expect([partial.changes[i].from, partial.changes[i].to, partial.changes[i].flags]).toEqual([
        c.from,
        c.to,
        c.flags,
      ]),
    );
    expect(partial.loaded).toEqual(new Set([0]));
  });

  it("the time line repeats no name: each combination of name, numeral and flags is listed once", () => {
    const t = timelineOf(analysis, notes);
    expect(new Set(t.labels.map((l) => JSON.stringify(l))).size).toBe(t.labels.length);
    expect(t.labels.length).toBeLessThan(analysis.chords.length / 10);
    expect(readTimeline(t).chords).toHaveLength(analysis.chords.length);
    expect(t.range).toEqual([Math.min(...notes.map((n) => n.midi)), Math.max(...notes.map((n) => n.midi))]);
  });

  it("a short take is one window", () => {
    const short = generateTake({ exercise: EXERCISES[0], skill: 1, seed: 3 });
    const a = analyseMidi(short);
    const n = readMidi(short).notes;
    const windows = allWindows(a, n);
    expect(windows).toHaveLength(1);
    expect(windows[0].chords).toEqual(a.chords);
    expect(windows[0].changes).toEqual(a.changes);
  });
});
