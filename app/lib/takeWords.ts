// Plain words for the engine's technique names, chord shapes and exercise mismatches.
import type { ChordReport, Mismatch, TechniqueName } from "~/analysis/types";
import { pretty } from "./noteText";

export const TECHNIQUE_WORDS: Record<TechniqueName, { label: string; text: string }> = {
  "added-second": { label: "Added 2nd", text: "a 2nd (the 9th) added to a major or minor chord" },
  inversion: { label: "Inversions", text: "a chord tone other than the root at the bottom of the hand" },
  "open-voicing": { label: "Open voicings", text: "the middle note dropped an octave to spread the chord" },
  "slash-bass": { label: "Another tone in the bass", text: "a left-hand bass on the 3rd, 5th or 7th of the chord" },
  "grace-to-third": { label: "Grace note into the 3rd", text: "a quick note a step below the 3rd, sliding into it" },
  "smooth-top-line": { label: "Smooth top line", text: "at least three changes in four moved the top note by 2 semitones or less" },
};

const INVERSION_WORDS = ["root position", "1st inversion", "2nd inversion", "3rd inversion"];
const INVERSION_SHORT = ["root pos.", "1st inv.", "2nd inv.", "3rd inv."];

/**
 * "1st inversion", "root position", or "other bass" when the bass is not a chord tone (rule 5).
 * Over a detached bass it names the hand's own inversion (`upperInversion`).
 */
export function inversionWords(chord: Pick<ChordReport, "inversion" | "upperInversion" | "detachedBass">, short = false): string {
  const inv = chord.detachedBass !== null && chord.upperInversion !== null ? chord.upperInversion : chord.inversion;
  const words = short ? INVERSION_SHORT : INVERSION_WORDS;
  return inv === null ? "other bass" : (words[inv] ?? "other bass");
}

/** One line per mismatch: "Chord 3: expected G, played Em." */
export function mismatchWords(m: Mismatch, chords: ChordReport[]): string {
  const expected = m.expected ? pretty(m.expected) : "a chord";
  const played = m.playedIndex !== null ? chords[m.playedIndex] : undefined;
  const playedName = played ? pretty(played.symbol ?? played.noteNames.join(" ")) : "another chord";
  const where = m.playedIndex !== null ? `Chord ${m.playedIndex + 1}` : `Target chord ${(m.targetIndex ?? 0) + 1}`;
  switch (m.kind) {
    case "missing":
      return `${where}: ${expected} was not played.`;
    case "extra":
      return `${where}: ${playedName} is not in the exercise.`;
    case "wrong-chord":
      return `${where}: expected ${expected}, played ${playedName}.`;
    case "wrong-bass":
      return `${where}: right chord, but the bass should make it ${expected} (played ${playedName}).`;
  }
}
