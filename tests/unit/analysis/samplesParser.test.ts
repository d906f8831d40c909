// Every sample take's notes as our reader sees them, compared with a second parser from the
// registry: `midi-file` (npm, 1.2.4), whose raw events we pair into notes here.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { parseMidi } from "midi-file";
import { describe, expect, it } from "vitest";
import { readMidi } from "../../../app/analysis/readMidi";
import { SAMPLE_TAKES } from "../../../scripts/lib/sampleTakes";

const SAMPLES_DIR = join(__dirname, "../../../samples");

type TickNote = { tick: number; pitch: number; ticks: number };

/** Notes from midi-file's events: each note-on closed by the next note-off of its key and channel. */
function notesByMidiFile(bytes: Uint8Array): { notes: TickNote[]; ppq: number; bpm: number } {
  const parsed = parseMidi(bytes);
  const notes: TickNote[] = [];
  let bpm = 120;
  for (const track of parsed.tracks) {
    let tick = 0;
    const open = new Map<string, number[]>();
    for (const e of track) {
      tick += e.deltaTime;
      if (e.type === "setTempo") bpm = 60_000_000 / e.microsecondsPerBeat;
      if (e.type === "noteOn" && e.channel !== 9) {
        const k = `${e.channel}:${e.noteNumber}`;
        open.set(k, [...(open.get(k) ?? []), tick]);
      } else if (e.type === "noteOff" && e.channel !== 9) {
        const k = `${e.channel}:${e.noteNumber}`;
        const start = open.get(k)?.shift();
        if (start !== undefined) notes.push({ tick: start, pitch: e.noteNumber, ticks: tick - start });
      }
    }
  }
  const sorted = notes.sort((a, b) => a.tick - b.tick || a.pitch - b.pitch);
  return { notes: sorted, ppq: parsed.header.ticksPerBeat!, bpm };
}

describe("sample takes", () => {
  it("there is a sample for every listed take, and the files are what the generator writes now", () => {
    for (const s of SAMPLE_TAKES) {
      const onDisk = new Uint8Array(readFileSync(join(SAMPLES_DIR, s.file)));
      expect(onDisk, `${s.file}: run npm run samples`).toEqual(new Uint8Array(s.build()));
    }
  });

  it.each(SAMPLE_TAKES.map((s) => s.file))("%s: onset ticks, pitches and durations agree with midi-file", (file) => {
    const bytes = new Uint8Array(readFileSync(join(SAMPLES_DIR, file)));
    const reference = notesByMidiFile(bytes);
    const ours = readMidi(bytes);
    // Single-tempo files: seconds back to ticks.
    const toTicks = (sec: number) => Math.round((sec * reference.bpm * reference.ppq) / 60);
    const mine = ours.notes
      .map((n) => ({ tick: toTicks(n.start), pitch: n.midi, ticks: toTicks(n.end) - toTicks(n.start) }))
      .sort((a, b) => a.tick - b.tick || a.pitch - b.pitch);
    expect(reference.notes.length).toBeGreaterThan(5);
    expect(mine).toEqual(reference.notes);
  });
});
