// Layout: pages for signed-out visitors; signed-in people go on to /home.
import { visitorsOnly } from "~/auth/access.server";
import type { Route } from "./+types/_visitors";

export const middleware: Route.MiddlewareFunction[] = [visitorsOnly];
