import { readFileSync } from "node:fs";
import path from "node:path";
import { and, count, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { getSessionUser } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { comments, intendedFlags, memberships, takeReviews, takes } from "~/db/schema";
import { switchActiveStudio } from "~/models/studios.server";
import { storedTakeFiles, useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { CookieJar, join, makeExercise, makeStudio, makeUser, ORIGIN, post, signIn } from "./accountsKit";

// Changing a take: a replacement stays the same take in its own studio, racing
// replacements land once, and only an active member of the take's studio may
// change it. Every refusal leaves no stored file behind.
const app = useFreshApp();
const sample = (name: string) => new Uint8Array(readFileSync(path.resolve("samples", name)));
const storedFiles = () => storedTakeFiles(app.storageDir);
const takeCount = () => db().select({ n: count() }).from(takes).get()!.n;

function multipart(name: string, bytes: Uint8Array) {
  const form = new FormData();
  form.append("file", new File([new Uint8Array(bytes)], name, { type: "audio/midi" }));
  return form;
}

function uploadRequest(jar: CookieJar, form: FormData) {
  return new Request(`${ORIGIN}/api/takes`, {
    method: "POST",
    body: form,
    headers: { Cookie: jar.header(), Origin: ORIGIN },
  });
}

function replaceRequest(jar: CookieJar, takeId: string, bytes: Uint8Array, name = "again.mid") {
  return new Request(`${ORIGIN}/takes/${takeId}?intent=replace`, {
    method: "POST",
    body: multipart(name, bytes),
    headers: { Cookie: jar.header(), Origin: ORIGIN },
  });
}

/** Dara studies in two studios; her take lives in Harbour Lane, where Ines teaches. */
async function setup() {
  const harbour = makeStudio("Harbour Lane");
  const cliff = makeStudio("Cliff Road");
  const dara = makeUser("dara@harbour.example", "Dara");
  const ines = makeUser("ines@harbour.example", "Ines");
  join(harbour.id, dara.id, "student");
  join(cliff.id, dara.id, "student");
  join(harbour.id, ines.id, "owner");
  const exercise = makeExercise(harbour.id);
  const daraJar = await signIn(dara.email);
  const sessionUser = async () =>
    (await getSessionUser(new Request(ORIGIN, { headers: { Cookie: daraJar.header() } })))!;
  // Make sure Harbour Lane is active for the upload.
  switchActiveStudio((await sessionUser()).sessionId, dara.id, harbour.id);
  const up = await ask<{ id: string }>(
    uploadRequest(daraJar, multipart("first.mid", sample("clumsy-root-position-d.mid"))),
  );
  expect(up.status).toBe(201);
  const takeId = up.data.id;
  return { harbour, cliff, dara, ines, exercise, daraJar, takeId, sessionUser };
}

describe("replacing a take", () => {
  it("keeps it in its own studio with its comments, review and intended marks, even with another studio active", async () => {
    const s = await setup();
    const comment = db()
      .insert(comments)
      .values({ takeId: s.takeId, authorId: s.ines.id, body: "Watch the leap here.", changeIdx: null })
      .returning()
      .get();
    db().insert(takeReviews).values({ takeId: s.takeId, reviewedById: s.ines.id, reviewedAt: new Date() }).run();
    db()
      .insert(intendedFlags)
      .values({
        takeId: s.takeId,
        byId: s.ines.id,
        on: "change",
        idx: 0,
        flag: "root-position-leap",
        reason: "I asked for the jump.",
      })
      .run();
    // Dara now works in Cliff Road.
    switchActiveStudio((await s.sessionUser()).sessionId, s.dara.id, s.cliff.id);

    const r = await ask(replaceRequest(s.daraJar, s.takeId, sample("three-chord-smoothing-d.mid")));
    expect(r.status).toBe(302);
    expect(r.location).toBe(`/takes/${s.takeId}`);
    const all = db().select().from(takes).all();
    expect(all.map((t) => [t.id, t.studioId, t.originalName])).toEqual([[s.takeId, s.harbour.id, "again.mid"]]);
    expect(
      db()
        .select()
        .from(comments)
        .all()
        .map((c) => c.id),
    ).toEqual([comment.id]);
    expect(
      db()
        .select()
        .from(takeReviews)
        .all()
        .map((x) => x.takeId),
    ).toEqual([s.takeId]);
    expect(
      db()
        .select()
        .from(intendedFlags)
        .all()
        .map((m) => m.reason),
    ).toEqual(["I asked for the jump."]);
    expect(storedFiles()).toHaveLength(1); // the old file went once the new one was saved
  });

  it("claims the take once when four replacements race: one take, one file", async () => {
    const s = await setup();
    const files = ["held-bass-d.mid", "minor-colour-g.mid", "falling-bass-eb.mid", "sunday-ballad-ab.mid"];
    const results = await Promise.all(files.map((f) => ask(replaceRequest(s.daraJar, s.takeId, sample(f), f))));
    expect(results.filter((r) => r.status === 302)).toHaveLength(1);
    expect(results.filter((r) => r.status === 409)).toHaveLength(3);
    expect(takeCount()).toBe(1);
    expect(db().select().from(takes).get()!.id).toBe(s.takeId);
    expect(storedFiles()).toHaveLength(1);
  });

  it("removes the new file when the replacement is refused", async () => {
    const s = await setup();
    // The same content as another of her takes: refused as a duplicate.
    const other = await ask(uploadRequest(s.daraJar, multipart("other.mid", sample("held-bass-d.mid"))));
    expect(other.status).toBe(201);
    const r = await ask(replaceRequest(s.daraJar, s.takeId, sample("held-bass-d.mid")));
    expect(r.status).toBe(409);
    expect(takeCount()).toBe(2);
    expect(storedFiles()).toHaveLength(2);
  });
});

describe("a student removed from the take's studio", () => {
  it("can no longer move, replace or reply, and nothing is stored", async () => {
    const s = await setup();
    const teacherComment = db()
      .insert(comments)
      .values({ takeId: s.takeId, authorId: s.ines.id, body: "Try it smoother.", changeIdx: null })
      .returning()
      .get();
    // Removed as the roster does it: the membership stays, marked removed.
    db()
      .update(memberships)
      .set({ status: "removed" })
      .where(and(eq(memberships.studioId, s.harbour.id), eq(memberships.userId, s.dara.id)))
      .run();
    // Still active in Cliff Road, so still signed in with a studio.
    const before = db().select().from(takes).get()!;

    const move = await ask(
      post(`/takes/${s.takeId}`, { intent: "move", exerciseId: s.exercise.id, key: "D" }, s.daraJar),
    );
    expect(move.status).toBe(403);
    const replace = await ask(replaceRequest(s.daraJar, s.takeId, sample("three-chord-smoothing-d.mid")));
    expect(replace.status).toBe(403);
    const reply = await ask(
      post(
        `/takes/${s.takeId}/feedback`,
        { intent: "comment", body: "Will do!", parentId: teacherComment.id },
        s.daraJar,
        { Origin: ORIGIN },
      ),
    );
    expect([400, 403]).toContain(reply.status);

    expect(db().select().from(takes).get()).toEqual(before);
    expect(
      db()
        .select()
        .from(comments)
        .all()
        .map((c) => c.id),
    ).toEqual([teacherComment.id]);
    expect(storedFiles()).toHaveLength(1);
  });
});
