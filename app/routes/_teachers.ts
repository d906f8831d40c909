// Layout: pages for teachers of the active studio (others get a 403).
import { teachersOnly } from "~/auth/access.server";
import type { Route } from "./+types/_teachers";

export const middleware: Route.MiddlewareFunction[] = [teachersOnly];
