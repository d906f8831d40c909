import { isRouteErrorResponse } from "react-router";
import type { MembershipRole } from "~/db/schema";

/** The signed-in person as the navigation names them: nothing more than their own name, role and studio. */
export type Viewer = { name: string; role: MembershipRole | null; studioName: string | null };

/**
 * A 403 page a layout's middleware answers to a signed-in person it turns away. Middleware
 * refuses before any loader runs, the root loader included, so the refusal itself carries
 * the person for the navigation; it carries nothing of the page they were refused.
 */
export type Refusal = { message: string; viewer: Viewer };

function isRefusal(value: unknown): value is Refusal {
  if (!value || typeof value !== "object") return false;
  const { message, viewer } = value as Partial<Refusal>;
  return typeof message === "string" && !!viewer && typeof viewer === "object" && typeof viewer.name === "string";
}

/** The person a layout turned away, when the error is such a refusal. */
export function refusedViewer(error: unknown): Viewer | null {
  return isRouteErrorResponse(error) && isRefusal(error.data) ? error.data.viewer : null;
}

/** The message an error response was sent with (a plain text body, or a refusal's message). */
export function errorMessage(error: unknown): string | null {
  if (!isRouteErrorResponse(error)) return null;
  if (typeof error.data === "string") return error.data || null;
  return isRefusal(error.data) ? error.data.message : null;
}
