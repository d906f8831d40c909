// From strikes to harmonies (RULES.md rules 15–19): where each harmony begins (segment.ts),
// then, within it, which notes form its voicing, which are its bass line, its melody, its
// non-chord tones, and which notes the pedal carried in from before.
import { pc } from "./pitch";
import type { Budget } from "./budget";
import { identity, splitOnBassChange, splitOnNewChord } from "./harmonySplits";
import { boundaryRules, HELD_FOR, MIN_HARMONY_SEC, segment, TEMPLATES, type Segment } from "./segment";
import { heardEndOf, soundEndOf, type Soundings } from "./sounding";
import { firstAtOrAfter, type Strike } from "./strikes";
import type { NonChordToneKind, NoteEvent } from "./types";

const EPS = 1e-9;
/** Rule 18: a take has a melody when at least this share of its harmonies has top notes of their own. */
export const MELODY_SHARE = 0.25;
export { NAMING_STEPS } from "./harmonySplits";
/** Rule 15: a non-chord tone is approached or left "by step": one or two semitones. */
const STEP = 2;
/** How far back and ahead (seconds) a step to or from a non-chord tone is looked for. */
const STEP_WINDOW = 1.5;

export type HarmonyNote = { note: NoteEvent; kind: NonChordToneKind | null };

/** One harmony as read from the take, before it is named and measured. */
export type Harmony = {
  start: number;
  /** when the next harmony begins (the end of the take for the last one) */
  end: number;
  firstStrike: number;
  endStrike: number;
  /** rule 17: the notes of the voicing (several may share a pitch) */
  voicing: NoteEvent[];
  /** voicing notes struck before the harmony and held into it by key */
  held: NoteEvent[];
  bassLine: NoteEvent[];
  nonChordTones: HarmonyNote[];
  graces: Strike["graces"];
  /** rule 18: later notes on top that may be a melody (decided for the whole take) */
  topNotes: NoteEvent[];
  /** whether those top notes read as a line rather than a figure through the chord */
  ownLine: boolean;
  /** notes the pedal carried in from before, still sounding 150 ms into the harmony */
  carried: NoteEvent[];
  /** pitch classes of the chord that segmentation heard (its template plus the voicing) */
  chordPcs: Set<number>;
  /** a silence before it forced it to begin */
  afterSilence: boolean;
  /** a line of single notes, never two at once, moving by step somewhere: a tune, not a chord */
  solo: boolean;
};

export type ReadInput = {
  budget?: Budget;
  strikes: Strike[];
  sounding: Soundings;
  endTime: number;
  minHarmonySec?: number;
};

export type Reading = { harmonies: Harmony[]; melody: NoteEvent[]; hasMelody: boolean };

const soundEnd = soundEndOf;
const heardEnd = heardEndOf;

function templatePcs(seg: Segment): number[] {
  if (!seg.chord) return [];
  return TEMPLATES[seg.chord.template].intervals.map((i) => (seg.chord!.rootPc + i) % 12);
}

/**
 * Notes struck before each strike that still sound 150 ms into it (held by key or carried by
 * the pedal): one sweep over the take, so reading a harmony never looks far back. Listed only
 * for the strikes in `wanted` (where harmonies begin); the others stay undefined.
 */
function reachingNotes(
  strikes: readonly Strike[],
  sounding: ReadInput["sounding"],
  wanted: readonly boolean[],
): NoteEvent[][] {
  const active: NoteEvent[] = [];
  const out: NoteEvent[][] = new Array(strikes.length);
  for (let i = 0; i < strikes.length; i++) {
    const t = strikes[i].start + HELD_FOR - EPS;
    if (i > 0) active.push(...strikes[i - 1].notes);
    let kept = 0;
    for (const n of active) if (soundEnd(sounding, n) >= t) active[kept++] = n;
    active.length = kept;
    // A copy: the list kept for a strike must not change as the sweep goes on.
    if (wanted[i]) out[i] = active.slice();
  }
  return out;
}

