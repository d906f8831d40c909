// Plain words for the engine's technique names, chord shapes and exercise mismatches.
import type { ChordReport, Mismatch, TechniqueName } from "~/analysis/types";
import { pretty } from "~/utils/noteText";

export const TECHNIQUE_WORDS: Record<TechniqueName, { label: string; text: string }> = {
  "added-second": { label: "Added 2nd", text: "a 2nd (the 9th) added to a major or minor chord" },
  inversion: { label: "Inversions", text: "a chord tone other than the root at the bottom of the hand" },
  "open-voicing": { label: "Open voicings", text: "the middle note dropped an octave to spread the chord" },
  "slash-bass": { label: "Another tone in the bass", text: "a left-hand bass on the 3rd, 5th or 7th of the chord" },
  "grace-to-third": { label: "Grace note into the 3rd", text: "a quick note a step below the 3rd, sliding into it" },
  "smooth-top-line": {
    label: "Smooth top line",
    text: "at least three changes in four moved the top note by 2 semitones or less",
  },
};

const INVERSION_WORDS = ["root position", "1st inversion", "2nd inversion", "3rd inversion"];
const INVERSION_SHORT = ["root pos.", "1st inv.", "2nd inv.", "3rd inv."];

/**
 * "1st inversion", "root position", or "other bass" when the bass is not a chord tone (rule 5).
 * Over a detached bass it names the hand's own inversion (`upperInversion`).
 */
export function inversionWords(
  chord: Pick<ChordReport, "inversion" | "upperInversion" | "detachedBass">,
  short = false,
): string {
  const inv = chord.detachedBass !== null && chord.upperInversion !== null ? chord.upperInversion : chord.inversion;
  const words = short ? INVERSION_SHORT : INVERSION_WORDS;
  return inv === null ? "other bass" : (words[inv] ?? "other bass");
}

const ORDINALS = ["first", "second", "third", "fourth", "fifth", "sixth", "seventh", "eighth", "ninth", "tenth"];

/** Where a difference was played: "second time through, chord 3" when the take looped the exercise. */
export function mismatchPlace(m: Pick<Mismatch, "targetIndex" | "playedIndex" | "pass">, loops = 1): string {
  if (m.targetIndex === null) return `played chord ${(m.playedIndex ?? 0) + 1}`;
  const chord = `chord ${m.targetIndex + 1}`;
  if (loops <= 1) return `${chord} of the exercise`;
  const pass = m.pass ?? 0;
  return `${ORDINALS[pass] ?? `time ${pass + 1}`}${ORDINALS[pass] ? " time" : ""} through, ${chord}`;
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** One line per mismatch: "Second time through, chord 3: played E♭, expected D♭." */
export function mismatchWords(m: Mismatch, chords: ChordReport[], loops = 1): string {
  const expected = m.expected ? pretty(m.expected) : "a chord";
  const played = m.playedIndex !== null ? chords[m.playedIndex] : undefined;
  const playedName = played ? pretty(played.symbol ?? played.noteNames.join(" ")) : "another chord";
  const where = capital(mismatchPlace(m, loops));
  switch (m.kind) {
    case "missing":
      return `${where}: ${expected} was not played.`;
    case "extra":
      return `${where}: ${playedName} is not in the exercise.`;
    case "wrong-chord":
      return `${where}: played ${playedName}, expected ${expected}.`;
    case "wrong-bass":
      return `${where}: played ${playedName}, expected ${expected} (the right chord over another bass).`;
  }
}
