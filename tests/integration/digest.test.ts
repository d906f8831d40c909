// The mail Nearnote sends on its own: the teacher's daily digest (once a day, never twice, not
// even across a restart), due-date reminders, and the unsubscribe link that needs no sign-in.
import { spawn } from "node:child_process";
import path from "node:path";
import { eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { closeDatabase, db } from "~/db/client.server";
import { exercises, sentMails, takes, users } from "~/db/schema";
import { readCaughtMail } from "~/mail/mailCatcher.server";
import { tick } from "~/server/scheduler.server";
import { DIGEST_HOUR, digestContent, runDigests, runDueReminders } from "~/models/digest.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import {
  CookieJar,
  get,
  join,
  makeExercise,
  makeStudio,
  makeUser,
  ORIGIN,
  post,
  signIn,
  useMailCatcher,
} from "./accountsKit";
import { chordsMidi, uploadAnalysed } from "./exercisesKit";

const app = useFreshApp();
const mail = useMailCatcher(app);

let dara: CookieJar;
let ids: { ines: string; marta: string; dara: string; felix: string; studio: string };
const at = (iso: string) => new Date(iso);

beforeEach(async () => {
  const studio = makeStudio("Tidewater Keys"); // time zone UTC
  const p = {
    ines: makeUser("ines@tidewater.example", "Ines Marlowe"),
    marta: makeUser("marta@tidewater.example", "Marta Quill"),
    dara: makeUser("dara@tidewater.example", "Dara Okafor"),
    felix: makeUser("felix@tidewater.example", "Felix Brandt"),
  };
  join(studio.id, p.ines.id, "owner");
  join(studio.id, p.marta.id, "teacher");
  join(studio.id, p.dara.id, "student");
  join(studio.id, p.felix.id, "student");
  dara = await signIn(p.dara.email);
  ids = { ines: p.ines.id, marta: p.marta.id, dara: p.dara.id, felix: p.felix.id, studio: studio.id };
});

/** Uploads a take and dates its arrival, so the digest's "since" has something to compare. */
async function takeAt(
  iso: string,
  chords: number[][] = [
    [62, 66, 69],
    [62, 67, 71],
  ],
) {
  const body = await uploadAnalysed(dara, chordsMidi(chords), { key: "D" });
  db()
    .update(takes)
    .set({ createdAt: at(iso) })
    .where(eq(takes.id, body.id))
    .run();
  return body.id;
}

const digestsTo = (address: string) =>
  mail.all().filter((m) => m.to.includes(address) && m.subject.startsWith("Nearnote digest"));

describe("daily digest", () => {
  it(`goes out once a day from ${DIGEST_HOUR}:00 studio time, to each teacher, listing new takes with links`, async () => {
    const first = await takeAt("2026-12-01T09:00:00Z");
    const second = await takeAt("2026-12-01T15:30:00Z", [
      [62, 66, 69],
      [61, 64, 69],
    ]);
    expect(await runDigests(at("2026-12-01T17:59:00Z"))).toBe(0); // before the hour
    expect(await runDigests(at("2026-12-01T19:00:00Z"))).toBe(2); // Ines and Marta
    const d = mail.latestTo("ines@tidewater.example");
    expect(d.subject).toBe("Nearnote digest for Tidewater Keys: 2 new takes");
    expect(d.text).toContain(`- Dara Okafor: free practice, score `);
    expect(d.text).toContain(`${ORIGIN}/takes/${first}`);
    expect(d.text).toContain(`${ORIGIN}/takes/${second}`);
    expect(d.text).toContain("Takes waiting for review: 2.");
    expect(d.text).toMatch(/\/unsubscribe\?token=\S+/);
    expect(
      db()
        .select()
        .from(sentMails)
        .all()
        .map((r) => [r.kind, r.key]),
    ).toEqual([
      ["digest", `digest:${ids.studio}:2026-12-01`],
      ["digest", `digest:${ids.studio}:2026-12-01`],
    ]);
  });

  it("never sends twice in a day: not on a second run, not after a restart, not from the scheduler", async () => {
    await takeAt("2026-12-01T09:00:00Z");
    expect(await runDigests(at("2026-12-01T19:00:00Z"))).toBe(2);
    await takeAt("2026-12-01T19:30:00Z", [
      [62, 66, 69],
      [64, 67, 71],
    ]);
    expect(await runDigests(at("2026-12-01T20:00:00Z"))).toBe(0);
    // A restart: the process loses everything but the database file.
    closeDatabase();
    db();
    expect(await runDigests(at("2026-12-01T21:00:00Z"))).toBe(0);
    expect(await tick(at("2026-12-01T22:00:00Z"))).toEqual({ digests: 0, reminders: 0 });
    expect(digestsTo("ines@tidewater.example")).toHaveLength(1);

    // Next evening: only what arrived since the last digest.
    expect(await runDigests(at("2026-12-02T19:00:00Z"))).toBe(2);
    const next = digestsTo("ines@tidewater.example");
    expect(next).toHaveLength(2);
    expect(next[0].subject).toContain("1 new take");
  });

  it("sends nothing when nothing is new, nor to a teacher who turned digests off", async () => {
    expect(await runDigests(at("2026-12-01T19:00:00Z"))).toBe(0);
    db().update(users).set({ mailDigest: false }).where(eq(users.id, ids.marta)).run();
    await takeAt("2026-12-01T10:00:00Z");
    expect(await runDigests(at("2026-12-01T19:00:00Z"))).toBe(1);
    expect(digestsTo("marta@tidewater.example")).toHaveLength(0);
  });

  it("lists students' replies too", async () => {
    const { comments } = await import("~/db/schema");
    const id = await takeAt("2026-11-20T10:00:00Z");
    db()
      .insert(comments)
      .values({ takeId: id, authorId: ids.dara, body: "Is this better?", createdAt: at("2026-12-01T11:00:00Z") })
      .run();
    const content = digestContent(
      { id: ids.ines, name: "Ines Marlowe" },
      { id: ids.studio, name: "Tidewater Keys" },
      at("2026-12-01T00:00:00Z"),
    );
    expect(content).toMatchObject({ takeCount: 0, replyCount: 1 });
    expect(content!.text).toContain('- Dara Okafor: "Is this better?"');
  });

  it("npm run digest sends by hand, at any hour, and only once", async () => {
    await takeAt(new Date(Date.now() - 3_600_000).toISOString());
    closeDatabase();
    // Run asynchronously: the mail catcher in this process must keep answering meanwhile.
    const run = () =>
      new Promise<string>((resolve) => {
        const child = spawn(path.resolve("node_modules/.bin/tsx"), ["scripts/digest.ts"], { env: { ...process.env } });
        let out = "";
        child.stdout.on("data", (b) => (out += b));
        child.stderr.on("data", (b) => (out += b));
        child.on("close", () => resolve(out));
      });
    expect(await run()).toContain("Sent 2 digest(s)");
    expect(await run()).toContain("Sent 0 digest(s)");
    expect(readCaughtMail(mail.dir).filter((m) => m.subject.startsWith("Nearnote digest"))).toHaveLength(2);
  }, 150_000);
});

