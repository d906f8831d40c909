// Text helpers that need no music engine: typographic accidentals, figures as
// percentages, clock times and UTC dates, interval names by size. Pure; runs anywhere.

/** "Bb4" → "B♭4", "Ebm7b5" → "E♭m7♭5", "bVII" → "♭VII", "F#" → "F♯". */
export function pretty(text: string): string {
  return text.replace(/(?<=^|[A-G0-9/(♭])b/g, "♭").replace(/#/g, "♯");
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
