// Grades each change between consecutive harmonies: RULES.md rules 7–10 plus the suggestions a
// student sees (smoothest; smoothest keeping the played top note; smoothest keeping the played
// bass). Suggestions obey rule 8's limits (never a new bass under a two-hand voicing, never a
// new tune when the take has a melody), raise no chord flag, and are offered only when they
// move less than the change as played.
import { Budget } from "./budget";
import { bestMotion, isTwoHand, keptBass, MAX_GRADED_PITCHES } from "./bestMotion";
import { isRootPositionLeap, isTopLineLeap } from "./changeFlags";
import { isDoubledBassThird, raisesNoChordFlag } from "./chordFlags";
import { isMuddyLowInterval } from "./lowInterval";
import { nameChord } from "./naming";
import type { Key } from "./pitch";
import { noteName, parseNoteName } from "./pitch";
import type { ChangeFlag, ChangeReport, ChordReport, MelodyNote, Suggestion } from "./types";
import { motion, voiceLeadingPairs } from "./voiceLeading";

/** What grading a change needs to know about the rest of the take. */
export type ChangeContext = {
  /** The take has a melody (rule 18): best motion and every suggestion keep B's top note. */
  hasMelody?: boolean;
  /** The last top-voice note before the change (rule 10); A's top note when not given. */
  previousTop?: number;
  /** The whole take's budget; without one, each search has a hang guard of its own. */
  budget?: Budget;
  /** Notes the pedal carried into B that are not its chord tones (rule 19): flagged `pedal-blur`. */
  blurredNotes?: readonly number[];
};

/** What grading a take needs besides its harmonies. */
export type TakeContext = {
  hasMelody?: boolean;
  /** The take's melody notes (rule 18), any order; the top line of rule 10 follows them. */
  melodyNotes?: readonly MelodyNote[];
  /** One budget for the whole take (budget.ts); a fresh one when not given. */
  budget?: Budget;
  /** Per harmony index i, the blurred notes of the change into it (rule 19); none when absent. */
  blurredNotes?: readonly (readonly number[] | undefined)[];
};

const EPS = 1e-9;
/**
 * Steps charged for grading one distinct change besides its searches: the joins, the flags and
 * naming the suggestions' other basses (a name not yet cached costs about a quarter of a
 * millisecond). See budget.ts for what a step is.
 */
export const CHANGE_STEPS = 100;
const sameVoicing = (x: readonly number[], y: readonly number[]) =>
  x.length === y.length && x.every((n, i) => n === y[i]);
const startsWith = (v: readonly number[], head: readonly number[]) => head.every((n, i) => v[i] === n);

/** Pitch class of a chord's root from its spelled name ("Bb", "F♯"), null when unnamed. */
export function rootPcOf(c: Pick<ChordReport, "root">): number | null {
  return c.root === null ? null : (parseNoteName(c.root)?.pc ?? null);
}

/**
 * A necessary condition for raisesNoChordFlag on the lowest notes of a candidate (see
 * BestMotionOptions.acceptPrefix), so that the suggestion search drops flagged voicings as soon
 * as their low notes are placed: rule 12 is decided by the two lowest notes, and rule 11 by
 * the bass and any note doubling it below the top.
 */
export function cleanPrefix(prefix: readonly number[], length: number, b: readonly number[]): boolean {
  if (length < 2) return true;
  if (length === 2 && isMuddyLowInterval([prefix[0], prefix[1]])) return false;
  const bass = prefix[0];
  const x = prefix[length - 1];
  // x is not the top note (the top is never part of a prefix); x + 1 stands in for the top.
  if ((x - bass) % 12 === 0 && x !== bass + 12) return !isDoubledBassThird([bass, x, x + 1], nameChord(b, bass));
  return true;
}

function suggestions(
  a: number[],
  b: number[],
  key: Key | null,
  played: number,
  ctx: ChangeContext,
  best: number[] | null,
): Suggestion[] {
  // Rule 8's limits: the tune when the take has a melody; the bass of a two-hand voicing.
  const keepTop = ctx.hasMelody === true;
  const keepBass = isTwoHand(b);
  const bassHead = keptBass(b);
  const top = b[b.length - 1];
  const out: Suggestion[] = [];
  const offer = (kind: Suggestion["kind"], found: { motion: number; voicing: number[] } | null) => {
    if (!found || found.motion >= played) return;
    // Nothing to suggest when it is what was played, or when an earlier suggestion says it.
    if (sameVoicing(found.voicing, b) || out.some((s) => sameVoicing(s.voicing, found.voicing))) return;
    out.push({
      kind,
      voicing: found.voicing,
      noteNames: found.voicing.map((n) => noteName(n, key)),
      motion: found.motion,
    });
  };
  const search = (extra: { keepTop?: boolean; keepBass?: boolean }) =>
    bestMotion(a, b, {
      keepTop: keepTop || extra.keepTop,
      keepBass: keepBass || extra.keepBass,
      accept: raisesNoChordFlag,
      acceptPrefix: cleanPrefix,
      below: played,
      budget: ctx.budget,
    });

  // The best voicing of rule 8 searched a superset of these candidates in the same order of
  // preference: when it is allowed and clean it is also the smoothest suggestion.
  const bestServes =
    best !== null &&
    (!keepTop || best[best.length - 1] === top) &&
    (!keepBass || startsWith(best, bassHead)) &&
    raisesNoChordFlag(best.slice());
  const smoothest = bestServes ? { motion: motion(a, best!), voicing: best! } : search({});
  // Nothing clean moves less than played: a narrower search finds nothing either.
  if (!smoothest || smoothest.motion >= played) return out;
  offer("smoothest", smoothest);
  // A constraint already met by the smoothest voicing (or already imposed) gives it again.
  if (!keepTop && smoothest.voicing[smoothest.voicing.length - 1] !== top) offer("keep-top", search({ keepTop: true }));
  if (!keepBass && !startsWith(smoothest.voicing, bassHead)) offer("keep-bass", search({ keepBass: true }));
  return out;
}

