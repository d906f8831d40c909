// RULES.md rules 1–3 with small hand-made note lists (times in seconds).
import { describe, expect, it } from "vitest";
import { findStrikes } from "../../../app/analysis/strikes";
import type { NoteEvent } from "../../../app/analysis/types";

const note = (midi: number, start: number, end: number): NoteEvent => ({ midi, start, end, velocity: 0.7 });
const pitches = (ns: NoteEvent[]) => ns.map((n) => n.midi).sort((a, b) => a - b);
const shape = (notes: NoteEvent[]) => findStrikes(notes).map((s) => pitches(s.notes));

describe("rule 1: strikes", () => {
  it("notes within 80 ms of the previous onset join the strike", () => {
    expect(shape([note(60, 0, 1), note(64, 0.08, 1), note(67, 0.16, 1)])).toEqual([[60, 64, 67]]);
  });

  it("a gap of more than 80 ms starts a new strike", () => {
    expect(shape([note(60, 0, 1), note(64, 0.081, 1)])).toEqual([[60], [64]]);
  });

  it("a rolled chord stays one strike up to 300 ms from its first onset, and no further", () => {
    const rolled = [0, 0.075, 0.15, 0.225, 0.3].map((t, i) => note(60 + i * 3, t, 1.5));
    expect(shape(rolled)).toEqual([[60, 63, 66, 69, 72]]);
    const tooLong = [0, 0.075, 0.15, 0.225, 0.3, 0.375].map((t, i) => note(60 + i * 3, t, 1.5));
    expect(shape(tooLong)).toEqual([[60, 63, 66, 69, 72], [75]]);
  });

  it("does not depend on the order of the input list", () => {
    const notes = [note(67, 1.02, 2), note(60, 0, 1), note(64, 0.03, 1), note(62, 1, 2), note(55, 0.01, 1)];
    expect(shape(notes)).toEqual(shape([...notes].reverse()));
    expect(shape(notes)).toEqual([
      [55, 60, 64],
      [62, 67],
    ]);
  });
});

describe("rule 2: grace notes", () => {
  it("a quick note released as a note one or two semitones above begins travels with that note", () => {
    // D#4 (63) for 90 ms into E4 (64), with C4 and G4 struck with the E4.
    const strikes = findStrikes([note(63, 0, 0.09), note(60, 0.1, 1), note(64, 0.1, 1), note(67, 0.1, 1)]);
    expect(strikes).toHaveLength(1);
    expect(pitches(strikes[0].notes)).toEqual([60, 64, 67]);
    expect(strikes[0].graces.map((g) => [g.note.midi, g.target.midi])).toEqual([[63, 64]]);
  });

  it("the resolution joins the grace note's strike even after rule 1's windows", () => {
    // A rolled chord with a grace A3 → Bb3 last: Bb3 begins 330 ms after the strike began.
    const notes = [note(43, 0, 2), note(50, 0.07, 2), note(62, 0.14, 2), note(57, 0.2, 0.33), note(58, 0.33, 2)];
    const strikes = findStrikes(notes);
    expect(strikes).toHaveLength(1);
    expect(pitches(strikes[0].notes)).toEqual([43, 50, 58, 62]);
    // Without the grace note, rule 1 alone would split Bb3 off.
    expect(shape(notes.filter((n) => n.midi !== 57))).toEqual([[43, 50, 62], [58]]);
    expect(strikes[0].graces).toHaveLength(1);
  });

  it("is not a grace note when too long, too far from the next onset, a step too wide, or not held shorter", () => {
    const cases = [
      [note(63, 0, 0.16), note(64, 0.16, 1)], // 160 ms > 150 ms at 120 bpm (a sixteenth is 125 ms)
      [note(63, 0, 0.09), note(64, 0.125, 1)], // released 35 ms before the onset
      [note(61, 0, 0.09), note(64, 0.09, 1)], // three semitones below
      [note(65, 0, 0.09), note(64, 0.09, 1)], // above, not below
      [note(63, 0, 0.09), note(64, 0.09, 0.15)], // the upper note is not held longer
    ];
    for (const c of cases) expect(findStrikes(c).flatMap((s) => s.graces)).toEqual([]);
  });

  it("a sixteenth at a slow tempo may be longer than 150 ms", () => {
    const notes = [note(63, 0, 0.24), note(64, 0.24, 1.5), note(60, 0.24, 1.5)];
    expect(findStrikes(notes).flatMap((s) => s.graces)).toEqual([]);
    // At 60 bpm a sixteenth lasts 250 ms.
    expect(findStrikes(notes, [{ time: 0, bpm: 60 }]).flatMap((s) => s.graces)).toHaveLength(1);
  });
});

describe("rule 3: held notes and a separate bass", () => {
  it("a key still held 150 ms into a later strike joins its chord", () => {
    const strikes = findStrikes([
      note(38, 0, 4),
      note(62, 0, 0.9),
      note(66, 0, 0.9),
      note(62, 1, 1.9),
      note(67, 1, 1.9),
    ]);
    expect(strikes).toHaveLength(2);
    expect(pitches(strikes[1].held)).toEqual([38]);
  });

  it("a key released sooner than 150 ms after the strike does not (legato overlap)", () => {
    const strikes = findStrikes([note(60, 0, 1.1), note(64, 0, 1.1), note(62, 1, 2), note(65, 1, 2)]);
    expect(strikes[1].held).toEqual([]);
    const justHeld = findStrikes([note(60, 0, 1.15), note(64, 0, 1.1), note(62, 1, 2), note(65, 1, 2)]);
    expect(pitches(justHeld[1].held)).toEqual([60]);
  });

  it("a lone bass up to 150 ms before a chord, lower than all of it, merges into it", () => {
    expect(shape([note(43, 0, 1), note(62, 0.15, 1), note(67, 0.15, 1)])).toEqual([[43, 62, 67]]);
    expect(shape([note(43, 0, 1), note(62, 0.16, 1), note(67, 0.16, 1)])).toEqual([[43], [62, 67]]);
    // Not lower than every note of the chord: stays a melody note.
    expect(shape([note(64, 0, 1), note(62, 0.12, 1), note(67, 0.12, 1)])).toEqual([[64], [62, 67]]);
  });

  it("a lone bass up to 150 ms after a chord, lower than all of it, merges into it", () => {
    expect(shape([note(62, 0, 1), note(67, 0, 1), note(43, 0.12, 1)])).toEqual([[43, 62, 67]]);
    expect(shape([note(62, 0, 1), note(67, 0, 1), note(43, 0.2, 1)])).toEqual([[62, 67], [43]]);
  });

  it("the sustain pedal never changes membership: only key releases count", () => {
    // Same keys; the reader reports pedal separately and the strikes ignore it.
    const strikes = findStrikes([note(38, 0, 0.5), note(62, 0, 0.5), note(66, 0, 0.5), note(62, 1, 2), note(67, 1, 2)]);
    expect(strikes[1].held).toEqual([]);
  });
});
