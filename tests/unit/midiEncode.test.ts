// The browser recorder's file writer, read back by a second, independent parser from the
// registry: `midi-file` (npm, 1.2.4). Byte meanings follow the Standard MIDI File 1.0
// specification (MMA, RP-001): header chunk "MThd", tempo as microseconds per quarter note,
// a note-on with velocity 0 is a note-off, controller 64 values 0–63 off and 64–127 on.
import { parseMidi, type MidiEvent } from "midi-file";
import { describe, expect, it } from "vitest";
import { analyseMidi, analyseNotes } from "~/analysis";
import type { NoteEvent, PedalSpan } from "~/analysis/types";
import { asRecordedTake } from "~/browser/liveGrading";
import { encodeMidi, microsecondsPerBeat, PPQ, recordingFileName, secondsToTicks } from "~/browser/midiEncode";

type ReadNote = { midi: number; startTick: number; endTick: number; velocity: number; channel: number };

/** Pairs midi-file's raw events into notes (each note-on closed by the next note-off of its key). */
function readBack(bytes: Uint8Array) {
  const parsed = parseMidi(bytes);
  const notes: ReadNote[] = [];
  const pedal: Array<{ tick: number; value: number }> = [];
  const tempos: number[] = [];
  for (const track of parsed.tracks) {
    let tick = 0;
    const open = new Map<number, Array<{ tick: number; velocity: number; channel: number }>>();
    for (const e of track as MidiEvent[]) {
      tick += e.deltaTime;
      if (e.type === "setTempo") tempos.push(e.microsecondsPerBeat);
      if (e.type === "controller" && e.controllerType === 64) pedal.push({ tick, value: e.value });
      const isOn = e.type === "noteOn" && e.velocity > 0;
      const isOff = e.type === "noteOff" || (e.type === "noteOn" && e.velocity === 0);
      if (isOn)
        open.set(e.noteNumber, [...(open.get(e.noteNumber) ?? []), { tick, velocity: e.velocity, channel: e.channel }]);
      else if (isOff) {
        const start = open.get(e.noteNumber)?.shift();
        if (start)
          notes.push({
            midi: e.noteNumber,
            startTick: start.tick,
            endTick: tick,
            velocity: start.velocity,
            channel: start.channel,
          });
      }
    }
  }
  notes.sort((a, b) => a.startTick - b.startTick || a.midi - b.midi);
  return { header: parsed.header, notes, pedal, tempos };
}

// A known note list (invented for this test): I IV V I in D with inversions, the way a
// student might play it, with uneven human timing so every time falls between ticks.
const v = (byte: number) => byte / 127;
const KNOWN: NoteEvent[] = [
  { midi: 62, start: 0.0123, end: 0.4311, velocity: v(90) },
  { midi: 66, start: 0.0187, end: 0.4377, velocity: v(84) },
  { midi: 69, start: 0.0241, end: 0.4402, velocity: v(100) },
  { midi: 62, start: 0.4517, end: 0.8633, velocity: v(77) },
  { midi: 67, start: 0.4559, end: 0.8701, velocity: v(81) },
  { midi: 71, start: 0.4601, end: 0.8777, velocity: v(95) },
  { midi: 61, start: 0.9049, end: 1.3222, velocity: v(70) },
  { midi: 64, start: 0.9113, end: 1.3301, velocity: v(88) },
  { midi: 69, start: 0.9178, end: 1.3359, velocity: v(1) },
  { midi: 62, start: 1.3359, end: 1.9001, velocity: v(127) },
  { midi: 66, start: 1.3402, end: 1.9034, velocity: v(64) },
  { midi: 69, start: 1.3461, end: 1.9102, velocity: v(99) },
];
const PEDAL: PedalSpan[] = [
  { start: 0.4448, end: 0.9011 },
  { start: 1.331, end: 1.95 },
];

