// Layout: API routes for teachers of the active studio (401 / 403 JSON otherwise).
import { teachersApi } from "~/auth/access.server";
import type { Route } from "./+types/_api.teachers";

export const middleware: Route.MiddlewareFunction[] = [teachersApi];
