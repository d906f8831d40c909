import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { studios, takes } from "~/db/schema";
import { ask } from "../support/app";
import { useFreshApp } from "../support/setup";
import { get, join, makeStudio, makeTakeRow, makeUser, signIn } from "./accountsKit";

// A student's pages show days and times by the studio's clock, as the teacher's pages do.
// Reference (from memory): New Zealand keeps daylight time, UTC+13, from late September to
// early April, so 20:00 UTC on Tuesday 1 December 2026 is 09:00 on Wednesday 2 December there.
useFreshApp();

describe("the studio's clock on a student's pages", () => {
  it("dates the takes on home and the take page in the studio's zone", async () => {
    const studio = makeStudio("Harbour Lane");
    db().update(studios).set({ timeZone: "Pacific/Auckland" }).where(eq(studios.id, studio.id)).run();
    const dara = makeUser("dara@harbour.example", "Dara");
    join(studio.id, dara.id, "student");
    const take = makeTakeRow(dara.id, studio.id, "take-1");
    const late = new Date("2026-12-01T20:00:00Z");
    db().update(takes).set({ recordedAt: late, createdAt: late }).where(eq(takes.id, take.id)).run();
    const jar = await signIn(dara.email);

    const home = await ask<{ student: { takes: { rows: { id: string; day: string }[] } } }>(get("/home", jar));
    expect(home.status).toBe(200);
    expect(home.data.student.takes.rows.find((t) => t.id === take.id)?.day).toBe("Wed 2 Dec");

    const page = await ask<{ zone: string }>(get(`/takes/${take.id}`, jar));
    expect(page.status).toBe(200);
    expect(page.data.zone).toBe("Pacific/Auckland");
  });
});
