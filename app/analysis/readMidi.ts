// Reads a Standard MIDI File into a flat note list in seconds.
//
// Why not `new Midi(bytes)` from @tonejs/midi for everything: its note pairing shifts and
// splices arrays per note (quadratic), so a legal 100,000-note take took 9.5 s on this machine
// and a crafted file of unmatched note-ons even longer — "no input may hang". We therefore
// walk the events ourselves in one pass (strictly, so every malformed byte becomes a typed
// error instead of NaN times) and use @tonejs/midi's `Header` for the tempo map.
// Byte layout, variable-length quantities and running status follow the Standard MIDI File
// 1.0 specification (MMA, RP-001).
import tonejsMidi from "@tonejs/midi";
import { AnalysisError, MAX_TAKE_NOTES, MAX_TAKE_SECONDS } from "./errors";
import type { NoteEvent, NoteList, PedalSpan, TempoPoint } from "./types";

const { Header } = tonejsMidi;

/** Channel 10 (index 9) carries drums in General MIDI: never harmony. */
const DRUM_CHANNEL = 9;
const SUSTAIN_CONTROLLER = 64;

type RawTrack = {
  notes: Array<{ tick: number; endTick: number; midi: number; velocity: number; channel: number }>;
  tempos: Array<{ tick: number; microsecondsPerBeat: number }>;
  pedal: Array<{ tick: number; channel: number; down: boolean }>;
  endTick: number;
};

export type ReadResult = NoteList & {
  notes: NoteEvent[];
  tempos: TempoPoint[];
  pedal: PedalSpan[];
  ppq: number;
  trackCount: number;
  durationSec: number;
};

function corrupt(): never {
  throw new AnalysisError("corrupt");
}

function chunkId(bytes: Uint8Array, at: number): string {
  return String.fromCharCode(bytes[at], bytes[at + 1], bytes[at + 2], bytes[at + 3]);
}

function uint32(bytes: Uint8Array, at: number): number {
  return ((bytes[at] << 24) >>> 0) + (bytes[at + 1] << 16) + (bytes[at + 2] << 8) + bytes[at + 3];
}

/** Walks one MTrk chunk's events; throws `corrupt` on anything that runs past its end. */
function readTrack(bytes: Uint8Array, start: number, end: number, counter: { notes: number }): RawTrack {
  const track: RawTrack = { notes: [], tempos: [], pedal: [], endTick: 0 };
  // Sounding notes per channel*128+pitch, first in first out (an early note-off closes the
  // earliest matching note-on, as most readers do).
  const sounding = new Map<number, number[]>();
  let pos = start;
  let tick = 0;
  let status = 0; // running status; 0 = none
  const byte = (): number => {
    if (pos >= end) corrupt();
    return bytes[pos++];
  };
  const vlq = (): number => {
    let value = 0;
    for (let i = 0; i < 4; i++) {
      const b = byte();
      value = value * 128 + (b & 0x7f);
      if ((b & 0x80) === 0) return value;
    }
    return corrupt(); // a quantity is at most four bytes
  };
  while (pos < end) {
    tick += vlq();
    let first = byte();
    if (first === 0xff) {
      const type = byte();
      const length = vlq();
      if (pos + length > end) corrupt();
      if (type === 0x51 && length === 3) {
        const mpq = (bytes[pos] << 16) + (bytes[pos + 1] << 8) + bytes[pos + 2];
        if (mpq > 0) track.tempos.push({ tick, microsecondsPerBeat: mpq });
      }
      pos += length;
      // The spec says meta events cancel running status, so a conforming file never relies on
      // it afterwards; some sequencers do anyway, and we read such files as other readers do.
      if (type === 0x2f) break; // end of track
      continue;
    }
    if (first === 0xf0 || first === 0xf7) {
      const length = vlq();
      if (pos + length > end) corrupt();
      pos += length;
      continue; // (sysex: as for meta events above)
    }
    if (first >= 0xf1) corrupt(); // system common/real-time messages do not belong in a file
    let data1: number;
    if (first < 0x80) {
      if (status === 0) corrupt(); // running status with nothing to repeat
      data1 = first;
      first = status;
    } else {
      status = first;
      data1 = byte();
    }
    if (data1 > 0x7f) corrupt();
    const kind = first & 0xf0;
    const channel = first & 0x0f;
    const twoDataBytes = kind !== 0xc0 && kind !== 0xd0;
    const data2 = twoDataBytes ? byte() : 0;
    if (data2 > 0x7f) corrupt();
    if (channel === DRUM_CHANNEL) continue;
    const key = channel * 128 + data1;
    if (kind === 0x90 && data2 > 0) {
      if (++counter.notes > MAX_TAKE_NOTES) throw new AnalysisError("too-many-notes");
      const index = track.notes.length;
      track.notes.push({ tick, endTick: -1, midi: data1, velocity: data2 / 127, channel });
      const queue = sounding.get(key);
      if (queue) queue.push(index);
      else sounding.set(key, [index]);
    } else if (kind === 0x80 || kind === 0x90) {
      // note-off, or note-on with velocity 0, which the spec defines as a note-off
      const queue = sounding.get(key);
      const index = queue?.shift();
      if (index !== undefined) track.notes[index].endTick = tick;
    } else if (kind === 0xb0 && data1 === SUSTAIN_CONTROLLER) {
      // Controller 64: 0–63 off, 64–127 on.
      track.pedal.push({ tick, channel, down: data2 >= 64 });
    }
  }
  track.endTick = tick;
  // A note never released is held to the end of its track rather than dropped.
  for (const n of track.notes) if (n.endTick < 0) n.endTick = tick;
  return track;
}

