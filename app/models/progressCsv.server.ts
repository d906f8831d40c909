// The progress export as a person opens it in a spreadsheet: names first, headers
// in words, whole numbers and percentages as people write them, and the ids
// machines need at the end of each row.
import { TECHNIQUES } from "~/analysis/types";
import type { Figures } from "~/utils/progressFigures";
import { TECHNIQUE_WORDS } from "~/takes/takeWords";
import { weekStart } from "~/utils/weeks";
import type { StudentRef } from "./progress.server";

/** Column headers; spreadsheets and scripts of the studio may depend on them, so change them with care. */
export const CSV_COLUMNS = [
  "Student",
  "Week starting",
  "Takes",
  "Practice minutes",
  "Mean score",
  "Smoothness %",
  "Accuracy %",
  "Chord changes",
  "Motion per change (semitones)",
  "Root-position leaps per 10 changes",
  ...TECHNIQUES.map((t) => `${TECHNIQUE_WORDS[t].label} (changes)`),
  "ISO week",
  "Student ID",
];

/** Blank means "nothing to measure" (no analysed take that week), never zero. */
const whole = (v: number | null) => (v === null ? "" : String(Math.round(v)));
const oneDecimal = (v: number | null) => (v === null ? "" : (Math.round(v * 10) / 10).toFixed(1));
const percent = (v: number | null) => (v === null ? "" : String(Math.round(v * 100)));

/**
 * Names are typed by students; a spreadsheet would run one starting with = + - @
 * as a formula. A leading apostrophe keeps it text (OWASP, "CSV Injection").
 */
export const safeText = (s: string) => (/^[=+\-@\t\r]/.test(s) ? `'${s}` : s);

/** One row of the export, in the order of CSV_COLUMNS. */
export function csvRecord({
  student,
  week,
  figures: f,
}: {
  student: StudentRef;
  week: string;
  figures: Figures;
}): string[] {
  return [
    safeText(student.name),
    weekStart(week),
    String(f.takes),
    whole(f.practiceMinutes),
    whole(f.score),
    percent(f.smoothness),
    percent(f.accuracy),
    String(f.changes),
    oneDecimal(f.motionPerChange),
    oneDecimal(f.leapsPer10),
    ...TECHNIQUES.map((t) => String(f.techniques[t])),
    week,
    student.id,
  ];
}
