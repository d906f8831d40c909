// What a keyboard sends, turned into the note list the analysis engine reads. Pure: the
// browser's Web MIDI glue (webMidi.client.ts) feeds it raw messages with their timestamps,
// and the tests feed it the same bytes directly.
import { MAX_TAKE_SECONDS } from "~/analysis/errors";
import type { NoteEvent, NoteList, PedalSpan } from "~/analysis/types";

export type PlayedEvent =
  { kind: "on"; midi: number; velocity: number } | { kind: "off"; midi: number } | { kind: "pedal"; down: boolean };

const DRUM_CHANNEL = 9; // General MIDI channel 10: drum pads are never harmony (as readMidi.ts)
const SUSTAIN_CONTROLLER = 64;

/** A recording stops by itself at the longest take the engine grades. */
export const MAX_RECORDING_SECONDS = MAX_TAKE_SECONDS;

/**
 * One channel message, per the MIDI 1.0 specification: 0x9n note-on (velocity 0 means
 * note-off), 0x8n note-off, 0xBn controller 64 = sustain pedal (0–63 up, 64–127 down).
 * Web MIDI hands over whole messages, so there is no running status to undo. Everything else
 * (clock, active sensing, other controllers, drum channel) is ignored.
 */
export function parseMidiMessage(data: ArrayLike<number>): PlayedEvent | null {
  if (data.length < 3) return null;
  const status = data[0];
  if (status < 0x80 || status >= 0xf0) return null;
  if ((status & 0x0f) === DRUM_CHANNEL) return null;
  const type = status & 0xf0;
  const a = data[1] & 0x7f;
  const b = data[2] & 0x7f;
  if (type === 0x90) return b > 0 ? { kind: "on", midi: a, velocity: b / 127 } : { kind: "off", midi: a };
  if (type === 0x80) return { kind: "off", midi: a };
  if (type === 0xb0 && a === SUSTAIN_CONTROLLER) return { kind: "pedal", down: b >= 64 };
  return null;
}

/**
 * Collects notes and pedal spans. Times are milliseconds on one clock (the page's
 * `performance.now()`, which Web MIDI timestamps share); the take starts at `originMs`, and
 * anything played before it (during the count-in) starts at 0.
 */
export class NoteRecorder {
  private readonly closed: NoteEvent[] = [];
  private readonly sounding = new Map<number, { start: number; velocity: number }>();
  private readonly spans: PedalSpan[] = [];
  private pedalFrom: number | null = null;
  private lastSec = 0;

  constructor(readonly originMs: number) {}

  private sec(ms: number): number {
    // Never earlier than the previous event: a device's clock may jitter backwards slightly.
    this.lastSec = Math.max(this.lastSec, (ms - this.originMs) / 1000, 0);
    return this.lastSec;
  }

  handle(event: PlayedEvent, timeMs: number): void {
    const t = this.sec(timeMs);
    if (event.kind === "on") {
      // A key struck again without a release in between (some keyboards do this): close it first.
      this.release(event.midi, t);
      this.sounding.set(event.midi, { start: t, velocity: event.velocity });
    } else if (event.kind === "off") {
      this.release(event.midi, t);
    } else if (event.down && this.pedalFrom === null) {
      this.pedalFrom = t;
    } else if (!event.down && this.pedalFrom !== null) {
      this.spans.push({ start: this.pedalFrom, end: t });
      this.pedalFrom = null;
    }
  }

  private release(midi: number, t: number) {
    const open = this.sounding.get(midi);
    if (!open) return;
    this.sounding.delete(midi);
    this.closed.push({ midi, start: open.start, end: t, velocity: open.velocity });
  }

  /** Keys down right now, lowest first (for the live keyboard). */
  held(): number[] {
    return [...this.sounding.keys()].sort((a, b) => a - b);
  }

  get noteCount(): number {
    return this.closed.length + this.sounding.size;
  }

  /** Seconds from the origin to `nowMs`. */
  elapsed(nowMs: number): number {
    return Math.max(0, (nowMs - this.originMs) / 1000);
  }

  /** The take so far, in onset order: keys still down and a pedal still held end at `nowMs`. */
  snapshot(nowMs: number): NoteList & { notes: NoteEvent[]; pedal: PedalSpan[] } {
    const now = Math.max(this.lastSec, this.elapsed(nowMs));
    const notes = [...this.closed];
    for (const [midi, open] of this.sounding)
      notes.push({ midi, start: open.start, end: now, velocity: open.velocity });
    notes.sort((a, b) => a.start - b.start || a.midi - b.midi);
    const pedal = this.pedalFrom === null ? [...this.spans] : [...this.spans, { start: this.pedalFrom, end: now }];
    return { notes, pedal };
  }
}
