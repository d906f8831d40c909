// RULES.md rules 1–3: notes begun together form strikes; quick grace notes travel with the
// note they resolve to; keys still held join later strikes; a lone bass played a little
// early or late joins the chord above it.
import { bpmAt } from "./tempo";
import type { NoteEvent, TempoPoint } from "./types";

export const STRIKE_GAP = 0.08; // rule 1: within 80 ms of the previous onset
export const STRIKE_SPAN = 0.3; // rule 1: within 300 ms of the strike's first onset
export const GRACE_MAX = 0.15; // rule 2: lasting at most 150 ms (or a sixteenth, if longer)
export const GRACE_RELEASE = 0.03; // rule 2: released at most 30 ms before the resolution's onset
export const GRACE_OVERLAP = 0.1; // rule 2: or held at most 100 ms into it (a crushed note)
export const HELD_FOR = 0.15; // rule 3: still held 150 ms after the strike begins
export const BASS_MERGE = 0.15; // rule 3: a lone bass within 150 ms of the chord
const EPS = 1e-9;

export type Grace = { note: NoteEvent; target: NoteEvent };

export type Strike = {
  start: number;
  /** struck notes, grace notes excluded, onset order */
  notes: NoteEvent[];
  graces: Grace[];
  /** notes struck earlier and still held by the key (rule 3) */
  held: NoteEvent[];
};

// Most strikes have no grace notes and hold no earlier notes: they share these empty lists
// (frozen, so nothing can add to a shared one) until a note is added, which gives the strike
// its own list. A long take then keeps two objects fewer per strike.
const NO_GRACES: Grace[] = Object.freeze([]) as unknown as Grace[];
const NONE_HELD: NoteEvent[] = Object.freeze([]) as unknown as NoteEvent[];

function addGrace(s: Strike, g: Grace): void {
  if (s.graces === NO_GRACES) s.graces = [g];
  else s.graces.push(g);
}

