// Co-teachers: the owner can remove one (and invite them again); a removed co-teacher loses
// the board, exports and the power to delete students' data; nobody removes the owner.
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { memberships } from "~/db/schema";
import * as exportCsv from "~/routes/api.export.progress[.]csv";
import * as board from "~/routes/board";
import * as invite from "~/routes/invite.$token";
import * as login from "~/routes/login";
import * as students from "~/routes/students";
import { useFreshApp } from "../support/setup";
import { call, get, join, linkIn, makeStudio, makeUser, post, signIn, useMailCatcher } from "./accountsKit";

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
  return { s, ines, rafe, dara, inesJar: await signIn(login, ines.email), rafeJar: await signIn(login, rafe.email) };
}

const membership = (studioId: string, userId: string) =>
  db().select().from(memberships).where(and(eq(memberships.studioId, studioId), eq(memberships.userId, userId))).get()!;
const csv = "/api/export/progress.csv?from=2026-01-05&to=2026-03-29";

describe("removing a co-teacher", () => {
  it("the owner removes a co-teacher, who then loses the board, exports and deleting students' data", async () => {
    const { s, rafe, dara, inesJar, rafeJar } = await studio();
    expect((await call(board.loader, get("/board", rafeJar))).status).toBe(200);
    expect((await call(exportCsv.loader, get(csv, rafeJar))).status).toBe(200);

    const removed = await call(students.action, post("/students", { intent: "remove-teacher", teacherId: rafe.id }, inesJar));
    expect(removed.status).toBe(200);
    expect(membership(s.id, rafe.id)).toMatchObject({ status: "removed", role: "teacher" });

    // The same session, on its next requests.
    expect((await call(board.loader, get("/board", rafeJar))).status).toBe(403);
    expect((await call(exportCsv.loader, get(csv, rafeJar))).status).toBe(403);
    const del = await call(students.action, post("/students", { intent: "delete-data", studentId: dara.id, confirm: "yes" }, rafeJar));
    expect(del.status).toBe(403);
    expect(membership(s.id, dara.id).status).toBe("active");
    // The owner's roster shows them as removed.
    const roster = (await call(students.loader, get("/students", inesJar))).data as { teachers: Array<{ userId: string; status: string }> };
    expect(roster.teachers.find((t) => t.userId === rafe.id)?.status).toBe("removed");
  });

  it("a removed co-teacher can be invited again and is a co-teacher once more", async () => {
    const { s, rafe, inesJar } = await studio();
    await call(students.action, post("/students", { intent: "remove-teacher", teacherId: rafe.id }, inesJar));
    const invited = await call(students.action, post("/students", { intent: "invite", emails: rafe.email, role: "teacher" }, inesJar));
    expect(invited.status).toBe(200);
    const link = linkIn(mail.latestTo(rafe.email));
    const token = decodeURIComponent(link.replace(/^\/invite\//, ""));
    const rafeJar = await signIn(login, rafe.email);
    expect((await call(invite.action, post(link, { intent: "join" }, rafeJar), { token })).status).toBe(302);
    expect(membership(s.id, rafe.id)).toMatchObject({ status: "active", role: "teacher", removedAt: null });
    expect((await call(board.loader, get("/board", rafeJar))).status).toBe(200);
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
      expect((await call(students.action, post("/students", fields, rafeJar))).status, JSON.stringify(fields)).toBe(403);
    }
    expect((await call(students.action, post("/students", { intent: "remove-teacher", teacherId: ines.id }, inesJar))).status).toBe(403);
    expect((await call(students.action, post("/students", { intent: "remove-teacher", teacherId: "no-such-person" }, inesJar))).status).toBe(403);
    expect(membership(s.id, ines.id)).toMatchObject({ status: "active", role: "owner" });
    expect(membership(s.id, juno.id).status).toBe("active");
    expect(membership(s.id, rafe.id).status).toBe("active");
  });
});
