// Flags on a single chord: RULES.md rules 11 and 12, and `too-many-notes` (rule 8).
import { isMuddyLowInterval } from "./lowInterval";
import { nameChord } from "./naming";
import { pc } from "./pitch";
import type { ChordFlag, ChordName } from "./types";
import { MAX_GRADED_PITCHES } from "./bestMotion";

/**
 * Rule 11 (common practice, no source): a major or dominant chord whose 3rd is the bass and
 * sounds again above it, other than as the top note or exactly one octave above the bass.
 */
export function isDoubledBassThird(v: readonly number[], name: ChordName): boolean {
  if (name.rootPc === null || name.triad !== "major" || v.length < 2) return false;
  const bass = v[0];
  if (pc(bass - name.rootPc) !== 4) return false;
  const top = v[v.length - 1];
  return v.some((n, i) => i > 0 && pc(n) === pc(bass) && n !== top && n !== bass + 12);
}

/** Every chord flag of a voicing (ascending distinct MIDI numbers). */
export function chordFlags(v: readonly number[], name: ChordName = nameOf(v)): ChordFlag[] {
  const flags: ChordFlag[] = [];
  if (isDoubledBassThird(v, name)) flags.push("doubled-bass-third");
  if (isMuddyLowInterval([...v])) flags.push("muddy-low-interval");
  if (v.length > MAX_GRADED_PITCHES) flags.push("too-many-notes");
  return flags;
}

function nameOf(v: readonly number[]): ChordName {
  return nameChord(v, v[0]);
}

/**
 * The `accept` callback handed to bestMotion: a suggestion may raise no chord flag. One stable
 * function, because bestMotion caches its results per callback.
 */
export const raisesNoChordFlag = (v: number[]): boolean => chordFlags(v).length === 0;
