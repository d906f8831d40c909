import { and, eq, gt, sql } from "drizzle-orm";
import { LRUCache } from "lru-cache";
import { createCookie, redirect } from "react-router";
import { db, preparedQuery } from "~/db/client.server";
import { memberships, sessions, studios, users, type MembershipRole } from "~/db/schema";
import { env } from "~/server/env.server";

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
  sessionIds.clear();
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

/**
 * Cookie headers already read, with the session id their signature gave (or null): checking
 * the signature is the costly part of reading the cookie, and its answer for one header never
 * changes while the secret stays the same.
 */
const sessionIds = new LRUCache<string, { id: string | null }>({ max: 10_000 });

export async function readSessionId(request: Request): Promise<string | null> {
  const header = request.headers.get("Cookie");
  const known = header && header.length <= 4096 ? sessionIds.get(header) : undefined;
  if (known) return known.id;
  const value = await sessionCookie().parse(header);
  const id = typeof value === "string" ? value : null;
  if (header && header.length <= 4096) sessionIds.set(header, { id });
  return id;
}

const sessionRowQuery = preparedQuery((database) =>
  database
    .select({ session: sessions, user: users })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(and(eq(sessions.id, sql.placeholder("sessionId")), gt(sessions.expiresAt, sql.placeholder("now"))))
    .prepare(),
);

const activeRolesQuery = preparedQuery((database) =>
  database
    .select({ studioId: studios.id, studioName: studios.name, role: memberships.role })
    .from(memberships)
    .innerJoin(studios, eq(studios.id, memberships.studioId))
    .where(and(eq(memberships.userId, sql.placeholder("userId")), eq(memberships.status, "active")))
    .orderBy(memberships.createdAt)
    .prepare(),
);

/** Loads the signed-in person with their active studio memberships, or null. */
export async function getSessionUser(request: Request): Promise<SessionUser | null> {
  const sessionId = await readSessionId(request);
  if (!sessionId) return null;
  // expires_at holds milliseconds (timestamp_ms); a placeholder's value is bound as given.
  const row = sessionRowQuery().get({ sessionId, now: Date.now() });
  if (!row) return null;
  const roles = activeRolesQuery().all({ userId: row.user.id });
  const active = roles.find((r) => r.studioId === row.session.activeStudioId) ?? roles[0] ?? null;
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
  // Checked before the row is written, so a refused target never leaves a session behind.
  const target = safeRedirect(redirectTo);
  const session = db()
    .insert(sessions)
    .values({ userId, activeStudioId, expiresAt: new Date(Date.now() + SESSION_MS) })
    .returning()
    .get();
  const headers = new Headers(extraHeaders);
  headers.append("Set-Cookie", await sessionCookie().serialize(session.id));
  return redirect(target, { headers });
}

export async function destroyUserSession(request: Request, redirectTo = "/") {
  const sessionId = await readSessionId(request);
  if (sessionId) db().delete(sessions).where(eq(sessions.id, sessionId)).run();
  return redirect(redirectTo, {
    headers: { "Set-Cookie": await sessionCookie().serialize("", { maxAge: 0 }) },
  });
}

const REDIRECT_BASE = "http://nearnote.invalid";

/**
 * The one check for every redirect target a request names (`redirectTo`, `back`): only a
 * path on this site, else `fallback`. A reference starting with "//" names another host
 * (RFC 3986 section 4.2, network-path reference). Browsers follow the WHATWG URL Standard,
 * which also reads "\" as "/" and silently drops tabs and newlines, so "/\evil.example" and
 * "/<tab>/evil.example" lead away too; and a control character in a Location header is
 * refused by Node's Headers (a 500). So only printable ASCII without a backslash passes
 * (our own links are percent-encoded, RFC 3986 section 2.1), and the result must resolve
 * to our own origin.
 */
export function safeRedirect(to: FormDataEntryValue | string | null | undefined, fallback = "/home"): string {
  if (typeof to !== "string" || to.length > 2048) return fallback;
  if (!to.startsWith("/") || to.startsWith("//")) return fallback;
  if (!/^[\x21-\x7e]+$/.test(to) || to.includes("\\")) return fallback;
  let resolved: URL;
  try {
    resolved = new URL(to, REDIRECT_BASE);
  } catch {
    return fallback;
  }
  return resolved.origin === REDIRECT_BASE ? to : fallback;
}