const bit = (n: NoteEvent) => 1 << pc(n.midi);
const maskOf = (notes: readonly NoteEvent[]) => notes.reduce((m, n) => m | bit(n), 0);
const bits = (m: number) => {
  let c = 0;
  for (let x = m; x; x &= x - 1) c++;
  return c;
};

/** Rule 17 and friends: what each note of one harmony is. */
function readHarmony(
  seg: Segment,
  input: ReadInput,
  reaching: readonly NoteEvent[][],
  nextStart: number,
  afterSilence: boolean,
): Harmony {
  const { strikes, sounding } = input;
  const first = strikes[seg.first];
  const t0 = first.start;
  const before = reaching[seg.first];
  const tmpl = templatePcs(seg);
  const tmplMask = tmpl.reduce((m, p) => m | (1 << p), 0);
  const firstMask = maskOf(first.notes);

  // Held by key into the harmony, and carried by the pedal only.
  const keyHeld: NoteEvent[] = [];
  const carried: NoteEvent[] = [];
  for (const n of before) (n.end >= t0 + HELD_FOR - EPS ? keyHeld : carried).push(n);
  const fits = tmplMask | firstMask;
  const nonChordTones: HarmonyNote[] = [];
  const held: NoteEvent[] = [];
  for (const h of keyHeld) {
    let resolves = false;
    for (let k = seg.first + 1; k < seg.end && !resolves; k++) {
      for (const n of strikes[k].notes)
        if (Math.abs(n.midi - h.midi) >= 1 && Math.abs(n.midi - h.midi) <= STEP) resolves = true;
    }
    if (!(fits & bit(h)) && resolves) nonChordTones.push({ note: h, kind: "suspension" });
    else held.push(h);
  }
  const voicing: NoteEvent[] = [...first.notes, ...held];
  let have = maskOf(voicing);
  const chordMask = tmplMask | have;
  const chordPcs = new Set<number>();
  for (let p = 0; p < 12; p++) if (chordMask & (1 << p)) chordPcs.add(p);
  // A harmony that begins with fewer than three pitch classes is a broken chord: it is
  // complete once every pitch class of its chord has sounded (rule 17).
  const broken = bits(have) < 3;
  const complete = () => (tmplMask & have) === tmplMask || (bits(have) >= 3 && !broken);

  const bassLine: NoteEvent[] = [];
  const topNotes: NoteEvent[] = [];
  const graces = [...first.graces];
  const within = [...keyHeld, ...carried, ...first.notes];
  for (let k = seg.first + 1; k < seg.end; k++) {
    const s = strikes[k];
    graces.push(...s.graces);
    // Only notes still sounding matter from here on: keeps long harmonies linear.
    let kept = 0;
    for (const n of within) if (heardEnd(sounding, n) > s.start + EPS) within[kept++] = n;
    within.length = kept;
    within.push(...s.notes);
    if (!complete()) {
      // A broken chord: the strikes that complete it belong to the voicing.
      for (const n of s.notes) {
        if (chordMask & bit(n)) {
          voicing.push(n);
          have |= bit(n);
        } else nonChordTones.push({ note: n, kind: null });
      }
      continue;
    }
    // The top note of a later strike may carry a tune, struck alone or over accompaniment.
    let topOfStrike = s.notes[0];
    for (const n of s.notes) if (n.midi > topOfStrike.midi) topOfStrike = n;
    let bass = Infinity;
    for (const v of voicing) if (v.midi < bass) bass = v.midi;
    let upperLow = Infinity;
    for (const v of voicing) if (v.midi > bass && v.midi < upperLow) upperLow = v.midi;
    for (const n of s.notes) {
      // Sounding 150 ms on (for the bass line) and just after the onset (for the top).
      const later = n.start + HELD_FOR;
      const soon = n.start + 0.05;
      let lowest = heardEnd(sounding, n) > later - EPS;
      let under = 0;
      let onTop = true;
      for (const x of within) {
        if (x === n) continue;
        if (lowest && x.start <= later + EPS && heardEnd(sounding, x) > later + EPS && x.midi <= n.midi) lowest = false;
        // Under it, anything still sounding; over it, only keys still down (a tune's previous
        // note rings on under the pedal in the same voice).
        if (x.start <= soon + EPS && heardEnd(sounding, x) > soon + EPS && x.midi < n.midi) under++;
        if (x.start <= soon + EPS && x.end > soon + EPS && x.midi >= n.midi) onTop = false;
      }
      if (lowest && n.midi !== bass && n.midi < upperLow) {
        bassLine.push(n);
        continue;
      }
      if (n === topOfStrike && under > 0 && onTop) {
        topNotes.push(n);
        if (!(chordMask & bit(n))) nonChordTones.push({ note: n, kind: null });
        continue;
      }
      if (!(chordMask & bit(n))) nonChordTones.push({ note: n, kind: null });
    }
  }
  for (const g of graces) nonChordTones.push({ note: g.note, kind: "grace" });
  return {
    start: t0,
    end: nextStart,
    firstStrike: seg.first,
    endStrike: seg.end,
    voicing,
    held: held.filter((h) => !first.notes.some((n) => n.midi === h.midi)),
    bassLine,
    nonChordTones,
    graces,
    topNotes,
    ownLine: isOwnLine(voicing, topNotes, chordPcs),
    carried,
    chordPcs,
    afterSilence,
    solo: keyHeld.length + carried.length === 0 && isSolo(strikes.slice(seg.first, seg.end), sounding),
  };
}

