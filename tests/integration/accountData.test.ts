import { existsSync, readdirSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { strFromU8, unzipSync } from "fflate";
import { describe, expect, it } from "vitest";
import { getSessionUser, resetSessionCookieForTests } from "~/auth/session.server";
import { db } from "~/db/client.server";
import {
  accountMailSends,
  comments,
  invitations,
  memberships,
  progressReports,
  sessions,
  studios,
  takes,
  userTokens,
  users,
} from "~/db/schema";
import { resetEnvForTests } from "~/server/env.server";
import { takeStorage as takeFileStorage } from "~/takes/takeFiles.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import {
  get,
  join,
  linkIn,
  makeStudio,
  makeTakeRow,
  makeUser,
  PASSWORD,
  post,
  signIn,
  useMailCatcher,
} from "./accountsKit";

const app = useFreshApp();
const mail = useMailCatcher(app);

// The smallest valid Standard MIDI File: an MThd header (format 0, one track,
// 96 ticks per quarter) and an MTrk holding only End of Track (FF 2F 00). Source: SMF 1.0 (MMA RP-001).
const MIDI = new Uint8Array([
  0x4d, 0x54, 0x68, 0x64, 0, 0, 0, 6, 0, 0, 0, 1, 0, 0x60, 0x4d, 0x54, 0x72, 0x6b, 0, 0, 0, 4, 0, 0xff, 0x2f, 0,
]);

async function storeTake(studentId: string, studioId: string, name: string) {
  const key = `${studentId}-${name}`;
  await takeFileStorage().set(key, new File([MIDI], name, { type: "audio/midi" }));
  return makeTakeRow(studentId, studioId, key, name);
}

function takeFilesOnDisk(): string[] {
  const dir = path.join(app.storageDir, "takes");
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => e.name);
}

describe("password reset", () => {
  it("answers the same whether or not the address exists, and mails only a real account", async () => {
    makeUser("dara@tidewater.example");
    const known = await ask<object>(post("/forgot-password", { email: "dara@tidewater.example" }));
    const unknown = await ask<object>(post("/forgot-password", { email: "nobody@tidewater.example" }));
    expect(known.status).toBe(unknown.status);
    expect(Object.keys(known.data)).toEqual(Object.keys(unknown.data));
    expect(mail.all().map((m) => m.to[0])).toEqual(["dara@tidewater.example"]);
  });

  it("sets a new password once, ends every session, and the link expires after an hour", async () => {
    const user = makeUser("dara@tidewater.example");
    const oldJar = await signIn(user.email);
    await ask(post("/forgot-password", { email: "dara@tidewater.example" }));
    const link = linkIn(mail.latestTo("dara@tidewater.example"));
    expect(link).toMatch(/^\/reset-password\?token=/);
    const token = new URL("http://x" + link).searchParams.get("token")!;
    const row = db().select().from(userTokens).where(eq(userTokens.userId, user.id)).get()!;
    expect(row.tokenHash).not.toContain(token);
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBe(60 * 60 * 1000);

    expect((await ask(get(link))).data).toMatchObject({ valid: true });
    const done = await ask(
      post("/reset-password", { token, password: "a-brand-new-password", confirm: "a-brand-new-password" }),
    );
    expect(done.status).toBe(302);
    expect(done.location).toBe("/login");
    expect(await getSessionUser(get("/home", oldJar))).toBeNull();
    expect(db().select().from(sessions).all()).toHaveLength(0);
    expect((await ask(post("/login", { email: user.email, password: PASSWORD }))).status).toBe(401);
    expect((await ask(post("/login", { email: user.email, password: "a-brand-new-password" }))).status).toBe(302);
    const again = await ask(
      post("/reset-password", { token, password: "yet-another-password", confirm: "yet-another-password" }),
    );
    expect(again.status).toBe(410);
    expect((await ask(get(link))).status).toBe(410);

    // Asking again within a minute answers the same but sends nothing more.
    db()
      .update(accountMailSends)
      .set({ sentAt: new Date(Date.now() - 2 * 60 * 1000) })
      .run();
    await ask(post("/forgot-password", { email: "dara@tidewater.example" }));
    const sentBefore = mail.all().length;
    expect((await ask(post("/forgot-password", { email: "dara@tidewater.example" }))).status).toBe(200);
    expect(mail.all()).toHaveLength(sentBefore);
    const late = new URL("http://x" + linkIn(mail.latestTo("dara@tidewater.example"))).searchParams.get("token")!;
    db()
      .update(userTokens)
      .set({ expiresAt: new Date(Date.now() - 1) })
      .where(eq(userTokens.userId, user.id))
      .run();
    expect(
      (
        await ask(
          post("/reset-password", { token: late, password: "yet-another-password", confirm: "yet-another-password" }),
        )
      ).status,
    ).toBe(410);
  });
});

