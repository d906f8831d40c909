import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { getSessionUser } from "~/auth/session.server";
import { MAX_FAILURES_PER_EMAIL } from "~/auth/throttle.server";
import { db } from "~/db/client.server";
import { accountMailSends, memberships, pendingSignups, sessions, signInFailures, studios, users } from "~/db/schema";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import {
  CookieJar,
  get,
  join,
  linkIn,
  makeStudio,
  makeUser,
  PASSWORD,
  post,
  signIn,
  useMailCatcher,
} from "./accountsKit";

const app = useFreshApp();
const mail = useMailCatcher(app);

const teacherForm = {
  name: "Ines Marlowe",
  email: "Ines@Tidewater.example",
  password: "tidewater-keys",
  studioName: "Tidewater Keys",
};

describe("teacher sign-up and e-mail verification", () => {
  it("creates nothing until the mailed link is opened; the link creates the verified owner and studio and signs them in", async () => {
    const result = await ask(post("/signup", teacherForm));
    expect(result.status).toBe(200);
    expect(result.data).toEqual({ ok: true, email: "ines@tidewater.example" });
    expect(result.headers.getSetCookie()).toHaveLength(0);
    expect(db().select().from(users).all()).toHaveLength(0);
    // Only the pending sign-up is stored, with a bcrypt hash of the password and a hash of the link's token.
    const pending = db().select().from(pendingSignups).get()!;
    // bcrypt with cost 10: the "$2b$10$" prefix carries the cost (bcrypt's modular crypt format).
    expect(pending.passwordHash).toMatch(/^\$2[aby]\$1\d\$/);
    expect(await bcrypt.compare("tidewater-keys", pending.passwordHash)).toBe(true);

    // The mailed link creates the account (verified), the studio and the owner membership, and signs in, once.
    const message = mail.latestTo("ines@tidewater.example");
    expect(message.subject).toMatch(/confirm/i);
    const link = linkIn(message);
    expect(link).toMatch(/^\/verify\?token=/);
    expect(pending.tokenHash).not.toContain(new URL("http://x" + link).searchParams.get("token"));
    const opened = await ask(get(link));
    expect(opened.status).toBe(302);
    expect(opened.location).toBe("/home");
    const user = db().select().from(users).where(eq(users.email, "ines@tidewater.example")).get()!;
    expect(user.name).toBe("Ines Marlowe");
    expect(user.emailVerifiedAt).not.toBeNull();
    expect(db().select().from(memberships).where(eq(memberships.userId, user.id)).get()!.role).toBe("owner");
    const jar = new CookieJar().take(opened.headers);
    const me = await getSessionUser(get("/home", jar));
    expect(me).toMatchObject({
      email: "ines@tidewater.example",
      emailVerified: true,
      active: { studioName: "Tidewater Keys", role: "owner" },
    });
    expect((await ask(get(link))).status).toBe(410);
    expect(db().select().from(pendingSignups).all()).toHaveLength(0);

    const invited = await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    expect(invited.status).toBe(200);
    expect(mail.latestTo("dara@tidewater.example").subject).toContain("Tidewater Keys");
  });

  it("answers a taken address exactly as a new one, and mails its owner instead of saying so", async () => {
    const existing = makeUser("ines@tidewater.example", "Ines Marlowe");
    const taken = await ask<object>(post("/signup", { ...teacherForm, password: "someone-elses-guess" }));
    const fresh = await ask<object>(post("/signup", { ...teacherForm, email: "felix@tidewater.example" }));
    expect(taken.status).toBe(fresh.status);
    expect(taken.data).toEqual({ ok: true, email: "ines@tidewater.example" });
    expect(Object.keys(taken.data)).toEqual(Object.keys(fresh.data));
    expect([...taken.headers.keys()]).toEqual([...fresh.headers.keys()]);
    const notice = mail.latestTo("ines@tidewater.example");
    expect(notice.subject).toBe("You already have a Nearnote account");
    expect(notice.text).not.toMatch(/token=/);
    // Nothing changed for the existing account, and nothing new was created for it.
    expect(db().select().from(users).where(eq(users.email, existing.email)).get()!.passwordHash).toBe(
      existing.passwordHash,
    );
    expect(
      db()
        .select()
        .from(pendingSignups)
        .all()
        .map((p) => p.email),
    ).toEqual(["felix@tidewater.example"]);
    expect((await ask(post("/login", { email: existing.email, password: "someone-elses-guess" }))).status).toBe(401);
  });

  it("says an address is taken only when a sign-up link is opened: one link wins, a link for an address taken since says so", async () => {
    await ask(post("/signup", teacherForm));
    const first = linkIn(mail.latestTo("ines@tidewater.example"));
    db()
      .update(accountMailSends)
      .set({ sentAt: new Date(Date.now() - 2 * 60 * 1000) })
      .run();
    await ask(post("/signup", { ...teacherForm, studioName: "Tidewater Keys Evenings" }));
    const second = linkIn(mail.latestTo("ines@tidewater.example"));
    expect(second).not.toBe(first);
    expect((await ask(get(second))).status).toBe(302);
    expect((await ask(get(first))).status).toBe(410);
    expect(
      db()
        .select()
        .from(studios)
        .all()
        .map((st) => st.name),
    ).toEqual(["Tidewater Keys Evenings"]);
    // A sign-up still waiting when someone else (here an invitation) took the address says so when opened.
    await ask(post("/signup", { ...teacherForm, email: "dara@tidewater.example" }));
    const late = linkIn(mail.latestTo("dara@tidewater.example"));
    makeUser("dara@tidewater.example");
    const refused = await ask(get(late));
    expect(refused.status).toBe(409);
    expect(refused.data).toEqual({ state: "taken" });
  });

  it("keeps the typed values on a bad form, with an error beside each bad field", async () => {
    const bad = await ask<{ fieldErrors: Record<string, string>; values: Record<string, string> }>(
      post("/signup", { name: "", email: "not-an-address", password: "short", studioName: "" }),
    );
    expect(bad.status).toBe(400);
    const body = bad.data;
    expect(Object.keys(body.fieldErrors).sort()).toEqual(["email", "name", "password", "studioName"]);
    expect(body.values.email).toBe("not-an-address");
    expect(body.values).not.toHaveProperty("password");
  });
});

