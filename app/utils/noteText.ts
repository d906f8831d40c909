// Small text helpers for showing notes, chords and intervals to people: typographic
// accidentals, pitch-class names in the take's key, interval names. Pure; runs anywhere.
import { noteName, parseKey, spellPc, type Key } from "~/analysis/pitch";

/** "Bb4" → "B♭4", "Ebm7b5" → "E♭m7♭5", "bVII" → "♭VII", "F#" → "F♯". */
export function pretty(text: string): string {
  return text.replace(/(?<=^|[A-G0-9/(♭])b/g, "♭").replace(/#/g, "♯");
}

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

// Interval names by semitones (common practice names; compound intervals up to a 10th,
// the widest the low-interval table lists).
const INTERVAL_NAMES: Record<number, string> = {
  0: "unison",
  1: "minor 2nd",
  2: "major 2nd",
  3: "minor 3rd",
  4: "major 3rd",
  5: "perfect 4th",
  6: "tritone",
  7: "perfect 5th",
  8: "minor 6th",
  9: "major 6th",
  10: "minor 7th",
  11: "major 7th",
  12: "octave",
  13: "minor 9th",
  14: "major 9th",
  15: "minor 10th",
  16: "major 10th",
};

export function intervalName(semitones: number): string {
  const s = Math.abs(semitones);
  return INTERVAL_NAMES[s] ?? `${s}-semitone interval`;
}

/** "1 semitone", "5 semitones". */
export function semitones(n: number): string {
  const a = Math.abs(n);
  return `${a} semitone${a === 1 ? "" : "s"}`;
}

/** Smoothness 0..1 as a whole percentage. */
export function percent(x: number | null | undefined): string {
  return x === null || x === undefined || !Number.isFinite(x) ? "–" : `${Math.round(x * 100)}%`;
}

/** Seconds as m:ss. */
export function clock(sec: number): string {
  const s = Math.max(0, Math.floor(sec));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, "0")}`;
}

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

/**
 * "1 Dec 2026" from an ISO instant, in UTC: the server and the browser must print the
 * same text, or hydration fails, so no locale or local zone is involved.
 */
export function dayLabel(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return "–";
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}`;
}

/** "1 Dec 2026, 18:05 UTC". */
export function timeLabel(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return "–";
  return `${dayLabel(iso)}, ${String(d.getUTCHours()).padStart(2, "0")}:${String(d.getUTCMinutes()).padStart(2, "0")} UTC`;
}
