// Where a harmony must, may and may not begin (RULES.md rule 15, "How Nearnote implements
// it", step 2): silences force a boundary; a lone bass under held notes, a walking note
// between two strikes of the same comping chord, a comping re-strike and a short melody note
// left by step never begin a harmony; and whether each strike brings a new bass.
import { pc } from "./pitch";
import { heardEndOf, soundEndOf, type Soundings } from "./sounding";
import type { Strike } from "./strikes";
import type { NoteEvent } from "./types";

/** Rule 15: a strike after this long with nothing sounding starts a harmony. */
export const SILENCE_SEC = 0.25;
/** Rule 3: a key still down this long after a strike sounds in it. */
export const HELD_FOR = 0.15;
/** Rule 15: comping re-struck within this long counts as the same chord re-struck. */
const RESTRIKE_WITHIN_SEC = 3;
/** A melody note this short that leaves by step is a passing or neighbour note. */
const SHORT_NOTE_SEC = 0.75;
const EPS = 1e-9;

/** The lowest note sounding 150 ms after each strike begins, by a sweep over the take. */
export function lowestSounding(strikes: readonly Strike[], sounding: Soundings): Array<NoteEvent | null> {
  // Notes still sounding, with their heard ends beside them (looked up once per note).
  const active: NoteEvent[] = [];
  const ends: number[] = [];
  return strikes.map((s) => {
    const t = s.start + HELD_FOR;
    for (const n of s.notes) {
      active.push(n);
      ends.push(heardEndOf(sounding, n));
    }
    let low: NoteEvent | null = null;
    let kept = 0;
    for (let q = 0; q < active.length; q++) {
      const n = active[q];
      const end = ends[q];
      if (end <= s.start + EPS) continue;
      active[kept] = n;
      ends[kept++] = end;
      if (end > t + EPS && (!low || n.midi < low.midi)) low = n;
    }
    active.length = kept;
    ends.length = kept;
    return low;
  });
}

const SEEN = new Int32Array(128);
let stamp = 0;

/**
 * The lowest distinct pitch of a strike and the lowest of its upper notes: the next pitch up
 * when the bass is detached (three or more pitches, 7 or more semitones below the next), else
 * the lowest itself.
 */
function lowAndUpper(s: Strike): [low: number, upperLow: number] {
  let low = Infinity;
  let second = Infinity;
  let count = 0;
  // Pitches seen in this strike are stamped with its own mark (a strike may hold thousands of notes).
  if (stamp === 0x7fffffff) {
    SEEN.fill(0);
    stamp = 0;
  }
  const mark = ++stamp;
  for (const n of s.notes) {
    const m = n.midi;
    if (m >= 0 && m < 128) {
      if (SEEN[m] === mark) continue;
      SEEN[m] = mark;
    } else if (s.notes.some((x) => x !== n && x.midi === m && s.notes.indexOf(x) < s.notes.indexOf(n))) continue;
    count++;
    if (m < low) {
      second = low;
      low = m;
    } else if (m < second) second = m;
  }
  return [low, count >= 3 && second - low >= 7 ? second : low];
}

/** The lowest of a strike's upper notes (its pitches above a detached bass, else all of them). */
function lowestUpper(s: Strike): number {
  return lowAndUpper(s)[1];
}

/**
 * Pitch classes of a strike's upper part (what comping re-strikes) as a 12-bit mask, or 0
 * when fewer than two remain: a bass and one note are no comping chord.
 */
function upperPcs(s: Strike): number {
  const [low, upperLow] = lowAndUpper(s);
  const detached = upperLow !== low;
  let mask = 0;
  for (const n of s.notes) if (!(detached && n.midi === low)) mask |= 1 << pc(n.midi);
  let count = 0;
  for (let x = mask; x; x &= x - 1) count++;
  return count >= 2 ? mask : 0;
}

/** Whether a strike has at least two distinct pitches. */
function isMulti(s: Strike): boolean {
  const first = s.notes[0].midi;
  for (const n of s.notes) if (n.midi !== first) return true;
  return false;
}

/**
 * Whether strike i is a single note with a lower note struck right after it: a harmony that
 * began there would have a bass above its chord (rule 16), so it is charged like a start
 * over an unchanged bass. A broken chord begins on its bass, below what follows.
 */
