// Layout: pages for anyone signed in; signed-out visitors go to /login.
import { signedInOnly } from "~/auth/access.server";
import type { Route } from "./+types/_signedIn";

export const middleware: Route.MiddlewareFunction[] = [signedInOnly];
