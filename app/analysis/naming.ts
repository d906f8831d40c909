// RULES.md rules 4–6: root, quality and lead-sheet symbol from tonal's chord detection with
// our tie-break; inversion by the chord tone in the bass; close or open voicing. Rule 20's
// chords of the trade are added to tonal's dictionary by chordDictionary.ts, imported here so
// that they are in place before the first chord is named. Spelling and Roman numerals (rule
// 21) live in spelling.ts and are re-exported here.
import { Chord, Interval, Note } from "tonal";
import { displaySuffix, tradeIntervals } from "./chordDictionary";
import { pc } from "./pitch";
import type { ChordName, Triad } from "./types";

export {
  chordNoteNames,
  inContext,
  needsContext,
  requiredIntervals,
  romanOf,
  rootName,
  type SpellingContext,
  spelledSymbol,
} from "./spelling";

const SHARP_NAMES = ["C", "C#", "D", "D#", "E", "F", "F#", "G", "G#", "A", "A#", "B"];

/** Lead-sheet suffixes we prefer among tonal's aliases (tonal writes `M`, `Madd9`, ...). */
const PREFERRED_SUFFIXES = [
  "",
  "m",
  "dim",
  "aug",
  "7",
  "maj7",
  "m7",
  "m7b5",
  "dim7",
  "sus4",
  "sus2",
  "7sus4",
  "6",
  "m6",
  "add9",
  "madd9",
  "9",
  "maj9",
  "m9",
  "69",
  "m69",
  "11",
  "m11",
  "13",
  "maj13",
  "m13",
  "mMaj7",
  "5",
  "7b9sus4",
];

const DIMINISHED_TYPES = new Set(["diminished", "half-diminished", "diminished seventh"]);
/** Interval names that are chord tones rather than added tones (sus notes handled apart). */
const CORE_INTERVALS = new Set(["1P", "3m", "3M", "5P", "5d", "5A", "7m", "7M", "7d"]);

type Reading = {
  rootPc: number;
  /** Holds its whole triad (root, 3rd or suspended tone, 5th): not a shell leaving a tone out. */
  complete: boolean;
  suffix: string;
  quality: string;
  intervals: string[];
  alteredFifth: boolean;
  rootIsBass: boolean;
  addedCount: number;
  order: number;
};

