// Target progressions as teachers write them (RULES.md "Progressions as teachers write them"):
// space-separated lead-sheet symbols ("Eb Bb/D Cm Cm/Bb Ab") or Roman numerals ("iiø7 V7 i").
// Both parsers are ours: tonal's Progression makes lower-case "vi" major and reads "V/7" as a
// slash chord, and its chord symbols need normalising anyway. Roman numerals are read and
// printed by roman.ts.

import { type Key, LETTER_PC, LETTERS, parseNoteName, pc, ProgressionError, spellPc } from "./pitch";

import { readRoman, romanFor, TRIAD_INTERVALS, type Triad } from "./roman";

export { ProgressionError } from "./pitch";

export { romanFor, type RomanOptions, TRIAD_INTERVALS, type Triad } from "./roman";

export type TargetChord = {
  root: number;
  triad: Triad;
  /** Pitch class of the bass, only when the target names one with a slash. */
  bass: number | null;
  /** Intervals above the root the target names beyond the triad (10 for 7, 11 for maj7, 2 for add9). */
  required: number[];
  symbol: string;
  roman: string | null;
};

/** Longest progression accepted, so a pasted novel cannot stall matching. */
export const MAX_PROGRESSION_CHORDS = 128;

type Suffix = { names: string[]; triad: Triad; required: number[] };
// Lead-sheet suffixes (common practice); the first name is the one we print.
const SUFFIXES: Suffix[] = [
  { names: ["", "M", "maj", "Maj", "major"], triad: "major", required: [] },
  { names: ["m", "min", "mi", "-", "minor"], triad: "minor", required: [] },
  { names: ["dim", "°", "o"], triad: "diminished", required: [] },
  { names: ["aug", "+"], triad: "augmented", required: [] },
  { names: ["sus2"], triad: "sus2", required: [] },
  { names: ["sus4", "sus"], triad: "sus4", required: [] },
  { names: ["6", "M6", "maj6"], triad: "major", required: [9] },
  { names: ["m6", "min6", "-6"], triad: "minor", required: [9] },
  { names: ["6/9", "69"], triad: "major", required: [9, 2] },
  { names: ["m6/9", "m69"], triad: "minor", required: [9, 2] },
  { names: ["7", "dom7"], triad: "major", required: [10] },
  { names: ["maj7", "M7", "Maj7", "ma7", "Δ", "Δ7", "j7"], triad: "major", required: [11] },
  { names: ["m7", "min7", "mi7", "-7"], triad: "minor", required: [10] },
  { names: ["mMaj7", "mM7", "mmaj7", "m(maj7)", "minmaj7", "-Δ7"], triad: "minor", required: [11] },
  { names: ["dim7", "°7", "o7"], triad: "diminished", required: [9] },
  { names: ["m7b5", "ø", "ø7", "min7b5", "-7b5", "m7(b5)"], triad: "diminished", required: [10] },
  { names: ["aug7", "+7", "7#5", "7+5"], triad: "augmented", required: [10] },
  { names: ["maj7#5", "augmaj7", "+maj7", "M7#5"], triad: "augmented", required: [11] },
  { names: ["7sus4", "7sus"], triad: "sus4", required: [10] },
  { names: ["7sus2"], triad: "sus2", required: [10] },
  { names: ["9"], triad: "major", required: [10, 2] },
  { names: ["maj9", "M9", "Δ9"], triad: "major", required: [11, 2] },
  { names: ["m9", "min9", "-9"], triad: "minor", required: [10, 2] },
  { names: ["9sus4", "9sus"], triad: "sus4", required: [10, 2] },
  { names: ["add9", "add2", "(add9)", "2"], triad: "major", required: [2] },
  { names: ["madd9", "m(add9)", "madd2", "-add9", "minadd9"], triad: "minor", required: [2] },
  { names: ["add11", "add4"], triad: "major", required: [5] },
  { names: ["madd11", "madd4"], triad: "minor", required: [5] },
  { names: ["m11", "min11", "-11"], triad: "minor", required: [10, 2, 5] },
  { names: ["13"], triad: "major", required: [10, 2, 9] },
  { names: ["7b9"], triad: "major", required: [10, 1] },
  { names: ["7#9"], triad: "major", required: [10, 3] },
  { names: ["7#11"], triad: "major", required: [10, 6] },
  { names: ["7b13"], triad: "major", required: [10, 8] },
  // Extensions a Roman numeral can name (roman.ts), so every target has a lead-sheet symbol.
  { names: ["maj13", "M13"], triad: "major", required: [11, 2, 9] },
  { names: ["m13", "min13", "-13"], triad: "minor", required: [10, 2, 9] },
  { names: ["mMaj9", "mM9"], triad: "minor", required: [11, 2] },
  { names: ["maj7#11", "M7#11"], triad: "major", required: [11, 6] },
  { names: ["9#11"], triad: "major", required: [10, 2, 6] },
  { names: ["maj9#11"], triad: "major", required: [11, 2, 6] },
  { names: ["13#11"], triad: "major", required: [10, 2, 6, 9] },
  { names: ["9b13"], triad: "major", required: [10, 2, 8] },
  { names: ["7b9b13"], triad: "major", required: [10, 1, 8] },
  { names: ["7#9b13"], triad: "major", required: [10, 3, 8] },
  { names: ["13b9"], triad: "major", required: [10, 1, 9] },
  { names: ["13#9"], triad: "major", required: [10, 3, 9] },
  { names: ["13sus4", "13sus"], triad: "sus4", required: [10, 2, 9] },
  { names: ["7b9sus4", "7b9sus"], triad: "sus4", required: [10, 1] },
];
const SUFFIX_BY_NAME = new Map<string, Suffix>(SUFFIXES.flatMap((s) => s.names.map((n) => [n, s] as [string, Suffix])));

