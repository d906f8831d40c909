// RULES.md rule 20: chords of the trade that tonal's dictionary lacks, added to tonal's own
// chord-type dictionary (so `Chord.detect` finds them like any other), and the lead-sheet
// suffix each reading is printed with.
//
// The fifth is the first tone a pianist leaves out, then the root (common practice; M. Levine,
// *The Jazz Piano Book*, 1989, from memory): shells of root, 3rd and 7th (or 6th) are named
// like the full chord, so E G# D is E7.
import { ChordType } from "tonal";

type Added = { intervals: string[]; alias: string; name: string };

/**
 * Types tonal 6.5.1 does not have. Each chroma is new to its dictionary (tonal already has
 * 7no5, alt7 = 7b9 without 5th, 7b13 without 5th, 9no5, 13no5, 7add6 = 13 without 9th, 7#9,
 * 7b9, 7#11, 9sus4, 69, m69, maj7#11), so nothing tonal names is renamed or shadowed. Aliases
 * are ours and never collide with tonal's, so `Chord.get("E7")` still means the full chord.
 */
const ADDED: Added[] = [
  { intervals: ["1P", "3M", "7M"], alias: "maj7no5", name: "major seventh shell" },
  { intervals: ["1P", "3m", "7m"], alias: "m7no5", name: "minor seventh shell" },
  { intervals: ["1P", "3M", "6M"], alias: "6no5", name: "sixth shell" },
  { intervals: ["1P", "3m", "6M"], alias: "m6no5", name: "minor sixth shell" },
  { intervals: ["1P", "3M", "7m", "9A"], alias: "7#9no5", name: "dominant sharp ninth shell" },
  { intervals: ["1P", "3M", "7m", "13M"], alias: "13no5no9", name: "dominant thirteenth shell" },
  { intervals: ["1P", "3M", "7M", "9M"], alias: "maj9no5", name: "major ninth shell" },
  { intervals: ["1P", "3m", "7m", "9M"], alias: "m9no5", name: "minor ninth shell" },
];

/**
 * The suffix a reading is printed with when it is not the type's first alias: shells and
 * other incomplete forms print as the chord they stand for (13 with or without 5th and 9th).
 * A stack of four fourths (tonal's `quartal`, C F Bb Eb) is printed by its root-position
 * reading, root, minor 3rd, 4th (11th) and minor 7th: Cm11 without 5th and 9th.
 */
const DISPLAY: Record<string, string> = {
  maj7no5: "maj7",
  m7no5: "m7",
  "6no5": "6",
  m6no5: "m6",
  "7#9no5": "7#9",
  "13no5no9": "13",
  maj9no5: "maj9",
  m9no5: "m9",
  "7no5": "7",
  alt7: "7b9",
  "7b6": "7b13",
  "7add6": "13",
  "9no5": "9",
  "13no5": "13",
  "4": "m11",
  M7b5: "maj7#11",
  "maj#4": "maj7#11",
  m7add11: "m11",
};

/**
 * Tones a type names one way and the trade another: F A B E (tonal's `M7b5`) is heard and
 * written as Fmaj7#11 without its 5th (rule 20's `maj7#11`), so its B is a #11, not a Cb.
 */
const RESPELLED: Record<string, Record<string, string>> = {
  M7b5: { "5d": "11A" },
};

/** A type's intervals as the trade names them (see RESPELLED). */
export function tradeIntervals(aliases: readonly string[], intervals: string[]): string[] {
  const map = RESPELLED[aliases[0] ?? ""];
  return map ? intervals.map((i) => map[i] ?? i) : intervals;
}

let registered = false;

/** Adds rule 20's chord types to tonal's dictionary once; later calls do nothing. */
export function registerTradeChords(): void {
  if (registered) return;
  registered = true;
  for (const a of ADDED) {
    if (!ChordType.get(a.alias).empty) continue; // already there (a second copy of this module)
    ChordType.add(a.intervals, [a.alias], a.name);
  }
}

registerTradeChords();

/** Lead-sheet suffix for a tonal type given by its aliases, or null to let the caller choose. */
export function displaySuffix(aliases: readonly string[]): string | null {
  const first = aliases[0];
  if (first === undefined) return null;
  if (first in DISPLAY) return DISPLAY[first];
  // tonal's bare "M" before a seventh, ninth or thirteenth reads as "maj" on a lead sheet.
  return /^M(7|9|13)/.test(first) ? `maj${first.slice(1)}` : null;
}