describe("encodeMidi, read back with midi-file", () => {
  for (const bpm of [120, 72, 97]) {
    it(`writes every note, time and velocity at ${bpm} bpm (within one tick)`, () => {
      const back = readBack(encodeMidi({ notes: KNOWN, pedal: PEDAL, bpm }));
      // SMF 1.0: format 1 (a tempo track and a note track), ticks per quarter note in the header.
      expect(back.header.format).toBe(1);
      expect(back.header.numTracks).toBe(2);
      expect(back.header.ticksPerBeat).toBe(PPQ);
      expect(back.tempos).toEqual([Math.floor(60_000_000 / bpm)]);
      const secPerTick = microsecondsPerBeat(bpm) / 1_000_000 / PPQ;
      expect(back.notes).toHaveLength(KNOWN.length);
      back.notes.forEach((n, i) => {
        const want = KNOWN[i];
        expect(n.midi).toBe(want.midi);
        expect(Math.abs(n.startTick * secPerTick - want.start)).toBeLessThanOrEqual(secPerTick);
        expect(Math.abs(n.endTick * secPerTick - want.end)).toBeLessThanOrEqual(secPerTick);
        // The velocity byte the keyboard sent comes back unchanged, even 1 (never 0 = note-off).
        expect(n.velocity).toBe(Math.round(want.velocity * 127));
        expect(n.channel).toBe(0);
      });
      // Pedal: controller 64 down (127) and up (0) at each span's ends.
      expect(back.pedal.map((p) => p.value)).toEqual([127, 0, 127, 0]);
      const pedalTimes = PEDAL.flatMap((p) => [p.start, p.end]);
      back.pedal.forEach((p, i) =>
        expect(Math.abs(p.tick * secPerTick - pedalTimes[i])).toBeLessThanOrEqual(secPerTick),
      );
    });
  }

  it("a key released and struck again on the same tick is written release first", () => {
    const notes: NoteEvent[] = [
      { midi: 60, start: 0.5, end: 1, velocity: 0.8 },
      { midi: 60, start: 0, end: 0.5, velocity: 0.8 },
    ];
    const back = readBack(encodeMidi({ notes, bpm: 120 }));
    expect(back.notes.map((n) => [n.startTick, n.endTick])).toEqual([
      [0, secondsToTicks(0.5, 120)],
      [secondsToTicks(0.5, 120), secondsToTicks(1, 120)],
    ]);
  });

  it("starts with the Standard MIDI File header chunk", () => {
    const bytes = encodeMidi({ notes: KNOWN });
    expect(String.fromCharCode(...bytes.slice(0, 4))).toBe("MThd");
    expect(readBack(bytes).tempos).toEqual([500_000]); // 120 bpm when no tempo is given
  });

  it("the server's reading of the file grades the take exactly as the browser did live", () => {
    // What the panel shows comes from analyseNotes on the raw notes; what the take page shows
    // comes from analyseMidi on the uploaded bytes. They must agree.
    const bpm = 84;
    const live = analyseNotes(asRecordedTake({ notes: KNOWN, pedal: PEDAL }, bpm), { key: "D" });
    const server = analyseMidi(encodeMidi({ notes: KNOWN, pedal: PEDAL, bpm }), { key: "D" });
    expect(server.chords.map((c) => c.symbol)).toEqual(["D", "G/D", "A/C#", "D"]);
    expect(server.chords.map((c) => c.symbol)).toEqual(live.chords.map((c) => c.symbol));
    expect(server.changes.map((c) => [c.motion, c.bestMotion, c.flags])).toEqual(
      live.changes.map((c) => [c.motion, c.bestMotion, c.flags]),
    );
    expect(server.summary.score).toBe(live.summary.score);
    expect(server.summary.pedalSec).toBeCloseTo(live.summary.pedalSec, 2);
  });
});

describe("recordingFileName", () => {
  it("names the file by the local date and time", () => {
    expect(recordingFileName(new Date(2026, 11, 1, 18, 30))).toBe("recording-2026-12-01-1830.mid");
    expect(recordingFileName(new Date(2027, 0, 9, 7, 5))).toBe("recording-2027-01-09-0705.mid");
  });
});
