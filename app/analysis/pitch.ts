// Pitch classes, keys and note spelling. Pure functions: runs on the server and in the browser.

/** A key as teachers write it: "D", "Ab", "F#" (major) or "Gm", "C#m" (minor). */
export type Key = { tonic: number; mode: "major" | "minor"; name: string };

/**
 * A progression or key the teacher typed could not be read. `position` is the 1-based
 * token position (null when the whole text or the key is at fault), `token` the text refused.
 * Defined here (not in progression.ts) so parseKey can throw it without a circular import;
 * progression.ts re-exports it.
 */
export class ProgressionError extends Error {
  position: number | null;
  token: string | null;
  constructor(message: string, position: number | null = null, token: string | null = null) {
    super(message);
    this.name = "ProgressionError";
    this.position = position;
    this.token = token;
  }
}

export const LETTERS = ["C", "D", "E", "F", "G", "A", "B"] as const;
/** Pitch class of each natural letter, in LETTERS order. */
export const LETTER_PC = [0, 2, 4, 5, 7, 9, 11] as const;
export const MAJOR_SCALE = [0, 2, 4, 5, 7, 9, 11] as const;
export const NATURAL_MINOR_SCALE = [0, 2, 3, 5, 7, 8, 10] as const;

/** Pitch class 0..11 of a MIDI note number (C = 0). */
export function pc(midi: number): number {
  return ((midi % 12) + 12) % 12;
}

/** Reads "b", "♭", "#", "♯" runs; returns the alteration in semitones or null. */
function accidentalValue(text: string): number | null {
  let alter = 0;
  for (const ch of text) {
    if (ch === "b" || ch === "♭") alter -= 1;
    else if (ch === "#" || ch === "♯") alter += 1;
    else return null;
  }
  return alter;
}

function accidentalText(alter: number): string {
  return alter >= 0 ? "#".repeat(alter) : "b".repeat(-alter);
}

/**
 * Parses a note name without octave ("Bb", "F#", "C") into its letter index and alteration.
 * Returns null when the text is not a note name.
 */
