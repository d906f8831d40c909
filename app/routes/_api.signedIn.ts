// Layout: API routes for anyone signed in (401 JSON otherwise).
import { signedInApi } from "~/auth/access.server";
import type { Route } from "./+types/_api.signedIn";

export const middleware: Route.MiddlewareFunction[] = [signedInApi];