describe("account settings", () => {
  it("changes the name, the mail preferences, and the e-mail only with the password (then unverified)", async () => {
    const user = makeUser("dara@tidewater.example", "Dara");
    const jar = await signIn(user.email);
    expect((await ask(post("/settings", { intent: "profile", name: "Dara Okafor" }, jar))).status).toBe(200);
    await ask(post("/settings", { intent: "prefs", mailOnFeedback: "on" }, jar));
    const noPassword = await ask(
      post("/settings", { intent: "email", email: "dara.o@tidewater.example", currentPassword: "wrong" }, jar),
    );
    expect(noPassword.status).toBe(400);
    expect(noPassword.data).toMatchObject({
      fieldErrors: { currentPassword: expect.any(String) },
      values: { email: "dara.o@tidewater.example" },
    });
    const changed = await ask(
      post("/settings", { intent: "email", email: "dara.o@tidewater.example", currentPassword: PASSWORD }, jar),
    );
    expect(changed.status).toBe(200);
    const row = db().select().from(users).where(eq(users.id, user.id)).get()!;
    expect(row).toMatchObject({
      name: "Dara Okafor",
      email: "dara.o@tidewater.example",
      mailOnFeedback: true,
      mailDigest: false,
      emailVerifiedAt: null,
    });
    expect(mail.latestTo("dara.o@tidewater.example").subject).toMatch(/confirm/i);
  });

  it("changes the password: other sessions end, this device gets a new session", async () => {
    const user = makeUser("dara@tidewater.example");
    const laptop = await signIn(user.email);
    const phone = await signIn(user.email);
    const mismatch = await ask(
      post(
        "/settings",
        { intent: "password", currentPassword: PASSWORD, password: "a-brand-new-password", confirm: "nope" },
        laptop,
      ),
    );
    expect(mismatch.status).toBe(400);
    const result = await ask(
      post(
        "/settings",
        {
          intent: "password",
          currentPassword: PASSWORD,
          password: "a-brand-new-password",
          confirm: "a-brand-new-password",
        },
        laptop,
      ),
    );
    expect(result.status).toBe(302);
    expect(await getSessionUser(get("/home", phone))).toBeNull();
    expect(await getSessionUser(get("/home", laptop))).toBeNull();
    laptop.take(result.headers);
    expect((await getSessionUser(get("/home", laptop)))?.id).toBe(user.id);
    expect(db().select().from(sessions).all()).toHaveLength(1);
  });

  it("marks the cookie Secure when APP_URL is https", async () => {
    process.env.APP_URL = "https://nearnote.example";
    resetEnvForTests();
    resetSessionCookieForTests();
    makeUser("dara@tidewater.example");
    const result = await ask(post("/login", { email: "dara@tidewater.example", password: PASSWORD }));
    expect(result.headers.getSetCookie().find((c) => c.startsWith("nearnote_session="))).toMatch(/; Secure/);
  });
});