const sameSet = (x: number[], y: number[]) => x.length === y.length && x.every((v) => y.includes(v));

/**
 * The printed lead-sheet suffix for a triad with named extra intervals ("m7", "add9", "7sus4").
 * A combination no suffix names exactly takes the suffix naming most of its tones and nothing
 * else: raw interval lists are never printed (RULES.md rule 21).
 */
export function suffixFor(triad: Triad, required: number[]): string {
  const found = SUFFIXES.find((s) => s.triad === triad && sameSet(s.required, required));
  if (found) return found.names[0];
  let best = SUFFIXES.find((s) => s.triad === triad && s.required.length === 0)!;
  for (const s of SUFFIXES) {
    if (s.triad === triad && s.required.every((r) => required.includes(r)) && s.required.length > best.required.length)
      best = s;
  }
  return best.names[0];
}

/** Pitch classes the target names: triad, extra intervals and slash bass, ascending. */
export function targetPcs(t: TargetChord): number[] {
  const set = new Set([...TRIAD_INTERVALS[t.triad], ...t.required].map((i) => pc(t.root + i)));
  if (t.bass !== null) set.add(t.bass);
  return [...set].sort((x, y) => x - y);
}

function badToken(position: number, token: string, why?: string): ProgressionError {
  const detail = why ? ` (${why})` : "";
  return new ProgressionError(
    `Token ${position} "${token}" is not a chord symbol or Roman numeral${detail}`,
    position,
    token,
  );
}

