import { redirect } from "react-router";
import { getSessionUser, type SessionUser } from "./session.server";

/** Pages: a signed-out visitor is sent to sign in and brought back afterwards. */
export async function requireUser(request: Request): Promise<SessionUser> {
  const user = await getSessionUser(request);
  if (!user) {
    const url = new URL(request.url);
    throw redirect(`/login?redirectTo=${encodeURIComponent(url.pathname + url.search)}`);
  }
  return user;
}
