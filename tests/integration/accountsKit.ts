// Helpers for the integration tests: Requests for the app's real handler (tests/support/app.ts),
// a cookie jar, the local mail catcher and a few fixtures.
import path from "node:path";
import bcrypt from "bcryptjs";
import { afterEach, beforeEach } from "vitest";
import { db } from "~/db/client.server";
import { exercises, memberships, studios, takes, users, type MembershipRole } from "~/db/schema";
import { resetEnvForTests } from "~/server/env.server";
import { readCaughtMail, startMailCatcher, type CaughtMail } from "~/mail/mailCatcher.server";
import { ask } from "../support/app";
import type { FreshApp } from "../support/setup";

export const ORIGIN = "http://127.0.0.1:3000";

/** A browser's cookies, enough for our signed cookies. */
export class CookieJar {
  private cookies = new Map<string, string>();
  take(headers: Headers) {
    for (const line of headers.getSetCookie()) {
      const [pair, ...attrs] = line.split(";");
      const eq = pair.indexOf("=");
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      const expired = attrs.some((a) => /max-age=0\b/i.test(a.trim()) || /expires=Thu, 01 Jan 1970/i.test(a.trim()));
      if (expired || value === "") this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    return this;
  }
  header() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }
  has(name: string) {
    return this.cookies.has(name);
  }
  get(name: string) {
    return this.cookies.get(name);
  }
}

export function get(pathAndQuery: string, jar?: CookieJar, headers: Record<string, string> = {}) {
  return new Request(ORIGIN + pathAndQuery, { headers: { ...headers, ...(jar ? { Cookie: jar.header() } : {}) } });
}

export function post(
  pathAndQuery: string,
  fields: Record<string, string>,
  jar?: CookieJar,
  headers: Record<string, string> = {},
) {
  return new Request(ORIGIN + pathAndQuery, {
    method: "POST",
    body: new URLSearchParams(fields),
    headers: { ...headers, ...(jar ? { Cookie: jar.header() } : {}) },
  });
}

/** Starts the SMTP catcher for each test and points the app's mailer at it. */
export function useMailCatcher(app: FreshApp) {
  const state = { dir: "", close: async () => {} };
  beforeEach(async () => {
    state.dir = path.join(app.storageDir, "mail");
    const catcher = await startMailCatcher({ dir: state.dir });
    state.close = catcher.close;
    process.env.SMTP_URL = catcher.url;
    process.env.MAIL_CATCHER_DIR = state.dir;
    resetEnvForTests();
  });
  afterEach(async () => {
    await state.close();
    delete process.env.SMTP_URL;
    delete process.env.MAIL_CATCHER_DIR;
    resetEnvForTests();
  });
  return {
    all: (): CaughtMail[] => readCaughtMail(state.dir),
    /** The newest message to this address; fails loudly if there is none. */
    latestTo(address: string): CaughtMail {
      const found = readCaughtMail(state.dir).find((m) => m.to.includes(address));
      if (!found) throw new Error(`No mail caught for ${address}`);
      return found;
    },
    get dir() {
      return state.dir;
    },
  };
}

/** The path and query of the first link to our app in a message. */
export function linkIn(mail: CaughtMail): string {
  const match = new RegExp(`${ORIGIN.replace(/[.]/g, "\\.")}(/\\S+)`).exec(mail.text);
  if (!match) throw new Error(`No link in: ${mail.text}`);
  return match[1];
}

export const PASSWORD = "correct-horse-battery";
let hashed: string | undefined;
/** One bcrypt hash shared by fixture users, so tests stay fast. */
export function fixturePasswordHash() {
  hashed ??= bcrypt.hashSync(PASSWORD, 10);
  return hashed;
}

export function makeUser(email: string, name = email.split("@")[0], verified = true) {
  return db()
    .insert(users)
    .values({ email, name, passwordHash: fixturePasswordHash(), emailVerifiedAt: verified ? new Date() : null })
    .returning()
    .get();
}

export function makeStudio(name: string) {
  return db().insert(studios).values({ name }).returning().get();
}

export function join(studioId: string, userId: string, role: MembershipRole) {
  db().insert(memberships).values({ studioId, userId, role }).run();
}

export function makeExercise(studioId: string, title = "Three-chord smoothing in D") {
  return db()
    .insert(exercises)
    .values({ studioId, title, keys: ["D"], progression: "I IV V I" })
    .returning()
    .get();
}

export function makeTakeRow(studentId: string, studioId: string, fileKey: string, originalName = "take.mid") {
  return db()
    .insert(takes)
    .values({
      studentId,
      studioId,
      fileKey,
      originalName,
      size: 10,
      contentHash: fileKey,
      recordedAt: new Date(),
      weekKey: "2026-W48",
    })
    .returning()
    .get();
}

/** Signs a fixture user in through the real /login page and returns their cookies. */
export async function signIn(email: string, password?: string): Promise<CookieJar>;
/** @deprecated The login module is not needed any more: `signIn(email, password?)`. */
export async function signIn(login: object, email: string, password?: string): Promise<CookieJar>;
export async function signIn(...args: [string, string?] | [object, string, string?]): Promise<CookieJar> {
  const [email, password = PASSWORD] = (typeof args[0] === "string" ? args : args.slice(1)) as [string, string?];
  const result = await ask(post("/login", { email, password, redirectTo: "/home" }));
  if (result.status !== 302) throw new Error(`sign-in of ${email} failed with ${result.status}`);
  return new CookieJar().take(result.headers);
}
