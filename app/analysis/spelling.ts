// RULES.md rule 21: a chord's notes spelled from its own root, one letter per chord tone, the
// root spelled for its function in the key, and the chord's Roman numeral as teachers write it.
import type { Key, Spelled } from "./pitch";
import { inKey, noteName, onLetter, parseNoteName, pc, spellPc, spellRoot, spelledText } from "./pitch";
import { romanFor, TRIAD_INTERVALS } from "./progression";
import type { ChordName } from "./types";

/** What follows the chord, for spelling a diminished seventh by where it leads. */
export type SpellingContext = { nextBassPc?: number | null; nextRootPc?: number | null };

const DIM7 = [0, 3, 6, 9];

function isDiminishedSeventh(name: ChordName): boolean {
  return name.triad === "diminished" && name.intervals.length === 4 && DIM7.every((i) => name.intervals.includes(i));
}

/**
 * Whether the chord's spelling can depend on what follows (only a diminished seventh's does),
 * so a caller caching spelled chords by voicing knows when to key the cache on the context.
 */
export function needsContext(name: ChordName): boolean {
  return name.rootPc !== null && isDiminishedSeventh(name);
}

/**
 * The tone a diminished seventh leads to by half step: the next chord's bass, else its root,
 * when the note a half step below it is in the chord (E G Bb Db before F is E°7, not Fb°7).
 * Any of a diminished seventh's four tones can be its root; its intervals stay 1P 3m 5d 7d.
 */
function leadingTarget(name: ChordName, ctx?: SpellingContext): number | null {
  if (!ctx || name.rootPc === null || !isDiminishedSeventh(name)) return null;
  const tones = DIM7.map((i) => pc(name.rootPc! + i));
  for (const target of [ctx.nextBassPc, ctx.nextRootPc]) {
    if (target === undefined || target === null) continue;
    if (tones.includes(pc(target - 1))) return pc(target);
  }
  return null;
}

/** The chord named on the root it has in context (only a diminished seventh ever moves). */
export function inContext(name: ChordName, ctx?: SpellingContext): ChordName {
  const target = leadingTarget(name, ctx);
  return target === null ? name : { ...name, rootPc: pc(target - 1) };
}

function rootSpelling(name: ChordName, key: Key | null, ctx?: SpellingContext): Spelled {
  const target = leadingTarget(name, ctx);
  if (target !== null) {
    // The letter below the note it resolves to, as that note is spelled in the key (E below F).
    const resolution = parseNoteName(spellPc(target, key))!;
    const s = onLetter(target - 1, resolution.letter - 1);
    if (Math.abs(s.alter) <= 1) return s;
    return spellRoot(target - 1, key);
  }
  return foreignRoot(name, key) ?? spellRoot(name.rootPc!, key);
}

/** Double sharps and flats among the chord's tones when spelled from this root. */
function doubles(name: ChordName, root: Spelled): number {
  let n = Math.abs(root.alter) > 1 ? 1 : 0;
  for (const i of name.intervals) {
    const s = toneSpelling(name, root, name.rootPc! + i);
    if (!s || Math.abs(s.alter) > 1) n++;
  }
  return n;
}

/**
 * A root foreign to the key (rule 21): the spelling with fewer accidentals, and of two with
 * equally few the flat one (bII, not #I), unless the flat one would spell its chord with
 * double flats that the sharp one avoids (F#°7 in C is F# A C Eb, not Gb Bbb Dbb Fbb: the
 * same reason as A, not Bbb). Null when the root belongs to the key or there is no key.
 */
function foreignRoot(name: ChordName, key: Key | null): Spelled | null {
  if (!key || inKey(name.rootPc!, key)) return null;
  const flat = spellRoot(name.rootPc!, key);
  if (flat.alter !== -1) return null; // a natural, or no tie
  const sharp = onLetter(name.rootPc!, flat.letter - 1);
  if (sharp.alter !== 1) return null;
  return doubles(name, flat) > doubles(name, sharp) ? sharp : null;
}

/** A chord tone spelled on its own letter above the root (3rd two letters up, 9th one). */
function toneSpelling(name: ChordName, root: Spelled, p: number): Spelled | null {
  const interval = name.intervalNames[pc(p - name.rootPc!)];
  if (!interval) return null;
  const number = Number(interval.replace(/\D/g, ""));
  const s = onLetter(p, root.letter + ((number - 1) % 7));
  return Math.abs(s.alter) <= 2 ? s : null;
}

/**
 * The root's name: in the key's letter when it belongs to the key, else with fewer accidentals
 * (the flat one on a tie); a diminished seventh by the note it leads to.
 */
export function rootName(name: ChordName, key: Key | null, ctx?: SpellingContext): string | null {
  if (name.rootPc === null) return null;
  return spelledText(rootSpelling(name, key, ctx));
}

/**
 * Note names with octaves (middle C = C4) for a chord's notes: chord tones spelled from the
 * chord's root (D major is D F# A in every key), other notes as `noteName` spells them.
 */
export function chordNoteNames(notes: number[], name: ChordName, key: Key | null, ctx?: SpellingContext): string[] {
  const named = inContext(name, ctx);
  if (named.rootPc === null) return notes.map((n) => noteName(n, key));
  const root = rootSpelling(name, key, ctx);
  return notes.map((n) => {
    const s = toneSpelling(named, root, n);
    if (!s) return noteName(n, key);
    return spelledText(s) + String(Math.floor((n - s.alter) / 12) - 1);
  });
}

/** Lead-sheet symbol spelled by rule 21; a bass that is a chord tone is spelled from the root. */
export function spelledSymbol(name: ChordName, bassPc: number, key: Key | null, ctx?: SpellingContext): string | null {
  if (name.rootPc === null || name.suffix === null) return null;
  const named = inContext(name, ctx);
  const root = rootSpelling(name, key, ctx);
  let slash = "";
  if (pc(bassPc) !== named.rootPc) {
    const s = toneSpelling(named, root, bassPc);
    slash = `/${s ? spelledText(s) : spellPc(pc(bassPc), key)}`;
  }
  return `${spelledText(root)}${name.suffix}${slash}`;
}

/** Semitones above the root that the chord names beyond its triad (7ths, 9ths, 6ths, ...). */
export function requiredIntervals(name: ChordName): number[] {
  if (name.triad === null) return [];
  const triad = new Set(TRIAD_INTERVALS[name.triad]);
  return name.intervals.filter((i) => !triad.has(i));
}

/**
 * Roman numeral of the chord in the key, written by progression.ts's `romanFor` so that what
 * we print reads back through the exercise parser as the same chord. With `bassPc`, inverted
 * triads and seventh chords take figures (`V65`) and other basses `/degree` (`IV/5`).
 */
export function romanOf(name: ChordName, key: Key, bassPc?: number | null, ctx?: SpellingContext): string | null {
  if (name.rootPc === null || name.triad === null) return null;
  const named = inContext(name, ctx);
  // A bass that is an added tone (F/G: G is F's 9th) is shown as the bass degree, not as an
  // added tone of the chord above it: IV/5, as teachers write it.
  const bassAbove = bassPc === undefined || bassPc === null ? null : pc(bassPc - named.rootPc!);
  const sevenths = named.triad === "diminished" ? [9, 10] : [10, 11];
  const required = requiredIntervals(named).filter((i) => i !== bassAbove || sevenths.includes(i));
  return romanFor({ root: named.rootPc!, triad: named.triad!, required }, key, {
    bass: bassPc ?? null,
    root: rootSpelling(name, key, ctx),
  });
}
