// The recorder's click schedule and its choice of keyboard. Beats at 60/bpm seconds apart is
// the definition of beats per minute; a one-bar count-in of four beats is common practice.
import { describe, expect, it } from "vitest";
import { beatsBetween } from "~/browser/metronome.client";
import { pickInput } from "~/browser/webMidi.client";

describe("beatsBetween", () => {
  it("counts in one bar, then keeps time through the take", () => {
    const beats = beatsBetween(120, 4, true, 0, 3);
    expect(beats.map((b) => b.time)).toEqual([0, 0.5, 1, 1.5, 2, 2.5]);
    expect(beats.map((b) => b.index)).toEqual([-4, -3, -2, -1, 0, 1]);
    // Accents on each bar's first beat: the count-in's first and the take's first.
    expect(beats.map((b) => b.accent)).toEqual([true, false, false, false, true, false]);
  });

  it("stops after the count-in when the metronome is off", () => {
    expect(beatsBetween(90, 4, false, 0, 10).map((b) => b.index)).toEqual([-4, -3, -2, -1]);
  });

  it("clicks through the take with no count-in", () => {
    expect(beatsBetween(60, 0, true, 0, 2.5).map((b) => [b.time, b.index])).toEqual([
      [0, 0],
      [1, 1],
      [2, 2],
    ]);
  });

  it("hands out each beat once across consecutive windows", () => {
    const windows = [0, 0.12, 0.31, 0.5, 0.77, 1.2, 2.01];
    const seen = [];
    for (let i = 1; i < windows.length; i++) seen.push(...beatsBetween(100, 4, true, windows[i - 1], windows[i]));
    expect(seen.map((b) => b.index)).toEqual([-4, -3, -2, -1]); // every 0.6 s at 100 bpm, up to 2.01 s
    expect(seen.map((b) => Math.round(b.time * 1000))).toEqual([0, 600, 1200, 1800]);
  });
});

describe("pickInput", () => {
  const inputs = [
    { id: "a", name: "Stage piano", manufacturer: "" },
    { id: "b", name: "Controller 49", manufacturer: "" },
  ];
  it("prefers the keyboard used last time, by id, then by name, else the first", () => {
    expect(pickInput(inputs, { id: "b", name: "Controller 49" })).toBe("b");
    expect(pickInput(inputs, { id: "zz", name: "Controller 49" })).toBe("b");
    expect(pickInput(inputs, { id: "zz", name: "Gone" })).toBe("a");
    expect(pickInput(inputs, null)).toBe("a");
    expect(pickInput([], null)).toBeNull();
  });
});