export function parseNoteName(text: string): { letter: number; alter: number; pc: number } | null {
  const m = /^([A-Ga-g])([b#♭♯]{0,2})$/.exec(text);
  if (!m) return null;
  const letter = LETTERS.indexOf(m[1].toUpperCase() as (typeof LETTERS)[number]);
  const alter = accidentalValue(m[2]);
  if (alter === null) return null;
  return { letter, alter, pc: pc(LETTER_PC[letter] + alter) };
}

/**
 * Parses a key: "D", "Ab", "F#", "Gm", "C#m"; also "A minor", "Bb major", "Amin".
 * Throws ProgressionError on anything else.
 */
export function parseKey(text: string): Key {
  const trimmed = text.trim();
  const m = /^([A-Ga-g][b#♭♯]?)\s*(m|min|minor|-|maj|major|M)?$/.exec(trimmed);
  const note = m ? parseNoteName(m[1]) : null;
  if (!m || !note) {
    throw new ProgressionError(
      `"${trimmed}" is not a key; write it like D, Ab, F# (major) or Gm, C#m (minor)`,
      null,
      trimmed,
    );
  }
  const minor = m[2] === "m" || m[2] === "min" || m[2] === "minor" || m[2] === "-";
  const name = LETTERS[note.letter] + accidentalText(note.alter) + (minor ? "m" : "");
  return { tonic: note.pc, mode: minor ? "minor" : "major", name };
}

export function keyName(k: Key): string {
  return k.name;
}

/** Letter index (0 = C) and alteration of the key's tonic, read back from its name. */
function tonicSpelling(key: Key): { letter: number; alter: number } {
  const parsed = parseNoteName(key.name.replace(/m$/, ""));
  if (parsed && parsed.pc === key.tonic) return parsed;
  // A Key built by hand with an odd name: fall back to a plain spelling of the tonic.
  const plain = spellPc(key.tonic, null);
  const fallback = parseNoteName(plain)!;
  return fallback;
}

/**
 * Spells scale degree `degree` (0 = tonic … 6) of the key, raised or lowered by `alter`
 * semitones, with the degree's own letter: bVI in D is "Bb", vii in G minor on the raised
 * seventh is "F#". Roman numerals are spelled this way.
 */
export function spellDegree(key: Key, degree: number, alter = 0): string {
  const tonic = tonicSpelling(key);
  const scale = key.mode === "major" ? MAJOR_SCALE : NATURAL_MINOR_SCALE;
  const letter = (tonic.letter + degree) % 7;
  const targetPc = pc(key.tonic + scale[degree] + alter);
  let acc = targetPc - LETTER_PC[letter];
  if (acc > 6) acc -= 12;
  if (acc < -6) acc += 12;
  return LETTERS[letter] + accidentalText(acc);
}

// Chromatic spellings for notes outside the key. C major / A minor and "no key" use the
// common-practice mix (F# rather than Gb, flats otherwise).
const SHARP_NAMES = ["C", "C#", "D", "D#", "E", "F", "F#", "G", "G#", "A", "A#", "B"];
const FLAT_NAMES = ["C", "Db", "D", "Eb", "E", "F", "Gb", "G", "Ab", "A", "Bb", "B"];
const NEUTRAL_NAMES = ["C", "Db", "D", "Eb", "E", "F", "F#", "G", "Ab", "A", "Bb", "B"];

/** Number of sharps (positive) or flats (negative) in the key signature, from its tonic spelling. */
export function keySignature(key: Key): number {
  // Circle of fifths position of the tonic spelling, shifted by 3 for minor (relative major).
  const tonic = tonicSpelling(key);
  const fifthsOfLetter = [0, 2, 4, -1, 1, 3, 5]; // C D E F G A B
  const fifths = fifthsOfLetter[tonic.letter] + 7 * tonic.alter;
  return key.mode === "major" ? fifths : fifths - 3;
}

/**
 * Pitch-class name spelled for the key: the key's own letters for its scale notes (and for
 * the raised 6th and 7th in minor), otherwise sharps in sharp keys and flats in flat keys.
 * Without a key: C Db D Eb E F F# G Ab A Bb B.
 */
export function spellPc(pitchClass: number, key: Key | null): string {
  const p = pc(pitchClass);
  if (!key) return NEUTRAL_NAMES[p];
  const scale = key.mode === "major" ? MAJOR_SCALE : NATURAL_MINOR_SCALE;
  for (let degree = 0; degree < 7; degree++) {
    if (pc(key.tonic + scale[degree]) === p) return spellDegree(key, degree);
  }
  if (key.mode === "minor") {
    // Melodic / harmonic minor: raised 6th and leading tone keep their letters (F# in G minor).
    if (pc(key.tonic + 11) === p) return spellDegree(key, 6, 1);
    if (pc(key.tonic + 9) === p) return spellDegree(key, 5, 1);
  }
  const sig = keySignature(key);
  if (sig > 0) return SHARP_NAMES[p];
  if (sig < 0) return FLAT_NAMES[p];
  return NEUTRAL_NAMES[p];
}

/** Note name with octave, middle C (60) = "C4"; a Cb or B# keeps the octave of its letter. */
export function noteName(midi: number, key: Key | null): string {
  const name = spellPc(midi, key);
  const parsed = parseNoteName(name)!;
  const octave = Math.floor((midi - parsed.alter) / 12) - 1;
  return name + String(octave);
}

/** A spelled pitch class: letter index (0 = C … 6 = B) and alteration in semitones. */
export type Spelled = { letter: number; alter: number };

export function spelledText(s: Spelled): string {
  return LETTERS[s.letter] + accidentalText(s.alter);
}

/** The pitch class `pitchClass` written on letter `letter` (alteration between -6 and +5). */
export function onLetter(pitchClass: number, letter: number): Spelled {
  const l = ((letter % 7) + 7) % 7;
  return { letter: l, alter: pc(pitchClass - LETTER_PC[l] + 6) - 6 };
}

/** Pitch classes that belong to the key: its scale, and in minor the raised 6th and 7th too. */
export function inKey(p: number, key: Key): boolean {
  const scale = key.mode === "major" ? MAJOR_SCALE : NATURAL_MINOR_SCALE;
  if (scale.some((s) => pc(key.tonic + s) === p)) return true;
  return key.mode === "minor" && (pc(key.tonic + 9) === p || pc(key.tonic + 11) === p);
}

/**
 * RULES.md rule 21: a chord root spelled for its function in the key. A root in the key keeps
 * the key's letter (Cb in Gb, F# in G minor); a foreign root takes the spelling with fewer
 * accidentals (A, not Bbb), and of two with equally few the flat one (Db, not C#: bII).
 * Without a key: C Db D Eb E F F# G Ab A Bb B.
 */
export function spellRoot(rootPc: number, key: Key | null): Spelled {
  const p = pc(rootPc);
  if (!key || inKey(p, key)) return parseNoteName(spellPc(p, key))!;
  let best: Spelled | null = null;
  for (let letter = 0; letter < 7; letter++) {
    const s = onLetter(p, letter);
    if (Math.abs(s.alter) > 1) continue;
    if (
      !best ||
      Math.abs(s.alter) < Math.abs(best.alter) ||
      (Math.abs(s.alter) === Math.abs(best.alter) && s.alter < best.alter)
    )
      best = s;
  }
  return best!;
}

/** Scale degree (0 = tonic … 6) of a spelled note in the key, and its alteration from the scale. */
export function degreeInKey(s: Spelled, key: Key): { degree: number; alter: number } {
  const tonic = tonicSpelling(key);
  const scale = key.mode === "major" ? MAJOR_SCALE : NATURAL_MINOR_SCALE;
  const degree = (s.letter - tonic.letter + 7) % 7;
  const notePc = pc(LETTER_PC[s.letter] + s.alter);
  return { degree, alter: pc(notePc - key.tonic - scale[degree] + 6) - 6 };
}
