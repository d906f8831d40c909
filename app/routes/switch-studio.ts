import { redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/switch-studio";
import { deny, requireSameOrigin, requireUser } from "~/auth/access.server";
import { safeRedirect } from "~/auth/session.server";
import { switchActiveStudio } from "~/models/studios.server";
import { readForm } from "~/forms/forms.server";

const schema = z.object({ studioId: z.string().min(1), redirectTo: z.string().optional() });

export async function loader() {
  return redirect("/settings");
}

/** A resource route that changes data: it checks the origin itself. */
export async function action({ request, context }: Route.ActionArgs) {
  requireSameOrigin(request);
  const user = await requireUser({ request, context });
  const parsed = schema.safeParse(Object.fromEntries(await readForm(request)));
  if (!parsed.success) throw new Response("Choose a studio", { status: 400 });
  if (!switchActiveStudio(user.sessionId, user.id, parsed.data.studioId)) deny("page", "You are not in that studio.");
  return redirect(safeRedirect(parsed.data.redirectTo));
}
