import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { getSessionUser } from "~/auth/session.server";
import { MAX_FAILURES_PER_EMAIL } from "~/auth/throttle.server";
import { db } from "~/db/client.server";
import { memberships, sessions, signInFailures, users } from "~/db/schema";
import * as login from "~/routes/login";
import * as logout from "~/routes/logout";
import * as signup from "~/routes/signup";
import * as students from "~/routes/students";
import * as verify from "~/routes/verify";
import { useFreshApp } from "../support/setup";
import { call, CookieJar, get, linkIn, makeUser, PASSWORD, post, signIn, useMailCatcher } from "./accountsKit";

const app = useFreshApp();
const mail = useMailCatcher(app);

const teacherForm = { name: "Ines Marlowe", email: "Ines@Tidewater.example", password: "tidewater-keys", studioName: "Tidewater Keys" };

describe("teacher sign-up and e-mail verification", () => {
  it("creates the teacher unverified, owner of the studio, signs them in and mails a link", async () => {
    const result = await call(signup.action, post("/signup", teacherForm));
    expect(result.status).toBe(302);
    expect(result.location).toBe("/home");
    const user = db().select().from(users).where(eq(users.email, "ines@tidewater.example")).get()!;
    expect(user.name).toBe("Ines Marlowe");
    expect(user.emailVerifiedAt).toBeNull();
    // bcrypt with cost 10: the "$2b$10$" prefix carries the cost (bcrypt's modular crypt format).
    expect(user.passwordHash).toMatch(/^\$2[aby]\$1\d\$/);
    expect(await bcrypt.compare("tidewater-keys", user.passwordHash)).toBe(true);
    const membership = db().select().from(memberships).where(eq(memberships.userId, user.id)).get()!;
    expect(membership.role).toBe("owner");

    const jar = new CookieJar().take(result.headers);
    const me = await getSessionUser(get("/home", jar));
    expect(me?.email).toBe("ines@tidewater.example");
    expect(me?.emailVerified).toBe(false);

    // Unverified: the studio cannot invite anyone yet.
    const refused = await call(students.action, post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    expect(refused.status).toBe(403);
    expect(mail.all().filter((m) => m.to.includes("dara@tidewater.example"))).toHaveLength(0);

    // The mailed link verifies the address, once.
    const message = mail.latestTo("ines@tidewater.example");
    expect(message.subject).toMatch(/confirm/i);
    const link = linkIn(message);
    expect(link).toMatch(/^\/verify\?token=/);
    const opened = await call(verify.loader, get(link));
    expect(opened.status).toBe(302);
    expect(opened.location).toBe("/home");
    expect((await getSessionUser(get("/home", jar)))?.emailVerified).toBe(true);
    expect((await call(verify.loader, get(link))).status).toBe(410);

    const invited = await call(students.action, post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    expect(invited.status).toBe(200);
    expect(mail.latestTo("dara@tidewater.example").subject).toContain("Tidewater Keys");
  });

  it("refuses a taken e-mail and keeps the typed values, with an error beside each bad field", async () => {
    await call(signup.action, post("/signup", teacherForm));
    const again = await call(signup.action, post("/signup", { ...teacherForm, email: "ines@tidewater.example" }));
    expect(again.status).toBe(400);
    expect(again.data).toMatchObject({ errors: { email: [expect.stringMatching(/already exists/)] }, values: { name: "Ines Marlowe" } });
    const bad = await call(signup.action, post("/signup", { name: "", email: "not-an-address", password: "short", studioName: "" }));
    expect(bad.status).toBe(400);
    const body = bad.data as { errors: Record<string, string[]>; values: Record<string, string> };
    expect(Object.keys(body.errors).sort()).toEqual(["email", "name", "password", "studioName"]);
    expect(body.values.email).toBe("not-an-address");
    expect(body.values).not.toHaveProperty("password");
  });
});

describe("sign-in and sign-out", () => {
  it("signs in with a redirect that sets an httpOnly, SameSite=Lax, 30-day cookie and a new session each time", async () => {
    const user = makeUser("dara@tidewater.example");
    const first = await call(login.action, post("/login", { email: "DARA@tidewater.example", password: PASSWORD, redirectTo: "/settings" }));
    expect(first.status).toBe(302);
    expect(first.location).toBe("/settings");
    const cookie = first.headers.getSetCookie().find((c) => c.startsWith("nearnote_session="))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).toMatch(/Max-Age=2592000/); // 30 days in seconds
    expect(cookie).not.toMatch(/Secure/i); // APP_URL is http in tests
    const second = await call(login.action, post("/login", { email: "dara@tidewater.example", password: PASSWORD }));
    const ids = db().select().from(sessions).where(eq(sessions.userId, user.id)).all().map((s) => s.id);
    expect(new Set(ids).size).toBe(2);
    expect(second.headers.getSetCookie()[0]).not.toBe(cookie);
  });

  it("never redirects to another site after sign-in", async () => {
    makeUser("dara@tidewater.example");
    const result = await call(login.action, post("/login", { email: "dara@tidewater.example", password: PASSWORD, redirectTo: "//evil.example/x" }));
    expect(result.location).toBe("/home");
  });

  it("answers a wrong password and an unknown e-mail alike, without a cookie", async () => {
    makeUser("dara@tidewater.example");
    const wrong = await call(login.action, post("/login", { email: "dara@tidewater.example", password: "not-the-password" }));
    const unknown = await call(login.action, post("/login", { email: "nobody@tidewater.example", password: "not-the-password" }));
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect((wrong.data as { formError: string }).formError).toBe((unknown.data as { formError: string }).formError);
    expect(wrong.headers.getSetCookie()).toHaveLength(0);
  });

  it("sends signed-in visitors of /login on to /home", async () => {
    makeUser("dara@tidewater.example");
    const jar = await signIn(login, "dara@tidewater.example");
    expect((await call(login.loader, get("/login", jar))).location).toBe("/home");
  });

  it("signs out: the session row is gone and the old cookie no longer works", async () => {
    makeUser("dara@tidewater.example");
    const jar = await signIn(login, "dara@tidewater.example");
    const stolen = jar.header();
    const out = await call(logout.action, post("/logout", {}, jar, { Origin: "http://127.0.0.1:3000" }));
    expect(out.status).toBe(302);
    jar.take(out.headers);
    expect(jar.has("nearnote_session")).toBe(false);
    expect(db().select().from(sessions).all()).toHaveLength(0);
    expect(await getSessionUser(new Request("http://127.0.0.1:3000/home", { headers: { Cookie: stolen } }))).toBeNull();
  });

  it("refuses a cross-site sign-out post", async () => {
    makeUser("dara@tidewater.example");
    const jar = await signIn(login, "dara@tidewater.example");
    const result = await call(logout.action, post("/logout", {}, jar, { Origin: "https://evil.example", "Sec-Fetch-Site": "cross-site" }));
    expect(result.status).toBe(403);
    expect(db().select().from(sessions).all()).toHaveLength(1);
  });
});

describe("sessions and verification links", () => {
  it("ignores a session whose row has expired", async () => {
    const user = makeUser("dara@tidewater.example");
    const jar = await signIn(login, user.email);
    expect(await getSessionUser(get("/home", jar))).not.toBeNull();
    db().update(sessions).set({ expiresAt: new Date(Date.now() - 1000) }).run();
    expect(await getSessionUser(get("/home", jar))).toBeNull();
  });

  it("sends a fresh verification link on request; the older one stops working", async () => {
    await call(signup.action, post("/signup", teacherForm));
    const jar = new CookieJar().take((await call(login.action, post("/login", { email: teacherForm.email, password: teacherForm.password }))).headers);
    const first = linkIn(mail.latestTo("ines@tidewater.example"));
    const resent = await call(verify.action, post("/verify", {}, jar));
    expect(resent.location).toBe("/settings");
    const second = linkIn(mail.latestTo("ines@tidewater.example"));
    expect(second).not.toBe(first);
    expect((await call(verify.loader, get(first))).status).toBe(410);
    expect((await call(verify.loader, get(second))).status).toBe(302);
    expect((await getSessionUser(get("/home", jar)))?.emailVerified).toBe(true);
  });
});

describe("throttling failed sign-ins", () => {
  const attempt = (password: string, address = "203.0.113.7") =>
    call(login.action, post("/login", { email: "dara@tidewater.example", password }, undefined, { "X-Forwarded-For": address }));

  it("answers 429 with when to retry after 5 failures in 15 minutes, even for the right password", async () => {
    makeUser("dara@tidewater.example");
    for (let i = 0; i < 5; i++) expect((await attempt("wrong-password")).status).toBe(401);
    const blocked = await attempt(PASSWORD);
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get("Retry-After"))).toBeGreaterThan(14 * 60);
    expect((blocked.data as { formError: string }).formError).toMatch(/Try again in 15 minutes \(after \d\d:\d\d UTC\)/);
    // Another address is not blocked by these failures.
    expect((await attempt(PASSWORD, "198.51.100.4")).status).toBe(302);
  });

  it("caps failures for one e-mail across addresses, so a forged X-Forwarded-For does not help", async () => {
    makeUser("dara@tidewater.example");
    for (let i = 0; i < MAX_FAILURES_PER_EMAIL; i++) expect((await attempt("wrong-password", `192.0.2.${i}`)).status).toBe(401);
    expect((await attempt(PASSWORD, "192.0.2.200")).status).toBe(429);
  });

  it("lets people try again once the failures are older than 15 minutes, and a success clears them", async () => {
    makeUser("dara@tidewater.example");
    for (let i = 0; i < 5; i++) await attempt("wrong-password");
    db().update(signInFailures).set({ createdAt: new Date(Date.now() - 16 * 60 * 1000) }).run();
    expect((await attempt(PASSWORD)).status).toBe(302);
    for (let i = 0; i < 4; i++) await attempt("wrong-password");
    expect((await attempt(PASSWORD)).status).toBe(302);
    expect(db().select().from(signInFailures).all()).toHaveLength(0);
  });
});