function loneAbove(strikes: readonly Strike[], i: number): boolean {
  const s = strikes[i];
  const next = strikes[i + 1];
  if (!next || isMulti(s)) return false;
  let end = -Infinity;
  for (const n of s.notes) if (n.end > end) end = n.end;
  return next.start <= end + 0.5 && next.notes.some((n) => n.midi < s.notes[0].midi);
}

export type BoundaryRules = {
  /** a silence ends just before the strike: a harmony must begin there */
  forced: boolean[];
  /** the strike can never begin a harmony (it is charged heavily) */
  barred: boolean[];
  /** the strike brings a new lowest note (and is not a lone note above the chord that follows) */
  newBass: boolean[];
  /** the lowest note sounding 150 ms after each strike begins */
  lowest: Array<NoteEvent | null>;
};

/**
 * Where harmonies must, may and may not begin (rule 15): after a silence they must; a note
 * struck alone in the bass under held notes, or between two strikes of the same comping
 * chord, a re-strike of the comping chord, and a short melody note that leaves by step may
 * not.
 */
export function boundaryRules(input: { strikes: readonly Strike[]; sounding: Soundings }): BoundaryRules {
  const { strikes, sounding } = input;
  const forced = strikes.map(() => false);
  const barred = strikes.map(() => false);
  const lowest = lowestSounding(strikes, sounding);
  const newBass = strikes.map((s, i) => !!lowest[i] && s.notes.includes(lowest[i]!) && !loneAbove(strikes, i));
  const multi = strikes.map(isMulti);
  const nextMulti = new Int32Array(strikes.length + 1).fill(-1);
  for (let i = strikes.length - 1; i >= 0; i--) nextMulti[i] = multi[i + 1] ? i + 1 : nextMulti[i + 1];
  // Comping parts once per strike (compared with their neighbours below).
  const comps = strikes.map((s, i) => (multi[i] ? upperPcs(s) : 0));
  let lastSound = -Infinity;
  let prevMulti = -1;
  // Notes struck before the current strike whose key is still down (held into it, rule 3).
  const down: NoteEvent[] = [];
  for (let i = 0; i < strikes.length; i++) {
    const s = strikes[i];
    const t = s.start;
    if (i > 0) {
      down.push(...strikes[i - 1].notes);
      let kept = 0;
      for (const n of down) if (n.end > t + EPS) down[kept++] = n;
      down.length = kept;
    }
    if (i > 0 && t - lastSound >= SILENCE_SEC - EPS) forced[i] = true;
    if (i > 0 && !multi[i]) {
      const n = s.notes[0];
      // A note struck alone in the bass under held upper notes.
      let held = 0;
      let allAbove = true;
      for (const h of down) {
        if (!(h.end > t + HELD_FOR + EPS && h.midi !== n.midi)) continue;
        held++;
        if (!(h.midi > n.midi)) allAbove = false;
      }
      if (held > 0 && allAbove) barred[i] = true;
      // A walking note between two strikes of the same comping chord, below both.
      const q = nextMulti[i];
      if (
        prevMulti >= 0 &&
        q >= 0 &&
        !forced[i] &&
        strikes[q].start - strikes[prevMulti].start <= RESTRIKE_WITHIN_SEC
      ) {
        const below = (k: number) => lowestUpper(strikes[k]) > n.midi;
        const comp = comps[q];
        if (comp && comps[prevMulti] === comp && below(prevMulti) && below(q)) barred[i] = true;
      }
      // A short melody note over other notes that leaves by step: passing or neighbour.
      const next = strikes[i + 1];
      const over = down.some((h) => h.midi < n.midi);
      if (over && next && n.end - n.start <= SHORT_NOTE_SEC && next.start <= n.end + 0.1) {
        if (next.notes.some((x) => x.midi !== n.midi && Math.abs(x.midi - n.midi) <= 2)) barred[i] = true;
      }
    }
    if (multi[i]) {
      // Comping re-struck (its upper notes again, perhaps over a walking bass note).
      const comp = comps[i];
      if (
        comp &&
        prevMulti >= 0 &&
        !forced[i] &&
        t - strikes[prevMulti].start <= RESTRIKE_WITHIN_SEC &&
        comp === comps[prevMulti]
      ) {
        barred[i] = true;
      }
      prevMulti = i;
    }
    for (const n of s.notes) lastSound = Math.max(lastSound, soundEndOf(sounding, n));
  }
  return { forced, barred, newBass, lowest };
}
