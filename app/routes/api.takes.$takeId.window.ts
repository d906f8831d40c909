import { z } from "zod";
import type { Route } from "./+types/api.takes.$takeId.window";
import { requireTakeAccess } from "~/auth/access.server";
import { windowOf, windowVersion } from "~/takes/takeWindows";
import { getTakeView } from "~/models/takes.server";

const query = z.object({ from: z.coerce.number().int().min(0).max(10_000_000).default(0) });

/**
 * GET /api/takes/:id/window?from=N: one window of the take's analysis (changes N onwards, the
 * chords they join and the notes in their stretch of time), for the take page as the student
 * scrolls or jumps. The same access rule as the page; the browser keeps the answer while the
 * analysis and the recording are unchanged (the page asks with the version in the URL, and the
 * ETag answers a revalidation with 304).
 */
export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { take } = await requireTakeAccess({ request, context }, params.takeId, "api");
  const url = new URL(request.url);
  const parsed = query.safeParse({ from: url.searchParams.get("from") ?? undefined });
  if (!parsed.success) return Response.json({ error: "from must be a change number (0 or more)." }, { status: 400 });
  if (take.status !== "analysed") return Response.json({ error: "This take has no analysis yet." }, { status: 409 });
  const etag = `"w${parsed.data.from}-${windowVersion(take)}"`;
  const headers = { "Cache-Control": "private, max-age=86400", ETag: etag, Vary: "Cookie" };
  if (request.headers.get("If-None-Match") === etag) return new Response(null, { status: 304, headers });
  const view = await getTakeView(take.id);
  if (!view?.analysis) return Response.json({ error: "This take has no analysis yet." }, { status: 409 });
  return Response.json(windowOf(view.analysis, view.notes, parsed.data.from), { headers });
}
