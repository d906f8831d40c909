// Co-teachers: the owner can remove one (and invite them again); a removed co-teacher loses
// the board, exports and the power to delete students' data; nobody removes the owner.
// Every request goes through the app's real handler, the layouts' access middleware included.
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { memberships } from "~/db/schema";
import { ask } from "../support/app";
import { useFreshApp } from "../support/setup";
import {
  get,
  join,
  linkIn,
  makeStudio,
  makeUser,
  ORIGIN,
  post as postForm,
  signIn,
  useMailCatcher,
  type CookieJar,
} from "./accountsKit";

/** A form post from our own pages: the router refuses actions from another origin. */
const post = (to: string, fields: Record<string, string>, jar: CookieJar) =>
  postForm(to, fields, jar, { Origin: ORIGIN });

const app = useFreshApp();
const mail = useMailCatcher(app);

async function studio() {
  const s = makeStudio("Tidewater Keys");
  const ines = makeUser("ines@tidewater.example", "Ines Marlowe");
  const rafe = makeUser("rafe@tidewater.example", "Rafe Calloway");
  const dara = makeUser("dara@tidewater.example", "Dara Okafor");
  join(s.id, ines.id, "owner");
  join(s.id, rafe.id, "teacher");
  join(s.id, dara.id, "student");
  return { s, ines, rafe, dara, inesJar: await signIn(ines.email), rafeJar: await signIn(rafe.email) };
}

const membership = (studioId: string, userId: string) =>
  db()
    .select()
    .from(memberships)
    .where(and(eq(memberships.studioId, studioId), eq(memberships.userId, userId)))
    .get()!;
const csv = "/api/export/progress.csv?from=2026-01-05&to=2026-03-29";

describe("removing a co-teacher", () => {
  it("the owner removes a co-teacher, who then loses the board, exports and deleting students' data", async () => {
    const { s, rafe, dara, inesJar, rafeJar } = await studio();
    expect((await ask(get("/board", rafeJar))).status).toBe(200);
    expect((await ask(get(csv, rafeJar))).status).toBe(200);

    const removed = await ask(post("/students", { intent: "remove-teacher", teacherId: rafe.id }, inesJar));
    expect(removed.status).toBe(200);
    expect(membership(s.id, rafe.id)).toMatchObject({ status: "removed", role: "teacher" });

    // The same session, on its next requests.
    expect((await ask(get("/board", rafeJar))).status).toBe(403);
    expect((await ask(get(csv, rafeJar))).status).toBe(403);
    const del = await ask(post("/students", { intent: "delete-data", studentId: dara.id, confirm: "yes" }, rafeJar));
    expect(del.status).toBe(403);
    expect(membership(s.id, dara.id).status).toBe("active");
    // The owner's roster shows them as removed.
    const roster = (await ask<{ teachers: Array<{ userId: string; status: string }> }>(get("/students", inesJar))).data;
    expect(roster.teachers.find((t) => t.userId === rafe.id)?.status).toBe("removed");
  });

  it("a removed co-teacher can be invited again and is a co-teacher once more", async () => {
    const { s, rafe, inesJar } = await studio();
    await ask(post("/students", { intent: "remove-teacher", teacherId: rafe.id }, inesJar));
    const invited = await ask(post("/students", { intent: "invite", emails: rafe.email, role: "teacher" }, inesJar));
    expect(invited.status).toBe(200);
    const link = linkIn(mail.latestTo(rafe.email));
    const rafeJar = await signIn(rafe.email);
    expect((await ask(post(link, { intent: "join" }, rafeJar))).status).toBe(302);
    expect(membership(s.id, rafe.id)).toMatchObject({ status: "active", role: "teacher", removedAt: null });
    expect((await ask(get("/board", rafeJar))).status).toBe(200);
  });

  it("a co-teacher cannot remove the owner or another co-teacher, and the owner cannot remove themself", async () => {
    const { s, ines, rafe, inesJar, rafeJar } = await studio();
    const juno = makeUser("juno@tidewater.example", "Juno Hale");
    join(s.id, juno.id, "teacher");
    for (const fields of <Record<string, string>[]>[
      { intent: "remove-teacher", teacherId: ines.id },
      { intent: "remove-teacher", teacherId: juno.id },
      { intent: "remove", studentId: ines.id },
    ]) {
      expect((await ask(post("/students", fields, rafeJar))).status, JSON.stringify(fields)).toBe(403);
    }
    expect((await ask(post("/students", { intent: "remove-teacher", teacherId: ines.id }, inesJar))).status).toBe(403);
    expect(
      (await ask(post("/students", { intent: "remove-teacher", teacherId: "no-such-person" }, inesJar))).status,
    ).toBe(403);
    expect(membership(s.id, ines.id)).toMatchObject({ status: "active", role: "owner" });
    expect(membership(s.id, juno.id).status).toBe("active");
    expect(membership(s.id, rafe.id).status).toBe("active");
  });
});
