import { redirect } from "react-router";
import type { Route } from "./+types/logout";
import { requireSameOrigin } from "~/auth/access.server";
import { destroyUserSession } from "~/auth/session.server";

export async function loader() {
  return redirect("/");
}

// A resource route: React Router's origin check does not cover it, so check here.
export async function action({ request }: Route.ActionArgs) {
  requireSameOrigin(request);
  return destroyUserSession(request, "/");
}