/** Grades the change from chord `a` (index `from`) to chord `b` (index `to`). */
export function gradeChange(
  from: number,
  to: number,
  a: ChordReport,
  b: ChordReport,
  key: Key | null,
  ctx: ChangeContext = {},
): ChangeReport {
  const va = a.notes;
  const vb = b.notes;
  const flags: ChangeFlag[] = [];
  const base = {
    from,
    to,
    bassMotion: vb[0] - va[0],
    topVoiceInterval: vb[vb.length - 1] - va[va.length - 1],
    topLineFrom: ctx.previousTop ?? va[va.length - 1],
    blurredNotes: [...(ctx.blurredNotes ?? [])].sort((x, y) => x - y),
  };
  if (va.length > MAX_GRADED_PITCHES || vb.length > MAX_GRADED_PITCHES) {
    // Rule 8: chords of more than 8 distinct pitches are not graded (the pedal is still heard).
    if (base.blurredNotes.length > 0) flags.push("pedal-blur");
    return {
      ...base,
      graded: false,
      motion: null,
      bestMotion: null,
      bestVoicing: null,
      suggestions: [],
      commonTones: va.filter((n) => vb.includes(n)).length,
      largestVoiceMove: null,
      flags,
    };
  }
  ctx.budget?.spend(CHANGE_STEPS);
  const played = motion(va, vb);
  const best = bestMotion(va, vb, { keepTop: ctx.hasMelody === true, budget: ctx.budget });
  const pairs = voiceLeadingPairs(va, vb);
  if (isRootPositionLeap(va, vb, a.inversion, b.inversion, rootPcOf(a), rootPcOf(b))) flags.push("root-position-leap");
  if (isTopLineLeap(ctx.previousTop ?? va[va.length - 1], vb[vb.length - 1])) flags.push("top-line-leap");
  if (base.blurredNotes.length > 0) flags.push("pedal-blur");
  return {
    ...base,
    graded: true,
    motion: played,
    // B itself is always a candidate, so this never exceeds the played motion (rule 8).
    bestMotion: best ? best.motion : played,
    bestVoicing: best ? best.voicing : vb,
    suggestions: suggestions(va, vb, key, played, ctx, best ? best.voicing : null),
    commonTones: pairs.filter(([x, y]) => x === y).length,
    largestVoiceMove: pairs.reduce((m, [x, y]) => Math.max(m, Math.abs(y - x)), 0),
    flags,
  };
}

/**
 * Rule 10: the last top-voice note before the change from `a` to `b`: the last melody note
 * begun at or after `a` began and before `b` begins, else `a`'s top note. `melody` sorted by
 * onset.
 */
export function previousTopNote(a: ChordReport, b: ChordReport, melody: readonly MelodyNote[]): number {
  let lo = 0;
  let hi = melody.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (melody[mid].startSec < b.startSec - EPS) lo = mid + 1;
    else hi = mid;
  }
  const last = lo - 1;
  if (last >= 0 && melody[last].startSec >= a.startSec - EPS) {
    // Notes begun together: the highest is the top voice.
    let top = melody[last].note;
    for (let i = last - 1; i >= 0 && melody[i].startSec >= melody[last].startSec - EPS; i--)
      top = Math.max(top, melody[i].note);
    return top;
  }
  return a.notes[a.notes.length - 1];
}

/**
 * Grades every change of a take. Throws AnalysisError("too-complex") when the take's budget
 * runs out.
 */
export function gradeChanges(chords: ChordReport[], key: Key | null, ctx: TakeContext = {}): ChangeReport[] {
  const budget = ctx.budget ?? new Budget();
  const hasMelody = ctx.hasMelody === true;
  const melody = [...(ctx.melodyNotes ?? [])].sort((x, y) => x.startSec - y.startSec || x.note - y.note);
  // Takes loop their progressions, so the same change recurs: grade each distinct one once.
  // Everything but the indices depends on the two voicings, their roots and inversions, and
  // the top note the top line comes from.
  const seen = new Map<string, ChangeReport>();
  const out: ChangeReport[] = [];
  for (let i = 1; i < chords.length; i++) {
    const a = chords[i - 1];
    const b = chords[i];
    const previousTop = previousTopNote(a, b, melody);
    const blurredNotes = ctx.blurredNotes?.[i] ?? [];
    const id = `${a.notes.join(",")}>${b.notes.join(",")}|${previousTop}|${rootPcOf(a)},${rootPcOf(b)}|${a.inversion},${b.inversion}|${blurredNotes.join(",")}`;
    const known = seen.get(id);
    if (known) {
      out.push({ ...known, from: i - 1, to: i });
      continue;
    }
    const graded = gradeChange(i - 1, i, a, b, key, { hasMelody, previousTop, budget, blurredNotes });
    seen.set(id, graded);
    out.push(graded);
  }
  return out;
}
