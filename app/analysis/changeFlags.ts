// Flags on a change between two chords (RULES.md rules 9 and 10).
import { isTwoHand } from "./bestMotion";
import { pc } from "./pitch";

function sorted(v: readonly number[]): number[] {
  return [...new Set(v)].sort((x, y) => x - y);
}

/** Smallest move, in semitones, of every voice for a change to count as a block leap. */
export const BLOCK_LEAP_MIN = 3;
/** A top note moving by more than this many semitones is a top-line leap. */
export const TOP_LINE_LEAP_MAX = 7;

/**
 * The right-hand part of a two-hand voicing (rule 9): the notes above its widest gap between
 * adjacent notes. Where two gaps are equally wide the higher one is taken, so that a
 * left-hand octave (C2 C3 under C4 E4 G4 spaced evenly) stays with the left hand.
 */
export function rightHandPart(v: readonly number[]): number[] {
  const s = sorted(v);
  let cut = 1;
  for (let i = 1; i < s.length; i++) if (s[i] - s[i - 1] >= s[cut] - s[cut - 1]) cut = i;
  return s.slice(cut);
}

/** Every note (sorted matching) moves the same way by 3 semitones or more; same number of notes. */
function movesAsBlock(a: readonly number[], b: readonly number[]): boolean {
  if (a.length === 0 || a.length !== b.length) return false;
  const moves = a.map((x, i) => b[i] - x);
  return moves.every((d) => d >= BLOCK_LEAP_MIN) || moves.every((d) => d <= -BLOCK_LEAP_MIN);
}

/**
 * Rule 9: both chords in root position (inversion 0) with the same number of notes, and
 * every voice (sorted matching) moves the same way by 3 semitones or more. Between two two-hand
 * voicings it is judged on the right-hand parts alone, whatever the left hand does: each in
 * root position (its lowest note is the chord's root, so the roots' pitch classes are needed),
 * the same number of notes, every one moving the same way by 3 or more. Without the roots
 * the whole voicings are judged.
 */
export function isRootPositionLeap(
  a: readonly number[],
  b: readonly number[],
  invA: number | null,
  invB: number | null,
  rootPcA?: number | null,
  rootPcB?: number | null,
): boolean {
  if (rootPcA !== undefined && rootPcB !== undefined && isTwoHand(a) && isTwoHand(b)) {
    if (rootPcA === null || rootPcB === null) return false;
    const ra = rightHandPart(a);
    const rb = rightHandPart(b);
    return pc(ra[0]) === pc(rootPcA) && pc(rb[0]) === pc(rootPcB) && movesAsBlock(ra, rb);
  }
  if (invA !== 0 || invB !== 0) return false;
  return movesAsBlock(sorted(a), sorted(b));
}

/**
 * Rule 10: the top voice moves by more than 7 semitones, from the last top-voice note before
 * the change (a melody note where there is one; `previousTop`) to the new voicing's top note.
 * Also accepts two voicings, judged top note to top note (no melody).
 */
export function isTopLineLeap(previousTop: number | readonly number[], next: number | readonly number[]): boolean {
  const from = typeof previousTop === "number" ? previousTop : previousTop.length ? Math.max(...previousTop) : null;
  const to = typeof next === "number" ? next : next.length ? Math.max(...next) : null;
  if (from === null || to === null) return false;
  return Math.abs(to - from) > TOP_LINE_LEAP_MAX;
}
