import { redirect } from "react-router";
import type { Route } from "./+types/logout";
import { destroyUserSession } from "~/auth/session.server";

export async function loader() {
  return redirect("/");
}

export async function action({ request }: Route.ActionArgs) {
  return destroyUserSession(request, "/");
}