/** A tune played alone: one note at a time, nothing under it, and some steps between notes. */
function isSolo(span: readonly Strike[], sounding: ReadInput["sounding"]): boolean {
  if (span.some((s) => s.notes.some((n) => n.midi !== s.notes[0].midi))) return false;
  const line = span.flatMap((s) => s.notes);
  for (let i = 1; i < line.length; i++) if (heardEnd(sounding, line[i - 1]) > line[i].start + HELD_FOR) return false;
  return line.some((n, i) => i > 0 && Math.abs(n.midi - line[i - 1].midi) <= STEP && n.midi !== line[i - 1].midi);
}

/**
 * Rule 18: top notes are a line of their own unless they only cycle through chord tones by
 * leaps (or repeat), as a broken chord or arpeggio does.
 */
function isOwnLine(voicing: NoteEvent[], top: NoteEvent[], chordPcs: Set<number>): boolean {
  if (top.length === 0) return false;
  if (top.some((n) => !chordPcs.has(pc(n.midi)))) return true;
  if (top.length < 2) return true;
  let prev = Math.max(...voicing.map((n) => n.midi));
  for (const n of top) {
    const d = Math.abs(n.midi - prev);
    if (d > 0 && d < 3) return true;
    prev = n.midi;
  }
  return false;
}

/** Kinds of the non-chord tones left unnamed: passing, neighbour or anticipation (rule 15). */
function nameKinds(h: Harmony, next: Harmony | undefined, sorted: readonly NoteEvent[]): void {
  for (const nct of h.nonChordTones) {
    if (nct.kind !== null) continue;
    const x = nct.note;
    let before: NoteEvent | null = null;
    let after: NoteEvent | null = null;
    for (
      let i = firstAtOrAfter(sorted, x.start - STEP_WINDOW);
      i < sorted.length && sorted[i].start <= x.start + STEP_WINDOW;
      i++
    ) {
      const n = sorted[i];
      const d = Math.abs(n.midi - x.midi);
      if (n === x || d < 1 || d > STEP) continue;
      if (n.start < x.start - EPS && (!before || n.start > before.start)) before = n;
      if (n.start > x.start + EPS && (!after || n.start < after.start)) after = n;
    }
    if (
      next &&
      next.voicing.some((n) => n.midi === x.midi) &&
      next.start - x.start <= STEP_WINDOW &&
      x.end >= next.start - 0.05
    ) {
      nct.kind = "anticipation";
    } else if (before && after) {
      if (after.midi === before.midi) nct.kind = "neighbour";
      else if (x.midi > before.midi === after.midi > x.midi) nct.kind = "passing";
    }
  }
}

