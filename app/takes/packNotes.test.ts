import { describe, expect, it } from "vitest";
import { packNotes, unpackNotes } from "./packNotes";

describe("packed notes", () => {
  it("round-trips pitch, times to the millisecond and velocity to MIDI's 0–127 steps", () => {
    const notes = [
      { midi: 60, start: 0.5004, end: 1.25, velocity: 100 / 127 },
      { midi: 127, start: 599.9, end: 600, velocity: 1 },
      { midi: 0, start: 0, end: 0.001, velocity: 0 },
    ];
    const packed = packNotes(notes);
    expect(packed).toEqual([60, 500, 1250, 100, 127, 599900, 600000, 127, 0, 0, 1, 0]);
    const back = unpackNotes(packed);
    expect(back.map((n) => n.midi)).toEqual([60, 127, 0]);
    expect(back[0].start).toBeCloseTo(0.5, 3);
    expect(back[0].velocity).toBeCloseTo(100 / 127, 6);
    expect(back[1].end).toBe(600);
  });

  it("packs nothing to nothing", () => {
    expect(unpackNotes(packNotes([]))).toEqual([]);
  });
});