function parseChordSymbol(token: string, position: number, key: Key): TargetChord {
  const m = /^([A-G][#b♯♭]?)(.*)$/.exec(token)!;
  const root = parseNoteName(m[1]);
  let rest = m[2];
  let bass: number | null = null;
  const slash = /^(.*)\/([A-G][#b♯♭]?)$/.exec(rest);
  if (slash) {
    const bassNote = parseNoteName(slash[2]);
    if (!bassNote) throw badToken(position, token);
    bass = bassNote.pc;
    rest = slash[1];
  }
  const suffix = SUFFIX_BY_NAME.get(rest);
  if (!root || !suffix) throw badToken(position, token);
  const chord: TargetChord = {
    root: root.pc,
    triad: suffix.triad,
    bass,
    required: suffix.required.slice(),
    symbol: "",
    roman: null,
  };
  chord.symbol = symbolFor(chord, key, spellPc(chord.root, key));
  chord.roman = romanFor(chord, key);
  return chord;
}

function symbolFor(chord: TargetChord, key: Key, rootName: string): string {
  const bass = chord.bass === null || chord.bass === chord.root ? "" : `/${spellPc(chord.bass, key)}`;
  return rootName + suffixFor(chord.triad, chord.required) + bass;
}

function parseRoman(token: string, position: number, key: Key): TargetChord {
  const parts = readRoman(token, key, (why) => badToken(position, token, why));
  const chord: TargetChord = {
    root: parts.root,
    triad: parts.triad,
    bass: parts.bass,
    required: parts.required,
    symbol: "",
    roman: parts.roman,
  };
  chord.symbol = symbolFor(chord, key, parts.rootName);
  return chord;
}

/** A Roman numeral at the start of a chord (accidental, numeral, and no further letter). */
const ROMAN_START = /^[b#]?(?:VII|VI|V|IV|III|II|I|vii|vi|v|iv|iii|ii|i)(?![a-z])/;

/**
 * The same chord written with the characters teachers type on different keyboards, in one
 * spelling (common practice, lead-sheet notation): the math increment sign ∆ and the Greek Δ
 * both mean major seventh, º ˚ ⁰ are the degree sign °, Ø is ø, a minus sign is a hyphen,
 * and ♭ ♯ are b #.
 */
function normaliseSigns(text: string): string {
  return text
    .normalize("NFC")
    .replace(/∆/g, "Δ")
    .replace(/[º˚⁰]/g, "°")
    .replace(/Ø/g, "ø")
    .replace(/[−‐‑]/g, "-")
    .replace(/♭/g, "b")
    .replace(/♯/g, "#");
}

/**
 * Roman numerals written with a minor mark ("II-7", "IIm7", "VIm", "ii-7"), as many jazz
 * teachers write them (common practice, lead-sheet notation), become the lower-case numeral
 * the parser reads ("ii7", "vi").
 */
function lowerMinorNumeral(token: string): string {
  const m = /^([b#]?)(VII|VI|V|IV|III|II|I|vii|vi|v|iv|iii|ii|i)(?:-|min|mi|m)(?!aj|a7|M)(.*)$/.exec(token);
  return m ? m[1] + m[2].toLowerCase() + m[3] : token;
}

/**
 * Splits a progression into chord tokens. Spaces, commas, bar lines ("|", "||", "|:", ":|"),
 * en and em dashes separate chords; a hyphen does too when a chord follows it ("ii-V-I",
 * "Dm7-G7-C"), but not when it is the minor mark of a lead-sheet symbol ("D-7", "C-").
 */
export function progressionTokens(text: string): string[] {
  const bars = normaliseSigns(text).replace(/\|:|:\|/g, "|");
  const out: string[] = [];
  for (const rough of bars.split(/[\s,|–—]+/)) {
    let start = 0;
    for (let i = 1; i < rough.length; i++) {
      if (rough[i] !== "-") continue;
      const rest = rough.slice(i + 1);
      if (/^[A-G]/.test(rest) || ROMAN_START.test(rest)) {
        out.push(rough.slice(start, i));
        start = i + 1;
      }
    }
    out.push(rough.slice(start));
  }
  return out.filter((t) => t.length > 0).map(lowerMinorNumeral);
}

/** Parses a target progression of chord symbols or Roman numerals; throws ProgressionError naming the bad token. */
export function parseProgression(text: string, key: Key): TargetChord[] {
  const tokens = progressionTokens(text);
  if (tokens.length === 0)
    throw new ProgressionError("The progression is empty: write chords like I IV V I or C F G C");
  if (tokens.length > MAX_PROGRESSION_CHORDS) {
    throw new ProgressionError(
      `The progression has ${tokens.length} chords; at most ${MAX_PROGRESSION_CHORDS} are allowed`,
    );
  }
  return tokens.map((token, i) => {
    if (/^[A-G]/.test(token)) return parseChordSymbol(token, i + 1, key);
    if (/^[b#]?[IViv]/.test(token)) return parseRoman(token, i + 1, key);
    throw badToken(i + 1, token);
  });
}

/** The chord symbols of a progression, spelled in the key (for display). */
export function expandProgression(text: string, key: Key): string[] {
  return parseProgression(text, key).map((c) => c.symbol);
}

/** Moves a spelled note name by the interval between two keys, letters included (Bb in C -> C in D). */
function transposeName(name: string, from: Key, to: Key): string {
  const note = parseNoteName(name);
  const fromTonic = parseNoteName(from.name.replace(/m$/, ""));
  const toTonic = parseNoteName(to.name.replace(/m$/, ""));
  if (!note || !fromTonic || !toTonic) return spellPc(pc((note?.pc ?? 0) + to.tonic - from.tonic), to);
  const letter = (note.letter - fromTonic.letter + toTonic.letter + 7) % 7;
  const target = pc(note.pc + to.tonic - from.tonic);
  let acc = target - LETTER_PC[letter];
  if (acc > 6) acc -= 12;
  if (acc < -6) acc += 12;
  if (Math.abs(acc) > 1) return spellPc(target, to); // avoid double sharps and flats
  return LETTERS[letter] + (acc > 0 ? "#" : acc < 0 ? "b" : "");
}

/** The same progression in another key: roots and bass moved, symbols respelled, Roman numerals kept. */
export function transposeProgression(chords: TargetChord[], from: Key, to: Key): TargetChord[] {
  const shift = to.tonic - from.tonic;
  return chords.map((c) => {
    const m = /^([A-G][#b]*)(.*?)(?:\/([A-G][#b]*))?$/.exec(c.symbol);
    const rootName = m ? transposeName(m[1], from, to) : spellPc(c.root + shift, to);
    const moved: TargetChord = {
      root: pc(c.root + shift),
      triad: c.triad,
      bass: c.bass === null ? null : pc(c.bass + shift),
      required: c.required.slice(),
      symbol: "",
      roman: c.roman,
    };
    const bassName = m?.[3] ? transposeName(m[3], from, to) : null;
    moved.symbol =
      rootName + suffixFor(moved.triad, moved.required) + (bassName && moved.bass !== moved.root ? `/${bassName}` : "");
    return moved;
  });
}