describe("due-date reminders", () => {
  it("the day before the due date, reach each student set the exercise who has handed nothing in, once", async () => {
    const exercise = makeExercise(ids.studio, "Sunday ballad in A♭");
    db().update(exercises).set({ dueDate: "2026-12-02" }).where(eq(exercises.id, exercise.id)).run();
    const felix = await signIn("felix@tidewater.example");
    await uploadAnalysed(
      felix,
      chordsMidi([
        [62, 66, 69],
        [62, 67, 71],
      ]),
      { exerciseId: exercise.id, key: "D" },
    );
    expect(await runDueReminders(at("2026-11-30T12:00:00Z"))).toBe(0); // two days before
    expect(await runDueReminders(at("2026-12-01T12:00:00Z"))).toBe(1);
    const r = mail.latestTo("dara@tidewater.example");
    expect(r.subject).toBe("Due tomorrow: Sunday ballad in A♭");
    expect(r.text).toContain(`/exercises/${exercise.id}`);
    expect(mail.all().filter((m) => m.to.includes("felix@tidewater.example"))).toHaveLength(0);
    expect(await runDueReminders(at("2026-12-01T18:00:00Z"))).toBe(0);
  });
});

describe("unsubscribe link", () => {
  async function digestLink() {
    await takeAt("2026-12-01T09:00:00Z");
    await runDigests(at("2026-12-01T19:00:00Z"));
    const text = mail.latestTo("ines@tidewater.example").text;
    return /\/unsubscribe\?token=\S+/.exec(text)![0];
  }

  it("works without signing in: opening asks, the button turns the mail off", async () => {
    const link = await digestLink();
    const page = await ask(get(link));
    expect(page.status).toBe(200);
    expect(page.data).toMatchObject({ email: "ines@tidewater.example", on: true });
    // Opening the link changed nothing (mail scanners open links).
    expect(db().select().from(users).where(eq(users.id, ids.ines)).get()!.mailDigest).toBe(true);
    const token = new URL(ORIGIN + link).searchParams.get("token")!;
    const done = await ask(post(link, { token }));
    expect(done.status).toBe(200);
    const row = db().select().from(users).where(eq(users.id, ids.ines)).get()!;
    expect(row.mailDigest).toBe(false);
    expect(row.mailOnFeedback).toBe(true);
  });

  it("refuses a token that was tampered with", async () => {
    const link = await digestLink();
    const token = new URL(ORIGIN + link).searchParams.get("token")!;
    const [payload, mac] = token.split(".");
    const forged = `${Buffer.from(`${ids.marta}:digest`).toString("base64url")}.${mac}`;
    expect((await ask(get(`/unsubscribe?token=${forged}`))).status).toBe(400);
    expect((await ask(post("/unsubscribe", { token: `${payload}.x${mac.slice(1)}` }))).status).toBe(400);
    expect(db().select().from(users).where(eq(users.id, ids.marta)).get()!.mailDigest).toBe(true);
  });
});
