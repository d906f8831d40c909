import { stringify } from "csv-stringify/sync";
import type { Route } from "./+types/api.export.progress[.]csv";
import { TECHNIQUES } from "~/analysis/types";
import { requireStudentsOfTeacher, requireTeacher } from "~/auth/access.server";
import { weekStart } from "~/lib/weeks";
import { exportRows, pickStudents } from "~/models/board.server";
import { studioTimeZone } from "~/models/progress.server";
import { parseProgressQuery } from "~/models/progressQuery.server";

/** Column names are stable: spreadsheets and scripts of the studio may depend on them. */
export const CSV_COLUMNS = [
  "student_id",
  "student",
  "week",
  "week_start",
  "takes",
  "practice_minutes",
  "chord_changes",
  "motion_per_change",
  "smoothness",
  "root_position_leaps_per_10_changes",
  "accuracy",
  "mean_score",
  ...TECHNIQUES.map((t) => `technique_${t.replaceAll("-", "_")}`),
];

/** Four decimals keep every figure exact enough to recompute from; blank means "nothing to measure". */
const num = (v: number | null) => (v === null ? "" : String(Math.round(v * 10_000) / 10_000));

/**
 * Names are typed by students; a spreadsheet would run one starting with = + - @
 * as a formula. A leading apostrophe keeps it text (OWASP, "CSV Injection").
 */
export const safeText = (s: string) => (/^[=+\-@\t\r]/.test(s) ? `'${s}` : s);

/**
 * GET /api/export/progress.csv?from=YYYY-MM-DD&to=YYYY-MM-DD[&student=ID…]
 * One row per student per ISO week of the range (weeks without takes included),
 * RFC 4180 quoting by csv-stringify, UTF-8 without a byte-order mark.
 */
export async function loader({ request }: Route.LoaderArgs) {
  const teacher = await requireTeacher(request, "api");
  const studioId = teacher.active.studioId;
  const parsed = parseProgressQuery(new URL(request.url), studioTimeZone(studioId), { requireDates: true });
  if (!parsed.ok) return Response.json({ error: parsed.error }, { status: 400 });
  const q = parsed.query;
  await requireStudentsOfTeacher(request, q.studentIds, "api");
  const rows = exportRows(studioId, pickStudents(studioId, q.studentIds), q.fromWeek, q.toWeek).map(({ student, week, figures: f }) => [
    student.id,
    safeText(student.name),
    week,
    weekStart(week),
    String(f.takes),
    num(f.practiceMinutes),
    String(f.changes),
    num(f.motionPerChange),
    num(f.smoothness),
    num(f.leapsPer10),
    num(f.accuracy),
    num(f.score),
    ...TECHNIQUES.map((t) => String(f.techniques[t])),
  ]);
  const csv = stringify([CSV_COLUMNS, ...rows], { record_delimiter: "\r\n" });
  return new Response(new TextEncoder().encode(csv), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="nearnote-progress-${q.from}-to-${q.to}.csv"`,
      "Cache-Control": "no-store",
    },
  });
}
