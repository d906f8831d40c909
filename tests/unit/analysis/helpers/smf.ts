// Writes Standard MIDI Files byte by byte for tests, following the Standard MIDI File 1.0
// specification (MMA, RP-001): big-endian chunk lengths, variable-length delta times.

/** Variable-length quantity: 7 bits per byte, most significant first, high bit set on all but the last. */
export function vlq(value: number): number[] {
  const out = [value & 0x7f];
  let v = Math.floor(value / 128);
  while (v > 0) {
    out.unshift((v & 0x7f) | 0x80);
    v = Math.floor(v / 128);
  }
  return out;
}

const u32 = (n: number) => [(n >>> 24) & 0xff, (n >>> 16) & 0xff, (n >>> 8) & 0xff, n & 0xff];
const u16 = (n: number) => [(n >>> 8) & 0xff, n & 0xff];
const ascii = (s: string) => [...s].map((c) => c.charCodeAt(0));

export function header(format: number, tracks: number, division: number): number[] {
  return [...ascii("MThd"), ...u32(6), ...u16(format), ...u16(tracks), ...u16(division)];
}

/** An MTrk chunk around raw event bytes (an end-of-track meta event is appended unless told not to). */
export function trackChunk(events: number[], endOfTrack = true): number[] {
  const body = endOfTrack ? [...events, 0x00, 0xff, 0x2f, 0x00] : events;
  return [...ascii("MTrk"), ...u32(body.length), ...body];
}

export function smf(division: number, ...tracks: number[][]): Uint8Array {
  return new Uint8Array([...header(tracks.length > 1 ? 1 : 0, tracks.length, division), ...tracks.flat()]);
}

export const tempoEvent = (delta: number, microsecondsPerBeat: number) => [
  ...vlq(delta),
  0xff,
  0x51,
  0x03,
  (microsecondsPerBeat >>> 16) & 0xff,
  (microsecondsPerBeat >>> 8) & 0xff,
  microsecondsPerBeat & 0xff,
];
export const noteOn = (delta: number, key: number, velocity = 100, channel = 0) => [
  ...vlq(delta),
  0x90 | channel,
  key,
  velocity,
];
export const noteOff = (delta: number, key: number, channel = 0) => [...vlq(delta), 0x80 | channel, key, 0x40];
export const controller = (delta: number, number: number, value: number, channel = 0) => [
  ...vlq(delta),
  0xb0 | channel,
  number,
  value,
];

/** A chord of `keys` struck at `delta` and released `length` ticks later, as one track's events. */
export function chordEvents(delta: number, keys: number[], length: number, channel = 0): number[] {
  const on = keys.flatMap((k, i) => noteOn(i === 0 ? delta : 0, k, 90, channel));
  const off = keys.flatMap((k, i) => noteOff(i === 0 ? length : 0, k, channel));
  return [...on, ...off];
}