describe("download my data", () => {
  it("gives a ZIP of the person's MIDI takes and a JSON of everything else, never the password hash", async () => {
    const studio = makeStudio("Tidewater Keys");
    const dara = makeUser("dara@tidewater.example", "Dara Okafor");
    const felix = makeUser("felix@tidewater.example", "Felix Brandt");
    join(studio.id, dara.id, "student");
    join(studio.id, felix.id, "student");
    const monday = await storeTake(dara.id, studio.id, "monday.mid");
    await storeTake(dara.id, studio.id, "tuesday.mid");
    await storeTake(felix.id, studio.id, "felix.mid");
    const ines = makeUser("ines@tidewater.example", "Ines Marlowe");
    db()
      .insert(comments)
      .values({ takeId: monday.id, authorId: ines.id, changeIdx: 2, body: "Keep the top note on A here." })
      .run();
    db()
      .insert(progressReports)
      .values({
        studioId: studio.id,
        studentId: dara.id,
        fromDate: "2026-11-01",
        toDate: "2026-11-30",
        summary: "Smoother changes this month.",
      })
      .run();
    const jar = await signIn(dara.email);
    const response = await ask<Uint8Array>(get("/api/me/export", jar));
    expect(response.status).toBe(200);
    expect(response.headers.get("content-type")).toBe("application/zip");
    expect(response.headers.get("content-disposition")).toMatch(
      /attachment; filename="nearnote-my-data-\d{4}-\d\d-\d\d\.zip"/,
    );
    const files = unzipSync(response.data);
    expect(Object.keys(files).sort()).toEqual(["nearnote-data.json", "takes/001-monday.mid", "takes/002-tuesday.mid"]);
    expect(files["takes/001-monday.mid"]).toEqual(MIDI);
    const json = strFromU8(files["nearnote-data.json"]);
    const doc = JSON.parse(json);
    expect(doc.person).toMatchObject({ name: "Dara Okafor", email: "dara@tidewater.example" });
    expect(doc.studios).toEqual([
      expect.objectContaining({ studio: "Tidewater Keys", role: "student", status: "active" }),
    ]);
    expect(doc.takes.map((t: { originalName: string }) => t.originalName)).toEqual(["monday.mid", "tuesday.mid"]);
    expect(doc.takes[0].file).toBe("takes/001-monday.mid");
    expect(doc.takes[0].comments).toEqual([
      expect.objectContaining({ author: "Ines Marlowe", changeIdx: 2, body: "Keep the top note on A here." }),
    ]);
    expect(doc.progressReports).toEqual([
      expect.objectContaining({ studio: "Tidewater Keys", summary: "Smoother changes this month." }),
    ]);
    expect(json).not.toContain("$2");
    expect(json).not.toContain("felix");
  });

  it("is 401 JSON when signed out", async () => {
    const response = await ask(get("/api/me/export"));
    expect(response.status).toBe(401);
    expect(response.data).toEqual({ error: expect.any(String) });
  });
});

describe("removing a student and deleting data", () => {
  async function setup() {
    const studio = makeStudio("Tidewater Keys");
    const ines = makeUser("ines@tidewater.example", "Ines Marlowe");
    const dara = makeUser("dara@tidewater.example", "Dara Okafor");
    join(studio.id, ines.id, "owner");
    join(studio.id, dara.id, "student");
    const take = await storeTake(dara.id, studio.id, "monday.mid");
    return { studio, ines, dara, take, jar: await signIn(ines.email) };
  }

  it("removes a student: takes stay, membership inactive, still exportable by the teacher", async () => {
    const { dara, take, jar } = await setup();
    expect((await ask(post("/students", { intent: "remove", studentId: dara.id }, jar))).status).toBe(200);
    expect(db().select().from(memberships).where(eq(memberships.userId, dara.id)).get()).toMatchObject({
      status: "removed",
    });
    expect(db().select().from(takes).where(eq(takes.id, take.id)).get()).toBeDefined();
    const roster = (
      await ask<{
        students: { userId: string; status: string; takeCount: number }[];
      }>(get("/students", jar))
    ).data;
    expect(roster.students).toEqual([expect.objectContaining({ userId: dara.id, status: "removed", takeCount: 1 })]);
    const zip = await ask<Uint8Array>(get(`/api/students/${dara.id}/export`, jar));
    expect(zip.status).toBe(200);
    const files = unzipSync(zip.data);
    expect(Object.keys(files)).toContain("takes/001-monday.mid");
    // The removed student no longer has the studio, but can still sign in and take their data.
    const daraJar = await signIn(dara.email);
    expect((await getSessionUser(get("/home", daraJar)))?.active).toBeNull();
    expect((await ask(get("/api/me/export", daraJar))).status).toBe(200);
  });

  it("deletes a student's data for good only when confirmed: takes, files, and the account when in no other studio", async () => {
    const { dara, jar } = await setup();
    expect(takeFilesOnDisk().length).toBeGreaterThan(0);
    const unconfirmed = await ask(post("/students", { intent: "delete-data", studentId: dara.id }, jar));
    expect(unconfirmed.status).toBe(400);
    expect(db().select().from(takes).all()).toHaveLength(1);
    const done = await ask(post("/students", { intent: "delete-data", studentId: dara.id, confirm: "yes" }, jar));
    expect(done.status).toBe(200);
    expect(db().select().from(takes).all()).toHaveLength(0);
    expect(takeFilesOnDisk()).toEqual([]);
    expect(await takeFileStorage().has(`${dara.id}-monday.mid`)).toBe(false);
    expect(db().select().from(users).where(eq(users.id, dara.id)).get()).toBeUndefined();
  });

  it("refuses to remove or delete someone who is not a student of this studio", async () => {
    const { ines, jar } = await setup();
    const other = makeStudio("Harbour Lights");
    const stranger = makeUser("owen@harbour.example");
    join(other.id, stranger.id, "student");
    expect(
      (await ask(post("/students", { intent: "delete-data", studentId: stranger.id, confirm: "yes" }, jar))).status,
    ).toBe(403);
    expect((await ask(post("/students", { intent: "remove", studentId: ines.id }, jar))).status).toBe(403);
    expect(db().select().from(users).where(eq(users.id, stranger.id)).get()).toBeDefined();
  });
});