describe("sign-in and sign-out", () => {
  it("signs in with a redirect that sets an httpOnly, SameSite=Lax, 30-day cookie and a new session each time", async () => {
    const user = makeUser("dara@tidewater.example");
    const first = await ask(
      post("/login", { email: "DARA@tidewater.example", password: PASSWORD, redirectTo: "/settings" }),
    );
    expect(first.status).toBe(302);
    expect(first.location).toBe("/settings");
    const cookie = first.headers.getSetCookie().find((c) => c.startsWith("nearnote_session="))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).toMatch(/Max-Age=2592000/); // 30 days in seconds
    expect(cookie).not.toMatch(/Secure/i); // APP_URL is http in tests
    const second = await ask(post("/login", { email: "dara@tidewater.example", password: PASSWORD }));
    const ids = db()
      .select()
      .from(sessions)
      .where(eq(sessions.userId, user.id))
      .all()
      .map((s) => s.id);
    expect(new Set(ids).size).toBe(2);
    expect(second.headers.getSetCookie()[0]).not.toBe(cookie);
  });

  it("never redirects to another site after sign-in", async () => {
    makeUser("dara@tidewater.example");
    const result = await ask(
      post("/login", { email: "dara@tidewater.example", password: PASSWORD, redirectTo: "//evil.example/x" }),
    );
    expect(result.location).toBe("/home");
  });

  it("answers a wrong password and an unknown e-mail alike, without a cookie", async () => {
    makeUser("dara@tidewater.example");
    const wrong = await ask<{ formError: string }>(
      post("/login", { email: "dara@tidewater.example", password: "not-the-password" }),
    );
    const unknown = await ask<{ formError: string }>(
      post("/login", { email: "nobody@tidewater.example", password: "not-the-password" }),
    );
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.data.formError).toBe(unknown.data.formError);
    expect(wrong.headers.getSetCookie()).toHaveLength(0);
  });

  it("sends signed-in visitors of /login on to /home", async () => {
    makeUser("dara@tidewater.example");
    const jar = await signIn("dara@tidewater.example");
    expect((await ask(get("/login", jar))).location).toBe("/home");
  });

  it("signs out: the session row is gone and the old cookie no longer works", async () => {
    makeUser("dara@tidewater.example");
    const jar = await signIn("dara@tidewater.example");
    const stolen = jar.header();
    const out = await ask(post("/logout", {}, jar, { Origin: "http://127.0.0.1:3000" }));
    expect(out.status).toBe(302);
    jar.take(out.headers);
    expect(jar.has("nearnote_session")).toBe(false);
    expect(db().select().from(sessions).all()).toHaveLength(0);
    expect(await getSessionUser(new Request("http://127.0.0.1:3000/home", { headers: { Cookie: stolen } }))).toBeNull();
  });

  it("refuses a cross-site sign-out post", async () => {
    makeUser("dara@tidewater.example");
    const jar = await signIn("dara@tidewater.example");
    const result = await ask(
      post("/logout", {}, jar, { Origin: "https://evil.example", "Sec-Fetch-Site": "cross-site" }),
    );
    expect(result.status).toBe(403);
    expect(db().select().from(sessions).all()).toHaveLength(1);
  });
});

