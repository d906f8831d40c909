// Where the spans that segmentation found are divided further (RULES.md rule 15, "How Nearnote
// implements it", step 5): a new bass struck with the upper notes, and a strike that names a
// different chord. Also the chord identity rule 15 compares harmonies by.
import type { Budget } from "./budget";
import { nameChord } from "./naming";
import { pc } from "./pitch";
import { HELD_FOR, lowestSounding, type BoundaryRules, type Segment } from "./segment";
import type { Soundings } from "./sounding";
import type { Strike } from "./strikes";
import type { NoteEvent } from "./types";

const EPS = 1e-9;
/** Budget steps charged for naming a chord (about a quarter of a millisecond, like 300 search steps). */
export const NAMING_STEPS = 300;

/**
 * Rule 15, first point: a new bass pitch class struck with an upper note, which then stays
 * until the harmony ends, starts a harmony even on the same chord (C → C/E). A bass that
 * moves on under the same chord is a bass line instead.
 */
export function splitOnBassChange(
  segs: Segment[],
  strikes: readonly Strike[],
  sounding: Soundings,
  forced: readonly boolean[],
  endTime: number,
  minSec: number,
  precomputed?: Array<NoteEvent | null>,
): Segment[] {
  const lowest = precomputed ?? lowestSounding(strikes, sounding);
  const struckLow = (k: number) => {
    const l = lowest[k];
    return l && strikes[k].notes.includes(l) ? l : null;
  };
  const out: Segment[] = [];
  for (const seg of segs) {
    // For each strike, up to two bass pitch classes struck after it in the segment.
    const later: number[][] = new Array(seg.end - seg.first);
    let seen: number[] = [];
    for (let k = seg.end - 1; k >= seg.first; k--) {
      later[k - seg.first] = seen;
      const l = struckLow(k);
      if (l && !seen.includes(pc(l.midi)) && seen.length < 2) seen = [...seen, pc(l.midi)];
    }
    let cur: Segment = { ...seg };
    let bassPc = lowest[seg.first] ? pc(lowest[seg.first]!.midi) : null;
    let bassMidi = lowest[seg.first] ? lowest[seg.first]!.midi : null;
    const nextStart = seg.end < strikes.length ? strikes[seg.end].start : endTime;
    for (let k = seg.first + 1; k < seg.end; k++) {
      const low = struckLow(k);
      if (!low) continue;
      const p = pc(low.midi);
      const pitches = [...new Set(strikes[k].notes.map((n) => n.midi))].sort((a, b) => a - b);
      // A bass: set apart from the notes struck with it, or lower than the bass before.
      const isBass =
        pitches.length >= 2 && (pitches[1] - pitches[0] >= 7 || (bassMidi !== null && pitches[0] < bassMidi));
      const stays = later[k - seg.first].every((q) => q === p);
      if (isBass && p !== bassPc && stays && nextStart - strikes[k].start >= minSec - EPS) {
        const lead = strikes.slice(cur.first, k);
        const onlySingles = lead.every((x) => new Set(x.notes.map((n) => n.midi)).size < 2);
        if (onlySingles && out.length > 0 && !forced[cur.first]) {
          // Single notes before the chord arrives walked on from the harmony before.
          out[out.length - 1] = { ...out[out.length - 1], end: k };
          cur = { ...cur, first: k };
        } else if (strikes[k].start - strikes[cur.first].start >= minSec - EPS) {
          out.push({ ...cur, end: k });
          cur = { ...cur, first: k };
        }
      }
      bassPc = p;
      bassMidi = low.midi;
    }
    out.push(cur);
  }
  return out;
}

/** A chord's identity for rule 15: its name by rule 4 (root, symbol suffix) and its bass. */
export function identity(pitches: readonly number[], budget?: Budget): string {
  const sorted = [...new Set(pitches)].sort((a, b) => a - b);
  if (sorted.length === 0) return "";
  // Naming a chord not seen before is the costliest step here (tonal's detection).
  budget?.spend(NAMING_STEPS);
  const name = nameChord(sorted, sorted[0]);
  return name.rootPc === null
    ? `?${[...new Set(sorted.map(pc))].sort((a, b) => a - b).join(",")}/${pc(sorted[0])}`
    : `${name.rootPc}${name.suffix}/${pc(sorted[0])}`;
}

function sameSet(a: readonly number[], b: readonly number[]): boolean {
  const x = new Set(a);
  const y = new Set(b);
  return x.size === y.size && [...x].every((v) => y.has(v));
}

/** Pitches sounding by key 150 ms into strike k: its own notes and keys held into it. */
function struckChord(strikes: readonly Strike[], k: number): number[] {
  const t = strikes[k].start + HELD_FOR;
  const out = strikes[k].notes.map((n) => n.midi);
  for (let q = Math.max(0, k - 64); q < k; q++) for (const n of strikes[q].notes) if (n.end > t + EPS) out.push(n.midi);
  return out;
}

/**
 * Rule 15: inside a span the templates heard as one chord, a strike of three or more pitches
 * whose notes (with the keys held into it) name a different chord, which lasts, begins a
 * harmony: block chords change at every strike, and rootless voicings that share most of
 * their notes (F A C E, then F A B E) are still two chords. Comping re-strikes never do.
 */
export function splitOnNewChord(
  segs: Segment[],
  strikes: readonly Strike[],
  rules: BoundaryRules,
  endTime: number,
  minSec: number,
  budget?: Budget,
): Segment[] {
  const out: Segment[] = [];
  for (const seg of segs) {
    let cur: Segment = { ...seg };
    // The chord so far: a broken chord builds up until it has three pitches.
    let sofar = struckChord(strikes, seg.first);
    const nextStart = seg.end < strikes.length ? strikes[seg.end].start : endTime;
    for (let k = seg.first + 1; k < seg.end; k++) {
      if (rules.barred[k]) continue;
      const chord = struckChord(strikes, k);
      if (new Set(sofar.map(pc)).size < 3) {
        sofar = [...sofar, ...chord];
        continue;
      }
      if (new Set(chord.map(pc)).size < 3) continue;
      // One note added over everything still sounding builds the chord up; it changes nothing.
      const struck = new Set(strikes[k].notes.map((n) => n.midi)).size;
      const sofarPcs = new Set(sofar.map(pc));
      const chordPcs = new Set(chord.map(pc));
      if (struck === 1 && [...sofarPcs].every((p) => chordPcs.has(p))) {
        sofar = [...sofar, ...chord];
        continue;
      }
      // Over a separate bass (7 or more below), upper notes re-struck keep that bass.
      const bass = Math.min(...sofar);
      const low = Math.min(...chord);
      const heard = low - bass >= 7 ? [bass, ...chord] : chord;
      if (sameSet(heard, sofar) || identity(heard, budget) === identity(sofar, budget)) continue;
      if (strikes[k].start - strikes[cur.first].start >= minSec - EPS && nextStart - strikes[k].start >= minSec - EPS) {
        out.push({ ...cur, end: k });
        cur = { ...cur, first: k };
        sofar = heard;
      }
    }
    out.push(cur);
  }
  return out;
}
