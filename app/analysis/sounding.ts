// How long each note sounds (RULES.md terms "sounding", rule 3 and rule 15): from its onset
// until its key is released, and on while the sustain pedal stays down after that. For
// reading harmonies we also follow the ear: a note whose key is up stops counting when a
// note a half or whole step from it is struck under the same pedal (it has resolved), and
// any note stops when its own key is struck again.
import type { NoteEvent, PedalSpan } from "./types";

const EPS = 1e-9;
/** How long before a key's release the pedal must be down to carry the note on (our tolerance for timing noise). */
export const PEDAL_CATCH = 0.03;

/** The pedal span that is down at `time` (start ≤ time < end), or null. Spans are sorted and disjoint. */
export function pedalSpanAt(pedal: readonly PedalSpan[], time: number): PedalSpan | null {
  let lo = 0;
  let hi = pedal.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (pedal[mid].end <= time + EPS) lo = mid + 1;
    else hi = mid;
  }
  const span = pedal[lo];
  return span && span.start <= time + EPS ? span : null;
}

/** Whether the pedal is down at some time in [start, end). */
export function pedalDuring(pedal: readonly PedalSpan[], start: number, end: number): boolean {
  let lo = 0;
  let hi = pedal.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (pedal[mid].end <= start) lo = mid + 1;
    else hi = mid;
  }
  return lo < pedal.length && pedal[lo].start < end;
}

/**
 * Each note's end of sound (key release, carried on by the pedal, cut by a re-strike of the
 * same key) and heard end (that end cut where the ear hears the note resolve by step, rule
 * 15, last point), by note: two numbers per note in one typed array, so a long take keeps no
 * object per note for them.
 */
export class Soundings {
  private readonly index = new Map<NoteEvent, number>();
  private ends: Float64Array;

  constructor(expected = 0) {
    this.ends = new Float64Array(2 * Math.max(expected, 4));
  }

  set(n: NoteEvent, soundEnd: number, heardEnd: number): void {
    let at = this.index.get(n);
    if (at === undefined) {
      at = this.index.size;
      this.index.set(n, at);
      if (2 * at + 2 > this.ends.length) {
        const grown = new Float64Array(2 * this.ends.length);
        grown.set(this.ends);
        this.ends = grown;
      }
    }
    this.ends[2 * at] = soundEnd;
    this.ends[2 * at + 1] = heardEnd;
  }

  /** The end of a note's sound (its key release when the note is not listed). */
  soundEnd(n: NoteEvent): number {
    const at = this.index.get(n);
    return at === undefined ? n.end : this.ends[2 * at];
  }

  /** The end of a note for reading harmonies (its key release when the note is not listed). */
  heardEnd(n: NoteEvent): number {
    const at = this.index.get(n);
    return at === undefined ? n.end : this.ends[2 * at + 1];
  }
}

/** The end of a note's sound (its key release when the map does not know it). */
export function soundEndOf(sounding: Soundings, n: NoteEvent): number {
  return sounding.soundEnd(n);
}

/** The end of a note for reading harmonies (its key release when the map does not know it). */
export function heardEndOf(sounding: Soundings, n: NoteEvent): number {
  return sounding.heardEnd(n);
}

function firstOnsetAfter(list: readonly NoteEvent[], time: number): number {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (list[mid].start <= time + EPS) lo = mid + 1;
    else hi = mid;
  }
  return lo < list.length ? list[lo].start : Infinity;
}

/** Sound and heard ends of every note (notes sorted by onset). */
export function soundings(sorted: readonly NoteEvent[], pedal: readonly PedalSpan[]): Soundings {
  // Notes by pitch, in onset order (two spare lists each side for the steps below).
  const byPitch: Array<NoteEvent[] | undefined> = new Array(132);
  for (const n of sorted) {
    const list = byPitch[n.midi + 2];
    if (list) list.push(n);
    else byPitch[n.midi + 2] = [n];
  }
  const out = new Soundings(sorted.length);
  for (const n of sorted) {
    // The pedal catches a note only when it is down a moment before the key comes up: a pedal
    // pressed as the hand lets go (within PEDAL_CATCH) is the change of pedal itself.
    const span = pedalSpanAt(pedal, n.end - PEDAL_CATCH);
    let soundEnd = span ? Math.max(n.end, span.end) : n.end;
    const again = firstOnsetAfter(byPitch[n.midi + 2]!, n.start);
    if (again < soundEnd) soundEnd = again;
    let heardEnd = soundEnd;
    if (soundEnd > n.end + EPS) {
      // Carried by the pedal: a step away struck meanwhile ends it for the ear.
      for (let step = -2; step <= 2; step++) {
        const list = step === 0 ? undefined : byPitch[n.midi + 2 + step];
        if (!list) continue;
        const t = firstOnsetAfter(list, n.end - EPS);
        if (t < heardEnd) heardEnd = Math.max(n.end, t);
      }
    }
    out.set(n, soundEnd, heardEnd);
  }
  return out;
}
