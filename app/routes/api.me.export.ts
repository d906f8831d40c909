import type { Route } from "./+types/api.me.export";
import { requireUser } from "~/auth/access.server";
import { buildPersonalExport } from "~/models/personalData.server";

/** "Download my data": a ZIP of the person's takes and a JSON of everything else. */
export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireUser({ request, context }, "api");
  const zip = await buildPersonalExport(user.id);
  const day = new Date().toISOString().slice(0, 10);
  return new Response(new Uint8Array(zip), {
    headers: {
      "Content-Type": "application/zip",
      "Content-Disposition": `attachment; filename="nearnote-my-data-${day}.zip"`,
      "Cache-Control": "no-store",
    },
  });
}
