// Low-interval limits (RULES.md rule 12). Source: jazz-arranging texts (Lowell & Pullig,
// "Arranging for Large Jazz Ensemble") as tabulated in the open-source elm-music-theory
// package. Texts differ by a step and call these guidelines.

/** Lowest bottom note (MIDI) at which each interval (semitones) still sounds clear. */
const LIMITS: ReadonlyMap<number, number> = new Map([
  [1, 52], // m2  E3
  [2, 51], // M2  Eb3
  [3, 48], // m3  C3
  [4, 46], // M3  Bb2
  [5, 46], // P4  Bb2
  [6, 46], // tritone Bb2
  [7, 34], // P5  Bb1
  [8, 43], // m6  G2
  [9, 41], // M6  F2
  [10, 41], // m7 F2
  [11, 41], // M7 F2
  [13, 40], // m9 E2
  [14, 39], // M9 Eb2
  [15, 36], // m10 C2
  [16, 34], // M10 Bb1
]);

/** The limit for an interval in semitones, or null (unison, octave, wider than a major 10th). */
export function lowIntervalLimit(semitones: number): number | null {
  return LIMITS.get(Math.abs(semitones)) ?? null;
}

/** Rule 12: the two lowest notes form an interval whose bottom note lies below its limit. */
export function isMuddyLowInterval(v: readonly number[]): boolean {
  if (v.length < 2) return false;
  const s = v.slice().sort((x, y) => x - y);
  const limit = lowIntervalLimit(s[1] - s[0]);
  return limit !== null && s[0] < limit;
}
