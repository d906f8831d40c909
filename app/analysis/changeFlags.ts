// Flags on a change between two chords (RULES.md rules 9 and 10).

function sorted(v: readonly number[]): number[] {
  return v.slice().sort((x, y) => x - y);
}

/** Smallest move, in semitones, of every voice for a change to count as a block leap. */
export const BLOCK_LEAP_MIN = 3;
/** A top note moving by more than this many semitones is a top-line leap. */
export const TOP_LINE_LEAP_MAX = 7;

/**
 * Rule 9: both chords in root position (inversion 0) with the same number of notes, and
 * every voice (sorted matching) moves the same way by 3 semitones or more.
 */
export function isRootPositionLeap(
  a: readonly number[],
  b: readonly number[],
  invA: number | null,
  invB: number | null,
): boolean {
  if (invA !== 0 || invB !== 0) return false;
  if (a.length === 0 || a.length !== b.length) return false;
  const sa = sorted(a);
  const sb = sorted(b);
  const moves = sa.map((x, i) => sb[i] - x);
  return moves.every((d) => d >= BLOCK_LEAP_MIN) || moves.every((d) => d <= -BLOCK_LEAP_MIN);
}

/** Rule 10: the top note moves by more than 7 semitones. */
export function isTopLineLeap(a: readonly number[], b: readonly number[]): boolean {
  if (a.length === 0 || b.length === 0) return false;
  return Math.abs(Math.max(...b) - Math.max(...a)) > TOP_LINE_LEAP_MAX;
}