describe("deleting one's own account", () => {
  it("removes the person's takes, files, sessions, memberships and personal data", async () => {
    const studio = makeStudio("Tidewater Keys");
    const dara = makeUser("dara@tidewater.example", "Dara Okafor");
    join(studio.id, dara.id, "student");
    await storeTake(dara.id, studio.id, "monday.mid");
    db()
      .insert(invitations)
      .values({ studioId: studio.id, email: dara.email, role: "student", tokenHash: "h", expiresAt: new Date() })
      .run();
    const jar = await signIn(dara.email);
    expect(takeFilesOnDisk().length).toBeGreaterThan(0);
    await ask(post("/forgot-password", { email: dara.email }));
    await ask(post("/forgot-password", { email: "ines@tidewater.example" }));
    makeUser("ines@tidewater.example");
    // Reset mail is limited per address, known or not: let a minute pass.
    db()
      .update(accountMailSends)
      .set({ sentAt: new Date(Date.now() - 2 * 60 * 1000) })
      .run();
    await ask(post("/forgot-password", { email: "ines@tidewater.example" }));
    expect(
      mail
        .all()
        .map((m) => m.to[0])
        .sort(),
    ).toEqual(["dara@tidewater.example", "ines@tidewater.example"]);
    const wrong = await ask(
      post("/settings", { intent: "delete-account", currentPassword: "nope", confirm: "yes" }, jar),
    );
    expect(wrong.status).toBe(400);
    const done = await ask(
      post("/settings", { intent: "delete-account", currentPassword: PASSWORD, confirm: "yes" }, jar),
    );
    expect(done.status).toBe(302);
    expect(done.location).toBe("/");
    expect(done.headers.getSetCookie().some((c) => /^nearnote_session=;.*Max-Age=0/i.test(c))).toBe(true);
    expect(db().select().from(users).where(eq(users.id, dara.id)).get()).toBeUndefined();
    expect(db().select().from(takes).all()).toHaveLength(0);
    expect(db().select().from(sessions).all()).toHaveLength(0);
    expect(db().select().from(memberships).all()).toHaveLength(0);
    expect(db().select().from(invitations).all()).toHaveLength(0);
    expect(await takeFileStorage().has(`${dara.id}-monday.mid`)).toBe(false);
    expect(takeFilesOnDisk()).toEqual([]);
    // Caught mail to the deleted person is gone; other people's stays.
    expect(mail.all().map((m) => m.to[0])).toEqual(["ines@tidewater.example"]);
  });

  it("hands a studio to the co-teacher, deletes an empty studio, and refuses when students would be orphaned", async () => {
    const shared = makeStudio("Tidewater Keys");
    const solo = makeStudio("Solo Room");
    const ines = makeUser("ines@tidewater.example");
    const marta = makeUser("marta@tidewater.example");
    join(shared.id, ines.id, "owner");
    join(shared.id, marta.id, "teacher");
    join(solo.id, ines.id, "owner");
    const jar = await signIn(ines.email);
    const done = await ask(
      post("/settings", { intent: "delete-account", currentPassword: PASSWORD, confirm: "yes" }, jar),
    );
    expect(done.status).toBe(302);
    expect(db().select().from(memberships).where(eq(memberships.userId, marta.id)).get()?.role).toBe("owner");
    expect(
      db()
        .select()
        .from(studios)
        .all()
        .map((s) => s.name),
    ).toEqual(["Tidewater Keys"]);

    const lone = makeStudio("Harbour Lights");
    const owen = makeUser("owen@harbour.example");
    const kid = makeUser("kid@harbour.example");
    join(lone.id, owen.id, "owner");
    join(lone.id, kid.id, "student");
    const owenJar = await signIn(owen.email);
    const blocked = await ask<{ formError: string }>(
      post("/settings", { intent: "delete-account", currentPassword: PASSWORD, confirm: "yes" }, owenJar),
    );
    expect(blocked.status).toBe(409);
    expect(blocked.data.formError).toMatch(/Harbour Lights still has students/);
    expect(db().select().from(users).where(eq(users.id, owen.id)).get()).toBeDefined();
  });
});
