// What the recorder makes of a keyboard's bytes. Message meanings are those of the MIDI 1.0
// Detailed Specification (MMA): 0x9n note-on, where velocity 0 means note-off; 0x8n note-off;
// 0xBn controller change, controller 64 = sustain, 0–63 off and 64–127 on; 0xF8 timing clock
// and 0xFE active sensing are system real-time bytes; General MIDI puts drums on channel 10.
import { describe, expect, it } from "vitest";
import { NoteRecorder, parseMidiMessage } from "~/browser/noteRecorder";

describe("parseMidiMessage", () => {
  it("reads note-on, note-off and the sustain pedal on any channel but the drums", () => {
    expect(parseMidiMessage([0x90, 62, 100])).toEqual({ kind: "on", midi: 62, velocity: 100 / 127 });
    expect(parseMidiMessage([0x93, 62, 1])).toEqual({ kind: "on", midi: 62, velocity: 1 / 127 });
    expect(parseMidiMessage([0x90, 62, 0])).toEqual({ kind: "off", midi: 62 }); // velocity 0 = note-off
    expect(parseMidiMessage([0x80, 62, 64])).toEqual({ kind: "off", midi: 62 });
    expect(parseMidiMessage(new Uint8Array([0xb0, 64, 127]))).toEqual({ kind: "pedal", down: true });
    expect(parseMidiMessage([0xb0, 64, 64])).toEqual({ kind: "pedal", down: true });
    expect(parseMidiMessage([0xb0, 64, 63])).toEqual({ kind: "pedal", down: false });
  });

  it("ignores everything else", () => {
    expect(parseMidiMessage([0x99, 36, 100])).toBeNull(); // channel 10: drum pads
    expect(parseMidiMessage([0xb0, 1, 90])).toBeNull(); // modulation wheel
    expect(parseMidiMessage([0xe0, 0, 64])).toBeNull(); // pitch bend
    expect(parseMidiMessage([0xf8])).toBeNull(); // timing clock
    expect(parseMidiMessage([0xfe])).toBeNull(); // active sensing
    expect(parseMidiMessage([62, 100, 0])).toBeNull(); // a data byte where a status byte belongs
  });
});

describe("NoteRecorder", () => {
  it("pairs presses and releases into notes in seconds from the origin", () => {
    const r = new NoteRecorder(1000);
    r.handle({ kind: "on", midi: 62, velocity: 0.5 }, 1100);
    r.handle({ kind: "on", midi: 66, velocity: 0.6 }, 1105);
    r.handle({ kind: "off", midi: 62 }, 1500);
    expect(r.held()).toEqual([66]);
    expect(r.noteCount).toBe(2);
    const snap = r.snapshot(1600);
    expect(snap.notes).toEqual([
      { midi: 62, start: 0.1, end: 0.5, velocity: 0.5 },
      { midi: 66, start: 0.105, end: 0.6, velocity: 0.6 }, // still down: ends at "now"
    ]);
    r.handle({ kind: "off", midi: 66 }, 1700);
    expect(r.snapshot(5000).notes[1].end).toBeCloseTo(0.7, 10);
  });

  it("closes a key struck again without a release, and ignores a release of a key never pressed", () => {
    const r = new NoteRecorder(0);
    r.handle({ kind: "off", midi: 60 }, 50);
    r.handle({ kind: "on", midi: 60, velocity: 0.7 }, 100);
    r.handle({ kind: "on", midi: 60, velocity: 0.8 }, 400);
    r.handle({ kind: "off", midi: 60 }, 600);
    expect(r.snapshot(1000).notes).toEqual([
      { midi: 60, start: 0.1, end: 0.4, velocity: 0.7 },
      { midi: 60, start: 0.4, end: 0.6, velocity: 0.8 },
    ]);
  });

  it("notes played during the count-in start at zero, and time never runs backwards", () => {
    const r = new NoteRecorder(2000);
    r.handle({ kind: "on", midi: 50, velocity: 0.7 }, 1800);
    r.handle({ kind: "on", midi: 57, velocity: 0.7 }, 2300);
    r.handle({ kind: "off", midi: 57 }, 2290); // a device clock jittering backwards
    r.handle({ kind: "off", midi: 50 }, 2500);
    const { notes } = r.snapshot(3000);
    expect(notes[0]).toMatchObject({ midi: 50, start: 0, end: 0.5 });
    expect(notes[1].end).toBeGreaterThanOrEqual(notes[1].start);
  });

  it("records the sustain pedal as spans, an open one ending at now", () => {
    const r = new NoteRecorder(0);
    r.handle({ kind: "pedal", down: true }, 100);
    r.handle({ kind: "pedal", down: true }, 150); // half-pedal values above 63 repeat "down"
    r.handle({ kind: "pedal", down: false }, 900);
    r.handle({ kind: "pedal", down: false }, 950);
    r.handle({ kind: "pedal", down: true }, 1200);
    expect(r.snapshot(2000).pedal).toEqual([
      { start: 0.1, end: 0.9 },
      { start: 1.2, end: 2 },
    ]);
  });
});
