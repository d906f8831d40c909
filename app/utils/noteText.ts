// Text helpers for notes and chords that need the engine's spelling: pitch-class names in
// the take's key, voicings. Pure; runs anywhere.
import { noteName, parseKey, spellPc, type Key } from "~/analysis/pitch";
import { pretty } from "./plainText";

// The helpers without the engine's spelling live in plainText, so a page that only
// prints dates and figures does not load the engine's pitch code; they are re-exported here.
export { clock, dayLabel, intervalName, percent, pretty, semitones, timeLabel } from "./plainText";

/** The take's key as the engine reads it, or null when it is missing or unreadable. */
export function keyOf(name: string | null | undefined): Key | null {
  if (!name) return null;
  try {
    return parseKey(name);
  } catch {
    return null;
  }
}

/** A note with its octave, spelled in the key: 70 in F → "B♭4". */
export function noteLabel(midi: number, key: Key | null): string {
  return pretty(noteName(midi, key));
}

/** A voicing as pitch-class names joined by dashes: [53, 58, 62] in F → "F–B♭–D". */
export function voicingLabel(notes: readonly number[], key: Key | null): string {
  return notes.map((n) => pretty(spellPc(n, key))).join("–");
}
