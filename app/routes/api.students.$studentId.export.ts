import type { Route } from "./+types/api.students.$studentId.export";
import { requireStudentOfTeacher } from "~/auth/access.server";
import { buildPersonalExport } from "~/models/personalData.server";

/** A teacher's copy of one student's takes in the active studio (removed students included). */
export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { user } = await requireStudentOfTeacher({ request, context }, params.studentId, "api");
  const zip = await buildPersonalExport(params.studentId, { studioId: user.active.studioId });
  const day = new Date().toISOString().slice(0, 10);
  return new Response(new Uint8Array(zip), {
    headers: {
      "Content-Type": "application/zip",
      "Content-Disposition": `attachment; filename="nearnote-student-${day}.zip"`,
      "Cache-Control": "no-store",
    },
  });
}