/** Rules 15–18 over a take's strikes. */
export function readHarmonies(input: ReadInput): Reading {
  const { strikes, sounding, endTime } = input;
  const minSec = input.minHarmonySec ?? MIN_HARMONY_SEC;
  if (strikes.length === 0) return { harmonies: [], melody: [], hasMelody: false };
  const segInput = { strikes, sounding, endTime, minHarmonySec: minSec, budget: input.budget };
  const rules = boundaryRules(segInput);
  const raw = segment(segInput, rules);
  let segs = splitOnNewChord(
    splitOnBassChange(raw, strikes, sounding, rules.forced, endTime, minSec, rules.lowest),
    strikes,
    rules,
    endTime,
    minSec,
    input.budget,
  );
  const starts = new Array<boolean>(strikes.length).fill(false);
  for (const seg of segs) starts[seg.first] = true;
  const reaching = reachingNotes(strikes, sounding, starts);
  const readOne = (list: Segment[], i: number) =>
    readHarmony(
      list[i],
      input,
      reaching,
      i + 1 < list.length ? strikes[list[i + 1].first].start : endTime,
      rules.forced[list[i].first],
    );
  let all = segs.map((_, i) => readOne(segs, i));
  // Neighbours that name the same chord on the same bass are one harmony (a re-struck chord),
  // unless a silence divides them.
  const merged: Segment[] = [];
  const kept: Array<Harmony | null> = [];
  let lastId = "";
  segs.forEach((seg, i) => {
    const id = identity(
      all[i].voicing.map((n) => n.midi),
      input.budget,
    );
    if (merged.length > 0 && !rules.forced[seg.first] && lastId === id && !all[i].solo && !all[i - 1].solo) {
      merged[merged.length - 1] = { ...merged[merged.length - 1], end: seg.end };
      kept[kept.length - 1] = null; // read again below
    } else {
      merged.push({ ...seg });
      kept.push(all[i]);
      lastId = id;
    }
  });
  if (merged.length !== segs.length) {
    segs = merged;
    // Only merged harmonies are read again; the others keep their reading (and their end,
    // the unchanged start of the harmony after them).
    all = segs.map((_, i) => kept[i] ?? readOne(segs, i));
  }
  // A tune played alone is listed as melody and never graded as chords (rule 18).
  const harmonies = all.filter((h) => !h.solo);
  const solo = all
    .filter((h) => h.solo)
    .flatMap((h) => strikes.slice(h.firstStrike, h.endStrike).flatMap((s) => s.notes));
  const allNotes: NoteEvent[] = [];
  for (const s of strikes) {
    for (const n of s.notes) allNotes.push(n);
    for (const g of s.graces) allNotes.push(g.note);
  }
  allNotes.sort((a, b) => a.start - b.start);
  harmonies.forEach((h, i) => nameKinds(h, harmonies[i + 1], allNotes));
  const withLine = harmonies.filter((h) => h.ownLine).length;
  const hasMelody = withLine > 0 && withLine >= MELODY_SHARE * harmonies.length;
  const melody: NoteEvent[] = [...solo];
  if (hasMelody) {
    for (const h of harmonies) {
      const firstTop = strikes[h.firstStrike].notes.reduce((a, b) => (b.midi > a.midi ? b : a));
      if (h.ownLine || h.topNotes.length === 0) melody.push(firstTop);
      if (h.ownLine) melody.push(...h.topNotes);
    }
  }
  melody.sort((a, b) => a.start - b.start || a.midi - b.midi);
  return { harmonies, melody, hasMelody };
}
