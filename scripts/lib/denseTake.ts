// The worst case for the engine among files it accepts: chords of eight random
// keys each, every chord a different voicing, so that finding the smoothest move
// at each change has the most candidates to weigh. Used by the worker-pool tests
// and `npm run bench`. Written with `midi-file` (linear in the number of events,
// so even a take at the engine's note limit is made in a moment).
import { writeMidi, type MidiEvent } from "midi-file";
import { seededRandom } from "./takeGenerator";

// Deltas stay below 128 ticks, one byte each as a variable-length quantity
// (Standard MIDI File 1.0), which also keeps midi-file's writer linear.
const TICKS_PER_BEAT = 192;
// A chord every 48 ticks (a sixteenth note): at the default 120 bpm one every 0.125 s,
// so even 12,400 chords stay inside the engine's 30-minute limit.
const HELD_TICKS = 40;

/** `chords` chords of eight distinct keys between C2 and C7, one after another. */
export function denseChordTake(chords: number, seed = 7): Uint8Array {
  const rand = seededRandom(seed);
  const track: MidiEvent[] = [];
  for (let c = 0; c < chords; c++) {
    const keys = new Set<number>();
    while (keys.size < 8) keys.add(36 + Math.floor(rand() * 61));
    const list = [...keys];
    // Each chord starts a moment after the one before is released.
    list.forEach((noteNumber, i) =>
      track.push({
        deltaTime: c > 0 && i === 0 ? 48 - HELD_TICKS : 0,
        type: "noteOn",
        channel: 0,
        noteNumber,
        velocity: 70 + Math.floor(rand() * 40),
      }),
    );
    list.forEach((noteNumber, i) =>
      track.push({ deltaTime: i === 0 ? HELD_TICKS : 0, type: "noteOff", channel: 0, noteNumber, velocity: 0 }),
    );
  }
  track.push({ deltaTime: 0, type: "endOfTrack", meta: true });
  return new Uint8Array(
    writeMidi({ header: { format: 0, numTracks: 1, ticksPerBeat: TICKS_PER_BEAT }, tracks: [track] }),
  );
}
