// Layout: pages for students of the active studio (others get a 403).
import { studentsOnly } from "~/auth/access.server";
import type { Route } from "./+types/_students";

export const middleware: Route.MiddlewareFunction[] = [studentsOnly];
