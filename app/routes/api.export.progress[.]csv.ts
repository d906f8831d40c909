import { stringify } from "csv-stringify/sync";
import type { Route } from "./+types/api.export.progress[.]csv";
import { requireStudentsOfTeacher, requireTeacher } from "~/auth/access.server";
import { exportRows, pickStudents } from "~/models/board.server";
import { CSV_COLUMNS, csvRecord } from "~/models/progressCsv.server";
import { studioTimeZone } from "~/models/progress.server";
import { parseProgressQuery } from "~/models/progressQuery.server";

/**
 * GET /api/export/progress.csv?from=YYYY-MM-DD&to=YYYY-MM-DD[&student=ID…]
 * One row per student per week of the range up to this week (weeks without
 * takes included, weeks still to come left out), RFC 4180 quoting by
 * csv-stringify, UTF-8 without a byte-order mark.
 */
export async function loader(args: Route.LoaderArgs) {
  const teacher = await requireTeacher(args, "api");
  const studioId = teacher.active.studioId;
  const parsed = parseProgressQuery(new URL(args.request.url), studioTimeZone(studioId), { requireDates: true });
  if (!parsed.ok) return Response.json({ error: parsed.error }, { status: 400 });
  const q = parsed.query;
  await requireStudentsOfTeacher(args, q.studentIds, "api");
  const rows = exportRows(studioId, pickStudents(studioId, q.studentIds), q.fromWeek, q.toWeek).map(csvRecord);
  const csv = stringify([CSV_COLUMNS, ...rows], { record_delimiter: "\r\n" });
  return new Response(new TextEncoder().encode(csv), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="nearnote-progress-${q.from}-to-${q.to}.csv"`,
      "Cache-Control": "no-store",
    },
  });
}
