import type { Route } from "./+types/api.progress";
import { requireStudentsOfTeacher, requireTeacher } from "~/auth/access.server";
import { chartData, pickStudents } from "~/models/board.server";
import { studioTimeZone } from "~/models/progress.server";
import { parseProgressQuery } from "~/models/progressQuery.server";

/**
 * GET /api/progress?metric=score&student=ID…&from=YYYY-MM-DD&to=YYYY-MM-DD
 * The board's chart data: one series per student, one value per ISO week of the
 * studio's calendar. Teachers of the studio only; every named student must be theirs.
 */
export async function loader({ request, context }: Route.LoaderArgs) {
  const teacher = await requireTeacher({ request, context }, "api");
  const studioId = teacher.active.studioId;
  const parsed = parseProgressQuery(new URL(request.url), studioTimeZone(studioId));
  if (!parsed.ok) return Response.json({ error: parsed.error }, { status: 400 });
  const q = parsed.query;
  await requireStudentsOfTeacher({ request, context }, q.studentIds, "api");
  const data = chartData(studioId, q.metric, pickStudents(studioId, q.studentIds), q.fromWeek, q.toWeek);
  return Response.json({ ...data, from: q.from, to: q.to }, { headers: { "Cache-Control": "no-store" } });
}
