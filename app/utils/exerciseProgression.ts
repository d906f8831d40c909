// An exercise's target progression in each of its keys. Pure (the analysis engine's parser
// and transposition), so the exercise form expands it live in the browser as the teacher
// types, and the server grades takes with exactly the same reading.
//
// Roman numerals are relative to the key, so they are read afresh in every key. Chord
// symbols are absolute: they are written in the exercise's first key and moved to the others.
import { parseKey, ProgressionError, type Key } from "~/analysis/pitch";
import { parseProgression, progressionTokens, transposeProgression, type TargetChord } from "~/analysis/progression";

/** The twelve major keys as teachers usually spell them (common practice: the fewer accidentals). */
export const ALL_MAJOR_KEYS = ["C", "Db", "D", "Eb", "E", "F", "F#", "G", "Ab", "A", "Bb", "B"];
/** The twelve minor keys, spelled likewise. */
export const ALL_MINOR_KEYS = ["Cm", "C#m", "Dm", "Ebm", "Em", "Fm", "F#m", "Gm", "G#m", "Am", "Bbm", "Bm"];

export type ExpandedKey = { key: string; chords: Array<{ symbol: string; roman: string | null }> };

export type ProgressionCheck =
  | { ok: true; keys: ExpandedKey[] }
  | { ok: false; field: "keys" | "progression"; message: string; position: number | null; token: string | null };

/** Splits what the teacher typed in the key field ("D, Ab  Gm") into key names. */
export function splitKeys(text: string): string[] {
  return [...new Set(text.split(/[\s,;]+/).filter((k) => k.length > 0))];
}

/** Whether any token is a chord symbol (absolute pitch), so the keys must be transposed to. */
export function usesChordSymbols(progression: string): boolean {
  return progressionTokens(progression).some((t) => /^[A-G]/.test(t));
}

function readKey(name: string): Key {
  return parseKey(name);
}

/** The target chords of the progression in one of the exercise's keys. Throws ProgressionError. */
export function targetChordsInKey(progression: string, keys: readonly string[], key: string): TargetChord[] {
  const home = readKey(keys[0] ?? key);
  const wanted = readKey(key);
  if (!usesChordSymbols(progression)) return parseProgression(progression, wanted);
  const written = parseProgression(progression, home);
  return home.tonic === wanted.tonic && home.mode === wanted.mode
    ? written
    : transposeProgression(written, home, wanted);
}

/**
 * The progression text the engine grades a take in `key` against: the teacher's own text
 * in the first key (or for Roman numerals), else the chord symbols moved to `key`.
 */
export function targetTextForKey(progression: string, keys: readonly string[], key: string | null): string {
  if (!key || !usesChordSymbols(progression) || keys.length === 0 || key === keys[0]) return progression;
  try {
    return targetChordsInKey(progression, keys, key)
      .map((c) => c.symbol)
      .join(" ");
  } catch {
    return progression;
  }
}

/** Checks the keys and the progression together and expands the progression in every key. */
export function checkProgression(progression: string, keys: readonly string[]): ProgressionCheck {
  if (keys.length === 0)
    return { ok: false, field: "keys", message: "Name at least one key, e.g. D or Gm.", position: null, token: null };
  const parsed: Key[] = [];
  for (const k of keys) {
    try {
      parsed.push(readKey(k));
    } catch {
      return {
        ok: false,
        field: "keys",
        message: `"${k}" is not a key Nearnote knows (try D, Ab, F# or Gm).`,
        position: null,
        token: k,
      };
    }
  }
  if (usesChordSymbols(progression) && parsed.some((k) => k.mode !== parsed[0].mode)) {
    return {
      ok: false,
      field: "keys",
      message:
        "Chord symbols are moved from the first key to the others, so all keys must be major, or all minor. Roman numerals work in any mix.",
      position: null,
      token: null,
    };
  }
  try {
    return {
      ok: true,
      keys: keys.map((key) => ({
        key,
        chords: targetChordsInKey(progression, keys, key).map((c) => ({ symbol: c.symbol, roman: c.roman })),
      })),
    };
  } catch (e) {
    if (e instanceof ProgressionError)
      return { ok: false, field: "progression", message: e.message, position: e.position, token: e.token };
    throw e;
  }
}
