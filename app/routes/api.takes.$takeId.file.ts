import type { Route } from "./+types/api.takes.$takeId.file";
import { requireTakeAccess } from "~/auth/access.server";
import { readTakeFile } from "~/takes/takeFiles.server";

/** GET /api/takes/:id/file: the original upload, for the student and their teachers. */
export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { take } = await requireTakeAccess({ request, context }, params.takeId, "api");
  const bytes = await readTakeFile(take.fileKey);
  if (!bytes) return Response.json({ error: "The file of this take is missing." }, { status: 404 });
  const ascii = take.originalName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return new Response(new Uint8Array(bytes), {
    headers: {
      "Content-Type": "audio/midi",
      "Content-Length": String(bytes.length),
      "Content-Disposition": `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(take.originalName)}`,
      "Cache-Control": "private, no-store",
    },
  });
}
