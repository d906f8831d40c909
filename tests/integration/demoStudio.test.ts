import bcrypt from "bcryptjs";
import { count, eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { exercises, memberships, studios, takeMetrics, takes, users } from "~/db/schema";
import { DEMO_PASSWORD, DEMO_STUDENTS, DEMO_TEACHER, seedDemoStudio } from "~/models/demoStudio.server";
import { seedDemoTakes } from "../../scripts/lib/seedTakes";
import { useFreshApp } from "../support/setup";

useFreshApp();

describe("the demo studio seed", () => {
  it("creates the invented studio: one owner, six students, four exercises", async () => {
    const result = await seedDemoStudio(db());
    expect(result.created).toBe(true);
    const studio = db().select().from(studios).get()!;
    expect(studio.name).toBe("Tidewater Keys");
    const roles = db()
      .select({ role: memberships.role })
      .from(memberships)
      .all()
      .map((r) => r.role)
      .sort();
    expect(roles).toEqual(["owner", "student", "student", "student", "student", "student", "student"]);
    expect(DEMO_STUDENTS.map((s) => s.email)).toContain("dara@tidewater.example");
    const titles = db()
      .select({ t: exercises.title })
      .from(exercises)
      .all()
      .map((r) => r.t);
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

describe("the demo takes", () => {
  it("adds twelve weeks of analysed takes with an improving student, a stuck one and one who stopped, once", async () => {
    const { studioId } = await seedDemoStudio(db());
    const made = await seedDemoTakes(db(), studioId, new Date("2026-12-01T12:00:00Z"));
    expect(made).toBeGreaterThan(100);
    expect(await seedDemoTakes(db(), studioId)).toBe(0);
    const weekly = (email: string) =>
      db()
        .select({
          week: takes.weekKey,
          best: sql<number>`sum(${takeMetrics.bestTotalMotion})`,
          total: sql<number>`sum(${takeMetrics.totalMotion})`,
        })
        .from(takes)
        .innerJoin(users, eq(users.id, takes.studentId))
        .innerJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
        .where(eq(users.email, email))
        .groupBy(takes.weekKey)
        .orderBy(takes.weekKey)
        .all();
    const smoothness = (rows: { best: number; total: number }[]) =>
      rows.reduce((a, r) => a + r.best, 0) / rows.reduce((a, r) => a + r.total, 0);
    const dara = weekly("dara@tidewater.example");
    expect(dara.length).toBeGreaterThanOrEqual(12);
    expect(smoothness(dara.slice(-4))).toBeGreaterThan(smoothness(dara.slice(0, 4)) + 0.15);
    // Samir stopped three weeks ago: nothing in the last weeks.
    const samir = weekly("samir@tidewater.example");
    expect(samir.at(-1)!.week < dara.at(-1)!.week).toBe(true);
    expect(db().select({ n: count() }).from(takes).where(eq(takes.status, "failed")).get()!.n).toBe(0);
    // Felix plateaus: his last four weeks are no smoother than his first four by much.
    const felix = weekly("felix@tidewater.example");
    expect(Math.abs(smoothness(felix.slice(-4)) - smoothness(felix.slice(0, 4)))).toBeLessThan(0.15);
    // Some takes are played in the textures of real playing, and read as such (RULES.md rules 15–18).
    const ballad = db()
      .select({ analysis: takeMetrics.analysis })
      .from(takes)
      .innerJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
      .where(eq(takes.originalName, "texture-pedalled-ballad-ab.mid"))
      .get()!;
    const reading = ballad.analysis as { chords: Array<{ symbol: string }>; summary: { accuracy: number } };
    expect(reading.chords.map((c) => c.symbol)).toEqual(["Fm", "Db", "Ab", "Eb"]);
    expect(reading.summary.accuracy).toBe(1);
    const shells = db()
      .select({ analysis: takeMetrics.analysis })
      .from(takes)
      .innerJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
      .where(eq(takes.originalName, "texture-shells-melody-bb.mid"))
      .get()!;
    expect((shells.analysis as { melodyNotes: unknown[] }).melodyNotes.length).toBeGreaterThan(0);
  }, 60_000);
});
