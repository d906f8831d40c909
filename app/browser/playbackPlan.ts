// What the browser synth plays, worked out as plain data: the take as recorded, the
// "smoother path" (every chord re-voiced with its change's best voicing) and a single
// suggestion. Pure, so timing and voicings are tested without Web Audio.
import type { ChangeReport, ChordReport, MelodyNote, NoteEvent } from "~/analysis/types";

export type PlannedNote = { midi: number; start: number; end: number; velocity: number };

/** Equal temperament, A4 = MIDI 69 = 440 Hz (MIDI Tuning Standard / ISO 16). */
export function midiFrequency(midi: number): number {
  return 440 * 2 ** ((midi - 69) / 12);
}

const byStart = (a: PlannedNote, b: PlannedNote) => a.start - b.start || a.midi - b.midi;

/** The take's own notes, in onset order, each at least 60 ms long so very short ones still sound. */
export function takePlan(notes: readonly NoteEvent[]): PlannedNote[] {
  return notes
    .map((n) => ({ midi: n.midi, start: n.start, end: Math.max(n.end, n.start + 0.06), velocity: n.velocity || 0.7 }))
    .sort(byStart);
}

/**
 * The voicing the take page suggests for a change and draws over it: the smoothest suggestion,
 * else the best voicing (rule 8); null when there is none (an ungraded change).
 */
export function drawnVoicing(change: Pick<ChangeReport, "suggestions" | "bestVoicing">): number[] | null {
  return change.suggestions.find((s) => s.kind === "smoothest")?.voicing ?? change.bestVoicing;
}

/**
 * The same chords at the same times, each chord after the first voiced as its change's
 * drawn voicing (drawnVoicing); ungraded changes keep the chord as played. Melody notes stay.
 */
export function smootherPathPlan(
  chords: readonly ChordReport[],
  changes: readonly ChangeReport[],
  melody: readonly MelodyNote[] = [],
): PlannedNote[] {
  const out: PlannedNote[] = [];
  chords.forEach((c, k) => {
    const change = k > 0 ? changes.find((ch) => ch.to === k) : undefined;
    const voicing = (change && drawnVoicing(change)) ?? c.notes;
    const end = Math.max(c.endSec, c.startSec + 0.25);
    for (const midi of voicing) out.push({ midi, start: c.startSec, end, velocity: 0.7 });
  });
  for (const m of melody)
    out.push({ midi: m.note, start: m.startSec, end: Math.max(m.endSec, m.startSec + 0.06), velocity: 0.7 });
  return out.sort(byStart);
}

/** One voicing struck together (a suggestion on the mini keyboard). */
export function chordPlan(voicing: readonly number[], lengthSec = 1.4): PlannedNote[] {
  return voicing.map((midi) => ({ midi, start: 0, end: lengthSec, velocity: 0.75 }));
}

/** Two voicings one after the other: the chord before and the suggested chord. */
export function pairPlan(from: readonly number[], to: readonly number[], lengthSec = 1): PlannedNote[] {
  return [
    ...chordPlan(from, lengthSec * 0.95),
    ...chordPlan(to, lengthSec).map((n) => ({ ...n, start: lengthSec, end: lengthSec * 2 })),
  ];
}

export function planEnd(plan: readonly PlannedNote[]): number {
  let end = 0;
  for (const n of plan) if (n.end > end) end = n.end;
  return end;
}

/** Index of the chord sounding at time t (the last one begun), or -1 before the first. */
export function chordIndexAt(chords: ReadonlyArray<{ startSec: number }>, t: number): number {
  let lo = 0;
  let hi = chords.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (chords[mid].startSec <= t) lo = mid + 1;
    else hi = mid;
  }
  return lo - 1;
}

/**
 * Notes of a start-sorted plan that begin in [from, to), from position `cursor` on; returns
 * them and the next cursor. The synth calls this every tick with a short look-ahead, so a
 * long take never creates thousands of oscillators at once.
 */
export function notesInWindow(
  plan: readonly PlannedNote[],
  cursor: number,
  from: number,
  to: number,
): { notes: PlannedNote[]; cursor: number } {
  const notes: PlannedNote[] = [];
  let i = cursor;
  while (i < plan.length && plan[i].start < to) {
    if (plan[i].start >= from) notes.push(plan[i]);
    i++;
  }
  return { notes, cursor: i };
}

/** The plan at another speed: 0.5 takes twice as long (pitches unchanged). */
export function scalePlan(plan: readonly PlannedNote[], speed: number): PlannedNote[] {
  const k = speed > 0 ? 1 / speed : 1;
  return plan.map((n) => ({ ...n, start: n.start * k, end: n.end * k }));
}

/**
 * The notes of the take from `fromSec` to `toSec` (a change to loop), cut to that stretch and
 * moved to start at 0; notes held into it from before are left out, as they were struck earlier.
 */
export function stretchPlan(notes: readonly NoteEvent[], fromSec: number, toSec: number): PlannedNote[] {
  const EARLY = 0.05;
  return takePlan(notes.filter((n) => n.start >= fromSec - EARLY && n.start < toSec))
    .map((n) => ({
      ...n,
      start: Math.max(0, n.start - fromSec),
      end: Math.min(toSec, n.end) - fromSec,
    }))
    .map((n) => ({ ...n, end: Math.max(n.end, n.start + 0.06) }));
}