function tempoMap(tracks: RawTrack[], ppq: number) {
  // One tempo per tick (the last written wins); before the first one the spec's 120 bpm.
  const byTick = new Map<number, number>();
  for (const t of tracks) for (const e of t.tempos) byTick.set(e.tick, 60_000_000 / e.microsecondsPerBeat);
  if (!byTick.has(0)) byTick.set(0, 120);
  const tempos = [...byTick.entries()].sort((a, b) => a[0] - b[0]).map(([ticks, bpm]) => ({ ticks, bpm }));
  const header = new Header();
  header.fromJSON({ name: "", ppq, tempos, timeSignatures: [], keySignatures: [], meta: [] });
  return header;
}

/** Parses the bytes of a take; throws `AnalysisError` for anything it cannot read. */
export function readMidi(bytes: Uint8Array): ReadResult {
  if (bytes.length < 14 || chunkId(bytes, 0) !== "MThd") throw new AnalysisError("not-midi");
  const headerLength = uint32(bytes, 4);
  if (headerLength < 6 || 8 + headerLength > bytes.length) corrupt();
  const declaredTracks = (bytes[10] << 8) + bytes[11];
  const division = (bytes[12] << 8) + bytes[13];
  if (division & 0x8000) {
    throw new AnalysisError(
      "corrupt",
      "This MIDI file counts time in video frames: export the take with musical (beat) timing.",
    );
  }
  if (division === 0) corrupt();
  const counter = { notes: 0 };
  const tracks: RawTrack[] = [];
  let pos = 8 + headerLength;
  // Chunks of unknown type are skipped, as the specification asks readers to do.
  while (pos + 8 <= bytes.length && tracks.length < Math.max(declaredTracks, 1)) {
    const id = chunkId(bytes, pos);
    const length = uint32(bytes, pos + 4);
    const start = pos + 8;
    if (start + length > bytes.length) corrupt();
    if (id === "MTrk") tracks.push(readTrack(bytes, start, start + length, counter));
    pos = start + length;
  }
  if (tracks.length < declaredTracks) corrupt();

  const header = tempoMap(tracks, division);
  const seconds = (tick: number) => header.ticksToSeconds(tick);
  const notes: NoteEvent[] = [];
  tracks.forEach((t, trackIndex) => {
    for (const n of t.notes) {
      notes.push({
        midi: n.midi,
        start: seconds(n.tick),
        end: seconds(n.endTick),
        velocity: n.velocity,
        channel: n.channel,
        track: trackIndex,
      });
    }
  });
  if (notes.length === 0) throw new AnalysisError("no-notes");
  let durationSec = 0;
  for (const n of notes) if (n.end > durationSec) durationSec = n.end;
  if (!(durationSec <= MAX_TAKE_SECONDS)) throw new AnalysisError("too-long");
  notes.sort((a, b) => a.start - b.start || a.midi - b.midi);

  const pedal = pedalSpans(tracks, seconds, durationSec);
  const tempos = header.tempos.map((t) => ({ time: t.time ?? 0, bpm: t.bpm }));
  return { notes, tempos, pedal, ppq: division, trackCount: tracks.length, durationSec };
}

/** Times the pedal is down on any channel, merged into spans. */
function pedalSpans(tracks: RawTrack[], seconds: (tick: number) => number, endSec: number): PedalSpan[] {
  const raw: PedalSpan[] = [];
  const downSince = new Map<string, number>();
  tracks.forEach((t, ti) => {
    for (const e of t.pedal) {
      const key = `${ti}:${e.channel}`;
      const since = downSince.get(key);
      if (e.down && since === undefined) downSince.set(key, seconds(e.tick));
      else if (!e.down && since !== undefined) {
        raw.push({ start: since, end: seconds(e.tick) });
        downSince.delete(key);
      }
    }
  });
  for (const since of downSince.values()) raw.push({ start: since, end: Math.max(since, endSec) });
  raw.sort((a, b) => a.start - b.start);
  const merged: PedalSpan[] = [];
  for (const s of raw) {
    const last = merged[merged.length - 1];
    if (last && s.start <= last.end) last.end = Math.max(last.end, s.end);
    else merged.push({ ...s });
  }
  return merged;
}
