import { describe, expect, it } from "vitest";
import { changeForChord, isBlackKey, rollLayout, stepChange, xOf, yOf } from "./pianoRoll";

describe("piano roll geometry", () => {
  it("covers the played pitches with two to spare, high notes on top", () => {
    const notes = [
      { midi: 40, start: 0, end: 1 },
      { midi: 72, start: 1, end: 2.5 },
    ];
    const l = rollLayout(notes, 2, { pxPerSec: 100, rowHeight: 10 });
    expect([l.lowest, l.highest]).toEqual([38, 74]);
    expect(l.height).toBe((74 - 38 + 1) * 10);
    expect(yOf(l, 74)).toBe(0);
    expect(yOf(l, 38)).toBe(l.height - 10);
    // Width follows the last release (2.5 s), not the shorter duration given.
    expect(l.width).toBe(250 + 16);
    expect(xOf(l, 1.5)).toBe(150);
  });

  it("shows at least the minimum number of rows for a narrow take", () => {
    const l = rollLayout([{ midi: 60, start: 0, end: 1 }], 1, { minRows: 18 });
    expect(l.highest - l.lowest + 1).toBe(18);
    expect(l.lowest).toBeLessThanOrEqual(58);
    expect(l.highest).toBeGreaterThanOrEqual(62);
  });

  it("stays inside MIDI's 0..127", () => {
    const l = rollLayout(
      [
        { midi: 0, start: 0, end: 1 },
        { midi: 127, start: 0, end: 1 },
      ],
      1,
    );
    expect([l.lowest, l.highest]).toEqual([0, 127]);
  });

  it("knows the black keys (C♯ D♯ F♯ G♯ A♯)", () => {
    expect([60, 61, 62, 63, 64, 65, 66, 67, 68, 69, 70, 71].map(isBlackKey)).toEqual([
      false,
      true,
      false,
      true,
      false,
      false,
      true,
      false,
      true,
      false,
      true,
      false,
    ]);
  });

  it("a chord selects the change arriving at it", () => {
    expect(changeForChord(0, 3)).toBe(0);
    expect(changeForChord(1, 3)).toBe(0);
    expect(changeForChord(3, 3)).toBe(2);
    expect(changeForChord(9, 3)).toBe(2);
    expect(changeForChord(0, 0)).toBeNull();
  });

  it("arrow keys move through the changes and stop at the ends", () => {
    expect(stepChange(null, "ArrowRight", 4)).toBe(0);
    expect(stepChange(0, "ArrowRight", 4)).toBe(1);
    expect(stepChange(3, "ArrowRight", 4)).toBe(3);
    expect(stepChange(0, "ArrowLeft", 4)).toBe(0);
    expect(stepChange(2, "Home", 4)).toBe(0);
    expect(stepChange(0, "End", 4)).toBe(3);
    expect(stepChange(2, "a", 4)).toBe(2);
    expect(stepChange(null, "ArrowRight", 0)).toBeNull();
  });
});

describe("piano roll drawing helpers", () => {
  it("draws many boxes as one path, rounded to a tenth of a pixel", async () => {
    const { boxesPath } = await import("./pianoRoll");
    expect(
      boxesPath([
        { x: 0, y: 10, w: 20.04, h: 8 },
        { x: 1.26, y: 0, w: 2, h: 3 },
      ]),
    ).toBe("M0 10h20v8h-20zM1.3 0h2v3h-2z");
    expect(boxesPath([])).toBe("");
  });

  it("finds the chord under a click by time, and none in the gaps", async () => {
    const { chordAtTime } = await import("./pianoRoll");
    const chords = [
      { startSec: 0, endSec: 0.9 },
      { startSec: 1, endSec: 1.9 },
      { startSec: 3, endSec: 3.5 },
    ];
    expect(chordAtTime(chords, 0.5)).toBe(0);
    expect(chordAtTime(chords, 1.2)).toBe(1);
    expect(chordAtTime(chords, 2.5)).toBeNull();
    expect(chordAtTime(chords, 3.54)).toBe(2);
    expect(chordAtTime(chords, -1)).toBeNull();
  });
});
