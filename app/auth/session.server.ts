import { and, eq, gt } from "drizzle-orm";
import { createCookie, redirect } from "react-router";
import { db } from "~/db/client.server";
import { memberships, sessions, studios, users, type MembershipRole } from "~/db/schema";
import { env } from "~/lib/env.server";

export const SESSION_DAYS = 30;
const SESSION_MS = SESSION_DAYS * 24 * 60 * 60 * 1000;

let cookie: ReturnType<typeof createCookie> | undefined;

/** The signed cookie that carries only the id of a row in `sessions`. */
export function sessionCookie() {
  cookie ??= createCookie("nearnote_session", {
    httpOnly: true,
    sameSite: "lax",
    secure: env().secureCookies,
    path: "/",
    maxAge: SESSION_MS / 1000,
    secrets: [env().sessionSecret],
  });
  return cookie;
}

export function resetSessionCookieForTests() {
  cookie = undefined;
}

export type StudioRole = { studioId: string; studioName: string; role: MembershipRole };

export type SessionUser = {
  sessionId: string;
  id: string;
  name: string;
  email: string;
  emailVerified: boolean;
  studios: StudioRole[];
  /** The studio the person is working in (first active membership unless switched). */
  active: StudioRole | null;
};

export async function readSessionId(request: Request): Promise<string | null> {
  const value = await sessionCookie().parse(request.headers.get("Cookie"));
  return typeof value === "string" ? value : null;
}

/** Loads the signed-in person with their active studio memberships, or null. */
export async function getSessionUser(request: Request): Promise<SessionUser | null> {
  const sessionId = await readSessionId(request);
  if (!sessionId) return null;
  const row = db()
    .select({ session: sessions, user: users })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(and(eq(sessions.id, sessionId), gt(sessions.expiresAt, new Date())))
    .get();
  if (!row) return null;
  const roles = db()
    .select({ studioId: studios.id, studioName: studios.name, role: memberships.role })
    .from(memberships)
    .innerJoin(studios, eq(studios.id, memberships.studioId))
    .where(and(eq(memberships.userId, row.user.id), eq(memberships.status, "active")))
    .orderBy(memberships.createdAt)
    .all();
  const active =
    roles.find((r) => r.studioId === row.session.activeStudioId) ?? roles[0] ?? null;
  return {
    sessionId,
    id: row.user.id,
    name: row.user.name,
    email: row.user.email,
    emailVerified: row.user.emailVerifiedAt !== null,
    studios: roles,
    active,
  };
}

/** Starts a new session row (a fresh id on every sign-in) and redirects with its cookie. */
export async function createUserSession(
  userId: string,
  redirectTo: string,
  extraHeaders?: HeadersInit,
  activeStudioId?: string,
) {
  const session = db()
    .insert(sessions)
    .values({ userId, activeStudioId, expiresAt: new Date(Date.now() + SESSION_MS) })
    .returning()
    .get();
  const headers = new Headers(extraHeaders);
  headers.append("Set-Cookie", await sessionCookie().serialize(session.id));
  return redirect(safeRedirect(redirectTo), { headers });
}

export async function destroyUserSession(request: Request, redirectTo = "/") {
  const sessionId = await readSessionId(request);
  if (sessionId) db().delete(sessions).where(eq(sessions.id, sessionId)).run();
  return redirect(redirectTo, {
    headers: { "Set-Cookie": await sessionCookie().serialize("", { maxAge: 0 }) },
  });
}

/** Only same-site paths: never let `redirectTo` send someone to another host. */
export function safeRedirect(to: FormDataEntryValue | string | null | undefined, fallback = "/home") {
  if (typeof to !== "string" || !to.startsWith("/") || to.startsWith("//") || to.startsWith("/\\")) {
    return fallback;
  }
  return to;
}
