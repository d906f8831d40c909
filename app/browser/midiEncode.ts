// Turns notes played into the browser into a Standard MIDI File, so a recorded take reaches
// the server as exactly the kind of file a student could have exported from other software.
// Pure (no DOM), so it is tested in Node and runs in the browser alike.
//
// We compute every tick ourselves rather than let @tonejs/midi convert seconds: the file
// stores the tempo as whole microseconds per quarter note (Standard MIDI File 1.0, "Set
// Tempo" meta event), so ticks must be derived from that rounded value, or a long take drifts
// against the tempo map a reader rebuilds.
import tonejsMidi from "@tonejs/midi";
import type { NoteEvent, PedalSpan } from "~/analysis/types";

const { Midi } = tonejsMidi;

/** Ticks per quarter note: 480 is the common choice of sequencers (common practice). */
export const PPQ = 480;
/** Standard MIDI File 1.0: 120 bpm when no tempo is given. */
export const DEFAULT_BPM = 120;
const SUSTAIN = 64; // controller 64, sustain pedal (MIDI 1.0 controller list)

export type EncodeInput = {
  /** times in seconds from the start of the recording */
  notes: readonly NoteEvent[];
  pedal?: readonly PedalSpan[];
  /** beats per minute written into the file; the metronome's tempo when one was used */
  bpm?: number;
  /** written as the track name */
  name?: string;
};

/** Microseconds per quarter note as the file stores it (a whole number). */
export function microsecondsPerBeat(bpm: number): number {
  return Math.floor(60_000_000 / bpm);
}

/** Seconds → ticks at one fixed tempo, rounded to the nearest tick. */
export function secondsToTicks(sec: number, bpm: number, ppq = PPQ): number {
  return Math.max(0, Math.round((sec * 1_000_000 * ppq) / microsecondsPerBeat(bpm)));
}

/** Ticks → seconds at one fixed tempo (what any reader of the file computes). */
export function ticksToSeconds(ticks: number, bpm: number, ppq = PPQ): number {
  return (ticks * microsecondsPerBeat(bpm)) / 1_000_000 / ppq;
}

export function clampBpm(bpm: number | undefined): number {
  if (!bpm || !Number.isFinite(bpm)) return DEFAULT_BPM;
  return Math.min(300, Math.max(20, Math.round(bpm)));
}

/**
 * @tonejs/midi writes `Math.floor(velocity * 127)`; 100/127 * 127 can come out as 99.999…,
 * and anything below 1/127 would write velocity 0, which the MIDI 1.0 specification reads as
 * a note-off. Half a step up and a floor of 1 keep the byte the keyboard sent.
 */
function velocityForWriter(velocity: number): number {
  const byte = Math.min(127, Math.max(1, Math.round(velocity * 127)));
  return Math.min(1, (byte + 0.5) / 127);
}

/** One format-1 Standard MIDI File: a tempo track and one piano track on channel 1. */
export function encodeMidi(input: EncodeInput): Uint8Array {
  const bpm = clampBpm(input.bpm);
  const midi = new Midi();
  // @tonejs/midi fixes 480 ticks per quarter note for a new file (its `ppq` has no setter).
  if (midi.header.ppq !== PPQ) throw new Error(`Unexpected resolution ${midi.header.ppq}`);
  midi.header.setTempo(bpm);
  const track = midi.addTrack();
  track.name = input.name ?? "Nearnote recording";
  track.channel = 0;
  // Onset order, so that a key released and struck again on the same tick is written as
  // note-off then note-on (the writer's sort is stable and keeps each note's on before off).
  const notes = [...input.notes]
    .filter((n) => Number.isFinite(n.start) && Number.isFinite(n.end))
    .sort((a, b) => a.start - b.start || a.midi - b.midi);
  for (const n of notes) {
    const ticks = secondsToTicks(n.start, bpm);
    const endTicks = Math.max(ticks, secondsToTicks(n.end, bpm));
    track.addNote({
      midi: n.midi,
      ticks,
      durationTicks: endTicks - ticks,
      velocity: velocityForWriter(n.velocity),
      noteOffVelocity: 0,
    });
  }
  const spans = [...(input.pedal ?? [])].sort((a, b) => a.start - b.start);
  for (const p of spans) {
    track.addCC({ number: SUSTAIN, ticks: secondsToTicks(p.start, bpm), value: 1 });
    track.addCC({
      number: SUSTAIN,
      ticks: Math.max(secondsToTicks(p.start, bpm), secondsToTicks(p.end, bpm)),
      value: 0,
    });
  }
  return midi.toArray();
}

/** "recording-2026-12-01-1830.mid", in the player's local time. */
export function recordingFileName(at: Date): string {
  const two = (n: number) => String(n).padStart(2, "0");
  return `recording-${at.getFullYear()}-${two(at.getMonth() + 1)}-${two(at.getDate())}-${two(at.getHours())}${two(at.getMinutes())}.mid`;
}
