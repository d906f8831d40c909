import { stringify } from "csv-stringify/sync";
import type { Route } from "./+types/api.export.progress[.]csv";
import { requireStudentsOfTeacher, requireTeacher } from "~/auth/access.server";
import { exportRowBatches, pickStudents } from "~/models/board.server";
import { CSV_COLUMNS, csvRecord } from "~/models/progressCsv.server";
import { studioTimeZone } from "~/models/progress.server";
import { parseProgressQuery } from "~/models/progressQuery.server";

/**
 * GET /api/export/progress.csv?from=YYYY-MM-DD&to=YYYY-MM-DD[&student=ID…]
 * One row per student per week of the range up to this week (weeks without
 * takes included, weeks still to come left out), RFC 4180 quoting by
 * csv-stringify, UTF-8 without a byte-order mark. The body is streamed: the
 * header first, then a few students' rows at a time, each read from the database
 * as the stream is pulled (csv-stringify ends every record with the delimiter, so
 * the pieces join into the same bytes as one call over every row).
 */
export async function loader(args: Route.LoaderArgs) {
  const teacher = await requireTeacher(args, "api");
  const studioId = teacher.active.studioId;
  const parsed = parseProgressQuery(new URL(args.request.url), studioTimeZone(studioId), { requireDates: true });
  if (!parsed.ok) return Response.json({ error: parsed.error }, { status: 400 });
  const q = parsed.query;
  await requireStudentsOfTeacher(args, q.studentIds, "api");
  const batches = exportRowBatches(studioId, pickStudents(studioId, q.studentIds), q.fromWeek, q.toWeek);
  const encoder = new TextEncoder();
  const csv = (records: string[][]) => encoder.encode(stringify(records, { record_delimiter: "\r\n" }));
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(csv([CSV_COLUMNS]));
    },
    pull(controller) {
      // One batch per pull: the next is read only once the reader wants more.
      for (let next = batches.next(); ; next = batches.next()) {
        if (next.done) return controller.close();
        if (next.value.length) return controller.enqueue(csv(next.value.map(csvRecord)));
      }
    },
    cancel() {
      batches.return(undefined);
    },
  });
  return new Response(body, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="nearnote-progress-${q.from}-to-${q.to}.csv"`,
      "Cache-Control": "no-store",
    },
  });
}
