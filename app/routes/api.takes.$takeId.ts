import type { Route } from "./+types/api.takes.$takeId";
import { requireSameOrigin, requireTakeAccess } from "~/auth/access.server";
import { deleteTake, getTakeView } from "~/models/takes.server";

/** GET /api/takes/:id: the take's own fields plus the analysis in the command line's --json shape. */
export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { take } = await requireTakeAccess({ request, context }, params.takeId, "api");
  const view = (await getTakeView(take.id))!;
  return Response.json({ ...view.take, analysis: view.analysis });
}

/** DELETE /api/takes/:id: only the student who played it. */
export async function action({ request, params, context }: Route.ActionArgs) {
  if (request.method !== "DELETE") return Response.json({ error: "Use DELETE." }, { status: 405 });
  requireSameOrigin(request);
  const { user, take } = await requireTakeAccess({ request, context }, params.takeId, "api");
  if (take.studentId !== user.id)
    return Response.json({ error: "Only the student who played a take can delete it." }, { status: 403 });
  await deleteTake(take.id);
  return new Response(null, { status: 204 });
}