function suffixOf(aliases: string[]): string {
  const shown = displaySuffix(aliases);
  if (shown !== null) return shown;
  for (const s of PREFERRED_SUFFIXES) if (aliases.includes(s)) return s;
  // A suffix starting with an accidental would merge with the root ("A" + "b9sus" reads as Ab).
  return aliases.find((a) => !/^[b#]/.test(a)) ?? aliases[0] ?? "";
}

function reading(name: string, bassPc: number, order: number, mask: number): Reading | null {
  return readingOf(Chord.get(name), bassPc, order, mask) ?? misjoined(name, bassPc, order, mask);
}

/**
 * tonal writes a reading as tonic + alias, so root A with the alias "b9sus" comes out as
 * "Ab9sus"; when the plain parse does not fit the notes, read the first letter as the root.
 */
function misjoined(name: string, bassPc: number, order: number, mask: number): Reading | null {
  const m = /^([A-G])([b#].*?)(?:\/([A-G][b#]*))?$/.exec(name);
  if (!m) return null;
  const chord = Chord.getChord(m[2], m[1], m[3]);
  return chord.empty ? null : readingOf(chord, bassPc, order, mask);
}

function readingOf(slashed: ReturnType<typeof Chord.get>, bassPc: number, order: number, mask: number): Reading | null {
  if (slashed.empty || !slashed.tonic) return null;
  const rootPc = Note.chroma(slashed.tonic);
  if (rootPc === undefined || Number.isNaN(rootPc)) return null;
  const alias = slashed.aliases[0] ?? "";
  // Re-read without the slash: tonal rotates the intervals of a slash chord around its bass.
  const plain = Chord.getChord(alias, slashed.tonic);
  // A third written as a tenth (tonal's quartal type C F Bb Eb) is the chord's 3rd.
  const intervals = tradeIntervals(slashed.aliases, plain.empty ? slashed.intervals : plain.intervals).map((i) =>
    i === "10m" || i === "10M" ? i.replace("10", "3") : i,
  );
  // Keep only readings whose tones are exactly the chord's pitch classes: with some sharp
  // spellings tonal returns a reading on a misspelled root (D E G A A# gives "Ab9sus/D").
  let readingMask = 1 << bassPc;
  for (const i of intervals) readingMask |= 1 << pc(rootPc + (Interval.semitones(i) ?? 0));
  if (readingMask !== mask) return null;
  const dimFamily = DIMINISHED_TYPES.has(slashed.type);
  const hasThird = intervals.includes("3m") || intervals.includes("3M");
  const alteredFifth =
    intervals.includes("5A") || (intervals.includes("5d") && !dimFamily) || (/#5|b5/.test(alias) && !dimFamily);
  const addedCount = intervals.filter(
    (i) => !CORE_INTERVALS.has(i) && !(!hasThird && (i === "2M" || i === "4P")),
  ).length;
  const sus = /sus/.test(alias) || (!hasThird && (intervals.includes("4P") || intervals.includes("2M")));
  const complete = (hasThird || sus) && intervals.some((i) => i === "5P" || i === "5d" || i === "5A");
  return {
    rootPc,
    complete,
    suffix: suffixOf(slashed.aliases),
    quality: slashed.type || (alias === "4" ? "quartal" : alias),
    intervals,
    alteredFifth,
    rootIsBass: rootPc === bassPc,
    addedCount,
    order,
  };
}

/**
 * A stack of fourths of four or more tones from the bass (C F Bb Eb): rule 20 names it by its
 * root-position reading where one exists. Three stacked fourths (F# B E) are a sus triad's
 * inversion and are left to the tie-break (Bsus4/F#).
 */
function isQuartalStack(mask: number, bassPc: number): boolean {
  let count = 0;
  for (let p = 0; p < 12; p++) if (mask & (1 << p)) count++;
  if (count < 4) return false;
  for (let k = 0; k < count; k++) if (!(mask & (1 << pc(bassPc + 5 * k)))) return false;
  return true;
}

/**
 * Rule 4's tie-break: (a) no altered fifth, (a′) readings holding their whole triad before
 * shells that leave a tone out (C E A is Am/C, not a C6 shell), (b) root in the bass, (c) fewer
 * added tones. Rule 20's quartal stacks take their root-position reading before (a′). Our own
 * last step (d), the root nearest above the bass, keeps the choice independent of how tonal
 * orders its readings, which varies with spelling (G C F gives Csus4/G first, F# B E gives
 * Esus2/F# first), so transposing a take never renames its chords.
 */
function better(a: Reading, b: Reading, bassPc: number, quartal: boolean): number {
  if (a.alteredFifth !== b.alteredFifth) return a.alteredFifth ? 1 : -1;
  if (quartal && a.rootIsBass !== b.rootIsBass) return a.rootIsBass ? -1 : 1;
  if (a.complete !== b.complete) return a.complete ? -1 : 1;
  if (a.rootIsBass !== b.rootIsBass) return a.rootIsBass ? -1 : 1;
  if (a.addedCount !== b.addedCount) return a.addedCount - b.addedCount;
  const above = (r: Reading) => (r.rootPc - bassPc + 12) % 12;
  if (above(a) !== above(b)) return above(a) - above(b);
  return a.order - b.order;
}

export function triadOf(intervals: string[]): Triad | null {
  const has = (i: string) => intervals.includes(i);
  if (has("3M")) return has("5A") && !has("5P") ? "augmented" : "major";
  if (has("3m")) return has("5d") && !has("5P") ? "diminished" : "minor";
  if (has("4P")) return "sus4";
  if (has("2M")) return "sus2";
  return null;
}

const UNNAMED: ChordName = { rootPc: null, triad: null, quality: null, suffix: null, intervals: [], intervalNames: {} };

function nameOf(best: Reading): ChordName {
  return {
    rootPc: best.rootPc,
    triad: triadOf(best.intervals),
    quality: best.quality,
    suffix: best.suffix,
    intervals: [...new Set(best.intervals.map((i) => (Interval.semitones(i) ?? 0) % 12))].sort((a, b) => a - b),
    intervalNames: Object.fromEntries(best.intervals.map((i) => [(Interval.semitones(i) ?? 0) % 12, i])),
  };
}

/** Every reading tonal's detection (with rule 20's types) gives the set over this bass, best first. */
function readingsOf(pcs: Iterable<number>, bassPc: number): Reading[] {
  const set = new Set<number>();
  for (const p of pcs) set.add(pc(p));
  set.add(pc(bassPc));
  let mask = 0;
  for (const p of set) mask |= 1 << p;
  const ordered = [pc(bassPc), ...[...set].filter((p) => p !== pc(bassPc)).sort((a, b) => a - b)];
  const names = set.size >= 2 ? Chord.detect(ordered.map((p) => SHARP_NAMES[p])) : [];
  const quartal = isQuartalStack(mask, pc(bassPc));
  return names
    .map((n, i) => reading(n, pc(bassPc), i, mask))
    .filter((r): r is Reading => r !== null)
    .sort((x, y) => better(x, y, pc(bassPc), quartal));
}

const cache = new Map<string, ChordName>();

/** Names a chord from its pitch classes and bass pitch class; cached, since takes repeat chords. */
export function nameChord(pcs: Iterable<number>, bassPc: number): ChordName {
  const list = [...pcs].map(pc);
  let mask = 1 << pc(bassPc);
  for (const p of list) mask |= 1 << p;
  const cacheKey = `${pc(bassPc)}:${mask}`;
  const hit = cache.get(cacheKey);
  if (hit) return hit;
  const best = readingsOf(list, bassPc)[0];
  const result = best ? nameOf(best) : UNNAMED;
  cache.set(cacheKey, result);
  return result;
}

/**
 * The chord's name read on a given root that need not sound (rule 20's rootless readings):
 * the best reading of the tones plus that root, with the root in the bass; null when no
 * reading has that root. F A B E on G is G13 (no 5th), B D F# A on G is Gmaj9.
 */
export function nameOnRoot(pcs: Iterable<number>, rootPc: number): ChordName | null {
  const best = readingsOf(pcs, pc(rootPc)).find((r) => r.rootPc === pc(rootPc));
  return best ? nameOf(best) : null;
}

/** Rule 5: 0 root, 1 third, 2 fifth, 3 seventh; null for any other tone in the bass. */
export function inversionOf(name: ChordName, bassMidi: number): number | null {
  if (name.rootPc === null) return null;
  const interval = name.intervalNames[(pc(bassMidi) - name.rootPc + 12) % 12];
  if (!interval) return null;
  const degree = interval.replace(/[^0-9]/g, "");
  return degree === "1" ? 0 : degree === "3" ? 1 : degree === "5" ? 2 : degree === "7" ? 3 : null;
}

/** Rule 6: open when some pitch class of the chord fits between adjacent upper-structure notes. */
export function voicingOf(upper: number[], chordPcs: Set<number>): "close" | "open" {
  for (let i = 0; i + 1 < upper.length; i++) {
    for (let m = upper[i] + 1; m < upper[i + 1]; m++) if (chordPcs.has(pc(m))) return "open";
  }
  return "close";
}

/** Added tones by their usual names ("9", "6", "11", ...), the triad and seventh left out. */
export function addedTones(name: ChordName): string[] {
  const hasThird = Object.values(name.intervalNames).some((i) => i === "3m" || i === "3M");
  return Object.values(name.intervalNames)
    .filter((i) => !CORE_INTERVALS.has(i) && !(!hasThird && (i === "2M" || i === "4P")))
    .map((i) => {
      const n = Number(i.replace(/[^0-9]/g, ""));
      const shown = n === 2 ? 9 : n === 4 ? 11 : n;
      const q = i.replace(/[0-9]/g, "");
      const accidental = q === "m" || q === "d" ? "b" : q === "A" ? "#" : "";
      return `${accidental}${shown}`;
    });
}
