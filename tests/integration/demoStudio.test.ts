import bcrypt from "bcryptjs";
import { count, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { exercises, memberships, studios, users } from "~/db/schema";
import { DEMO_PASSWORD, DEMO_STUDENTS, DEMO_TEACHER, seedDemoStudio } from "~/models/demoStudio.server";
import { useFreshApp } from "../support/setup";

useFreshApp();

describe("the demo studio seed", () => {
  it("creates the invented studio: one owner, six students, four exercises", async () => {
    const result = await seedDemoStudio(db());
    expect(result.created).toBe(true);
    const studio = db().select().from(studios).get()!;
    expect(studio.name).toBe("Tidewater Keys");
    const roles = db().select({ role: memberships.role }).from(memberships).all().map((r) => r.role).sort();
    expect(roles).toEqual(["owner", "student", "student", "student", "student", "student", "student"]);
    expect(DEMO_STUDENTS.map((s) => s.email)).toContain("dara@tidewater.example");
    const titles = db().select({ t: exercises.title }).from(exercises).all().map((r) => r.t);
    expect(titles).toHaveLength(4);
    expect(titles).toContain("Falling bass in E♭");
    const teacher = db().select().from(users).where(eq(users.email, DEMO_TEACHER.email)).get()!;
    expect(await bcrypt.compare(DEMO_PASSWORD, teacher.passwordHash)).toBe(true);
    expect(teacher.emailVerifiedAt).not.toBeNull();
  });

  it("is idempotent: a second run changes nothing", async () => {
    await seedDemoStudio(db());
    const again = await seedDemoStudio(db());
    expect(again.created).toBe(false);
    expect(db().select({ n: count() }).from(users).get()!.n).toBe(7);
    expect(db().select({ n: count() }).from(studios).get()!.n).toBe(1);
    expect(db().select({ n: count() }).from(exercises).get()!.n).toBe(4);
  });
});