/** First index of a note starting at or after `time` (notes sorted by onset). */
export function firstAtOrAfter(list: readonly NoteEvent[], time: number): number {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (list[mid].start < time) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Rule 2: finds each grace note and the longer note one or two semitones above it. */
export function findGraces(notes: NoteEvent[], tempos: TempoPoint[] = []): Map<NoteEvent, NoteEvent> {
  const byPitch = new Map<number, NoteEvent[]>();
  for (const n of notes) {
    const list = byPitch.get(n.midi);
    if (list) list.push(n);
    else byPitch.set(n.midi, [n]);
  }
  const graces = new Map<NoteEvent, NoteEvent>();
  const targets = new Set<NoteEvent>();
  for (const g of notes) {
    const length = g.end - g.start;
    const sixteenth = 60 / bpmAt(tempos, g.start) / 4;
    if (length > Math.max(GRACE_MAX, sixteenth) + EPS) continue;
    let best: NoteEvent | null = null;
    for (const step of [1, 2]) {
      const list = byPitch.get(g.midi + step);
      if (!list) continue;
      // Lists are in onset order: jump to the first onset inside the release window and stop
      // after a handful, so a crafted file of same-instant notes cannot make this quadratic.
      let i = firstAtOrAfter(list, g.end - GRACE_OVERLAP - EPS);
      for (let seen = 0; i < list.length && seen < 16; i++, seen++) {
        const t = list[i];
        if (t.start > g.end + GRACE_RELEASE + EPS) break;
        if (t === g || t.end - t.start <= length || graces.has(t)) continue;
        if (!best || Math.abs(t.start - g.end) < Math.abs(best.start - g.end)) best = t;
      }
    }
    if (best && !targets.has(g)) {
      graces.set(g, best);
      targets.add(best);
    }
  }
  return graces;
}

/** Rules 1 and 2: groups notes (sorted by onset) into strikes. */
export function groupStrikes(sorted: NoteEvent[], graces: Map<NoteEvent, NoteEvent>): Strike[] {
  const owner = new Map<NoteEvent, Strike>();
  const strikes: Strike[] = [];
  let current: Strike | null = null;
  let lastOnset = -Infinity;
  const place = (n: NoteEvent, s: Strike) => {
    if (owner.has(n)) return;
    owner.set(n, s);
    const target = graces.get(n);
    if (target) {
      // The resolution belongs to the grace note's strike even when it begins later; in the
      // rare case it was struck first, the grace note goes to the resolution's strike.
      const placed = owner.get(target);
      if (placed) addGrace(placed, { note: n, target });
      else {
        addGrace(s, { note: n, target });
        owner.set(target, s);
        s.notes.push(target);
        lastOnset = Math.max(lastOnset, target.start);
      }
    } else s.notes.push(n);
    lastOnset = Math.max(lastOnset, n.start);
  };
  for (const n of sorted) {
    if (owner.has(n)) continue;
    const joins = current && n.start - lastOnset <= STRIKE_GAP + EPS && n.start - current.start <= STRIKE_SPAN + EPS;
    if (!joins) {
      current = { start: n.start, notes: [], graces: NO_GRACES, held: NONE_HELD };
      strikes.push(current);
      lastOnset = n.start;
    }
    place(n, current!);
  }
  return strikes.filter((s) => s.notes.length > 0);
}

/** Whether every note of a strike has the same pitch. */
function onePitch(notes: readonly NoteEvent[]): boolean {
  for (const n of notes) if (n.midi !== notes[0].midi) return false;
  return true;
}

/** Rule 3, second half: a lone bass just before or just after a chord joins it. */
export function mergeSeparateBass(strikes: Strike[]): Strike[] {
  const out: Strike[] = [];
  for (let i = 0; i < strikes.length; i++) {
    const s = strikes[i];
    if (s.notes.length > 0 && onePitch(s.notes) && s.graces.length === 0) {
      const pitch = s.notes[0].midi;
      const next = strikes[i + 1];
      // We merge only into a strike of two or more pitches: a bass under a chord, not a run of
      // single melody notes pairing up.
      if (next && next.start - s.start <= BASS_MERGE + EPS && isBelow(pitch, next)) {
        next.notes.unshift(...s.notes);
        next.start = s.start;
        continue;
      }
      const prev = out[out.length - 1];
      if (prev && s.start - prev.start <= BASS_MERGE + EPS && isBelow(pitch, prev)) {
        prev.notes.push(...s.notes);
        continue;
      }
    }
    out.push(s);
  }
  return out;
}

/** Whether the strike has two or more pitches, all above `pitch`. */
function isBelow(pitch: number, s: Strike): boolean {
  if (s.notes.length === 0) return false;
  let low = Infinity;
  for (const n of s.notes) if (n.midi < low) low = n.midi;
  return !onePitch(s.notes) && pitch < low;
}

/** Rule 3, first half: notes held by the key at least 150 ms into a later strike join it. */
export function addHeldNotes(strikes: Strike[]): void {
  // Per pitch only the note released last matters, so each strike scans at most 128 keys.
  const down = new Map<number, NoteEvent>();
  const own = new Int32Array(128).fill(-1);
  for (let k = 0; k < strikes.length; k++) {
    const s = strikes[k];
    // The strike's own pitches, marked with its index (a strike may hold thousands of notes).
    for (const n of s.notes) own[n.midi] = k;
    for (const [pitch, n] of down) {
      if (n.end < s.start + HELD_FOR - EPS) down.delete(pitch);
      else if (
        n.start < s.start - EPS &&
        !(pitch >= 0 && pitch < 128 ? own[pitch] === k : s.notes.some((x) => x.midi === pitch))
      ) {
        if (s.held === NONE_HELD) s.held = [n];
        else s.held.push(n);
      }
    }
    for (const n of s.notes) {
      const prev = down.get(n.midi);
      if (!prev || n.end > prev.end) down.set(n.midi, n);
    }
  }
}

/** All of rules 1–3 over a note list. */
export function findStrikes(notes: NoteEvent[], tempos: TempoPoint[] = []): Strike[] {
  // A full order (the same key from two tracks ties on start and pitch), so that the input's
  // order can never change the result.
  const sorted = [...notes].sort(
    (a, b) => a.start - b.start || a.midi - b.midi || a.end - b.end || a.velocity - b.velocity,
  );
  const graces = findGraces(sorted, tempos);
  const strikes = mergeSeparateBass(groupStrikes(sorted, graces));
  addHeldNotes(strikes);
  return strikes;
}