describe("sessions and verification links", () => {
  it("ignores a session whose row has expired", async () => {
    const user = makeUser("dara@tidewater.example");
    const jar = await signIn(user.email);
    expect(await getSessionUser(get("/home", jar))).not.toBeNull();
    db()
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .run();
    expect(await getSessionUser(get("/home", jar))).toBeNull();
  });

  it("sends a fresh verification link on request; the older one stops working", async () => {
    const user = makeUser("ines@tidewater.example", "Ines Marlowe", false);
    join(makeStudio("Tidewater Keys").id, user.id, "owner");
    const jar = await signIn(user.email);
    // Unverified (say, after changing the address): the studio cannot invite anyone.
    const refused = await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    expect(refused.status).toBe(403);
    expect((await ask(post("/verify", {}, jar))).location).toBe("/settings");
    const first = linkIn(mail.latestTo("ines@tidewater.example"));
    db()
      .update(accountMailSends)
      .set({ sentAt: new Date(Date.now() - 2 * 60 * 1000) })
      .run();
    const resent = await ask(post("/verify", {}, jar));
    expect(resent.location).toBe("/settings");
    const second = linkIn(mail.latestTo("ines@tidewater.example"));
    expect(second).not.toBe(first);
    expect((await ask(get(first))).status).toBe(410);
    expect((await ask(get(second))).status).toBe(302);
    expect((await getSessionUser(get("/home", jar)))?.emailVerified).toBe(true);
    expect((await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar))).status).toBe(
      200,
    );
  });
});

describe("throttling failed sign-ins", () => {
  const attempt = (password: string, address = "203.0.113.7") =>
    ask<{ formError?: string }>(
      post("/login", { email: "dara@tidewater.example", password }, undefined, { "X-Forwarded-For": address }),
    );

  it("answers 429 with when to retry after 5 failures in 15 minutes, even for the right password", async () => {
    makeUser("dara@tidewater.example");
    for (let i = 0; i < 5; i++) expect((await attempt("wrong-password")).status).toBe(401);
    const blocked = await attempt(PASSWORD);
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get("Retry-After"))).toBeGreaterThan(14 * 60);
    expect(blocked.data.formError).toMatch(/Try again in 15 minutes \(after \d\d:\d\d UTC\)/);
    // Another address is not blocked by these failures.
    expect((await attempt(PASSWORD, "198.51.100.4")).status).toBe(302);
  });

  it("caps failures for one e-mail across addresses, so a forged X-Forwarded-For does not help", async () => {
    makeUser("dara@tidewater.example");
    for (let i = 0; i < MAX_FAILURES_PER_EMAIL; i++)
      expect((await attempt("wrong-password", `192.0.2.${i}`)).status).toBe(401);
    expect((await attempt(PASSWORD, "192.0.2.200")).status).toBe(429);
  });

  it("lets people try again once the failures are older than 15 minutes, and a success clears them", async () => {
    makeUser("dara@tidewater.example");
    for (let i = 0; i < 5; i++) await attempt("wrong-password");
    db()
      .update(signInFailures)
      .set({ createdAt: new Date(Date.now() - 16 * 60 * 1000) })
      .run();
    expect((await attempt(PASSWORD)).status).toBe(302);
    for (let i = 0; i < 4; i++) await attempt("wrong-password");
    expect((await attempt(PASSWORD)).status).toBe(302);
    expect(db().select().from(signInFailures).all()).toHaveLength(0);
  });
});
