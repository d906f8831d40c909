import { z } from "zod";
import type { Route } from "./+types/api.takes";
import {
  requireSameOrigin,
  requireStudent,
  requireStudentOfTeacher,
  requireUser,
  isTeacherRole,
} from "~/auth/access.server";
import { uploadOneTake } from "~/takes/takeUpload.server";
import { listTakesForStudent } from "~/models/takes.server";

const query = z.object({ student: z.string().min(1).max(64).optional() });

/** GET /api/takes: the signed-in student's takes; a teacher names a student of the studio with ?student=ID. */
export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireUser({ request, context }, "api");
  const parsed = query.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) return Response.json({ error: "Unknown query." }, { status: 400 });
  if (isTeacherRole(user.active?.role)) {
    if (!parsed.data.student) return Response.json({ error: "Name a student with ?student=ID." }, { status: 400 });
    const { user: teacher } = await requireStudentOfTeacher({ request, context }, parsed.data.student, "api");
    return Response.json({ takes: listTakesForStudent(parsed.data.student, { studioId: teacher.active.studioId }) });
  }
  const student = await requireStudent({ request, context }, "api");
  if (parsed.data.student && parsed.data.student !== student.id) {
    return Response.json({ error: "Students see only their own takes." }, { status: 403 });
  }
  return Response.json({ takes: listTakesForStudent(student.id, { studioId: student.active.studioId }) });
}

/** POST /api/takes: one MIDI file a request (multipart field `file`). */
export async function action({ request, context }: Route.ActionArgs) {
  if (request.method !== "POST") return Response.json({ error: "Use POST." }, { status: 405 });
  requireSameOrigin(request);
  const student = await requireStudent({ request, context }, "api");
  const result = await uploadOneTake(request, student);
  return Response.json(result.body, { status: result.status });
}
