// The board's statuses and trend, the one-click reminder mail, the studio time
// zone setting and saved reports, through the real loaders and actions.
import { eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { createUserSession } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { studios, takes } from "~/db/schema";
import { boardRows } from "~/models/board.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { CookieJar, get, join, makeStudio, makeUser, post, useMailCatcher } from "./accountsKit";
import { insertHandTake } from "./progressKit";

const app = useFreshApp();
const mail = useMailCatcher(app);

let s: { studio: string; other: string; climber: string; slider: string; quiet: string; fresh: string; steady: string };
let jars: Record<"owner" | "coTeacher" | "student" | "otherTeacher", CookieJar>;
const jarFor = async (id: string) => new CookieJar().take((await createUserSession(id, "/home")).headers);

beforeEach(async () => {
  const studio = makeStudio("Tidewater Keys");
  const other = makeStudio("Harbour Lights");
  const owner = makeUser("ines@tidewater.example", "Ines Marlowe");
  const coTeacher = makeUser("marta@tidewater.example", "Marta Quill");
  const otherTeacher = makeUser("owen@harbour.example", "Owen Harbour");
  const people = {
    climber: makeUser("dara@tidewater.example", "Dara Okafor"),
    slider: makeUser("felix@tidewater.example", "Felix Brandt"),
    quiet: makeUser("samir@tidewater.example", "Samir Haddad"),
    fresh: makeUser("yuki@tidewater.example", "Yuki Tanabe"),
    steady: makeUser("lena@tidewater.example", "Lena Voss"),
  };
  join(studio.id, owner.id, "owner");
  join(studio.id, coTeacher.id, "teacher");
  join(other.id, otherTeacher.id, "owner");
  for (const p of Object.values(people)) join(studio.id, p.id, "student");
  s = {
    studio: studio.id,
    other: other.id,
    ...Object.fromEntries(Object.entries(people).map(([k, v]) => [k, v.id])),
  } as typeof s;
  jars = {
    owner: await jarFor(owner.id),
    coTeacher: await jarFor(coTeacher.id),
    student: await jarFor(people.climber.id),
    otherTeacher: await jarFor(otherTeacher.id),
  };
});

const DAY = 86_400_000;
/** Wednesday noon UTC of the week `n` weeks before 2026-12-02 (ISO week 49). */
const weeksAgo = (n: number) => new Date(Date.parse("2026-12-02T12:00:00Z") - n * 7 * DAY).toISOString();
const NOW = new Date("2026-12-02T12:00:00Z");

describe("board statuses and trend", () => {
  it("tells improving, slipping, level, stopped and new apart from the week sums", () => {
    const take = (studentId: string, n: number, score: number) =>
      insertHandTake({ studentId, studioId: s.studio, at: weeksAgo(n), score, changes: 4, motion: 8, best: 4 });
    // Climber: 50 three to five weeks ago, 60 in the last three: +10 ≥ 3 → improving.
    for (const n of [5, 4, 3]) take(s.climber, n, 50);
    for (const n of [2, 1, 0]) take(s.climber, n, 60);
    // Slider: 80 then 70 → slipping. Steady: 70 then 71 (within the 3-point band) → level.
    for (const n of [5, 4, 3]) take(s.slider, n, 80);
    for (const n of [2, 1, 0]) take(s.slider, n, 70);
    for (const n of [5, 4, 3]) take(s.steady, n, 70);
    for (const n of [2, 1, 0]) take(s.steady, n, 71);
    // Quiet: practised four weeks ago, nothing in this week or the last → stopped. Fresh: no takes at all → new.
    take(s.quiet, 4, 65);
    const { week, rows } = boardRows(s.studio, NOW);
    expect(week).toBe("2026-W49");
    const byName = Object.fromEntries(rows.map((r) => [r.name, r]));
    expect(byName["Dara Okafor"].status).toBe("improving");
    expect(byName["Felix Brandt"].status).toBe("slipping");
    expect(byName["Lena Voss"].status).toBe("level");
    expect(byName["Samir Haddad"].status).toBe("stopped");
    expect(byName["Yuki Tanabe"].status).toBe("new");
    // Each trend status carries the two rounded means it compares (three weeks before → the last three).
    expect(byName["Dara Okafor"].compare).toEqual({ before: 50, recent: 60 });
    expect(byName["Felix Brandt"].compare).toEqual({ before: 80, recent: 70 });
    expect(byName["Lena Voss"].compare).toEqual({ before: 70, recent: 71 });
    // This week against last week, and eight weeks of mean score, oldest first (null: no takes that week).
    expect(byName["Felix Brandt"].thisWeek.score).toBe(70);
    expect(byName["Felix Brandt"].lastWeek.score).toBe(70);
    expect(byName["Dara Okafor"].trend).toEqual([null, null, 50, 50, 50, 60, 60, 60]);
    expect(byName["Samir Haddad"].trend).toEqual([null, null, null, 65, null, null, null, null]);
    expect(byName["Samir Haddad"].lastTakeAt).toBe(weeksAgo(4));
    expect(byName["Yuki Tanabe"].lastTakeAt).toBeNull();
    // Students by name, as the table starts out.
    expect(rows.map((r) => r.name)).toEqual([
      "Dara Okafor",
      "Felix Brandt",
      "Lena Voss",
      "Samir Haddad",
      "Yuki Tanabe",
    ]);
  });
});

describe("board status against its own row", () => {
  const take = (studentId: string, n: number, score: number) =>
    insertHandTake({ studentId, studioId: s.studio, at: weeksAgo(n), score, changes: 4, motion: 8, best: 4 });

  it("gives a student without a take this week no trend status, however the weeks before went", () => {
    // Falling from 80 to 60 over weeks 5..1, then silent this week: "slipping" would contradict an empty row.
    for (const n of [5, 4, 3]) take(s.slider, n, 80);
    for (const n of [2, 1]) take(s.slider, n, 60);
    const row = boardRows(s.studio, NOW).rows.find((r) => r.studentId === s.slider)!;
    expect(row.thisWeek.takes).toBe(0);
    expect(row.status).toBe("stopped");
  });

  it("says 'too early' for a student whose first takes are this week, and decides on the rounded means it prints", () => {
    take(s.fresh, 0, 75);
    // 70.4 before and 72.6 now print as 70 → 73: three points up, so improving (not "level" from the raw 2.2).
    for (const [n, score] of [
      [5, 70.4],
      [4, 70.4],
      [3, 70.4],
      [2, 72.6],
      [1, 72.6],
      [0, 72.6],
    ] as const)
      take(s.steady, n, score);
    const rows = boardRows(s.studio, NOW).rows;
    expect(rows.find((r) => r.studentId === s.fresh)).toMatchObject({
      status: "early",
      compare: { before: null, recent: 75 },
    });
    expect(rows.find((r) => r.studentId === s.steady)).toMatchObject({
      status: "improving",
      compare: { before: 70, recent: 73 },
    });
  });
});

describe("board page", () => {
  it("mails students without a take this week once, and says who was reminded", async () => {
    insertHandTake({ studentId: s.climber, studioId: s.studio, at: new Date().toISOString(), score: 70 });
    const first = await ask(post("/board", { intent: "remind" }, jars.owner));
    expect(first.status).toBe(302);
    const recipients = mail
      .all()
      .flatMap((m) => m.to)
      .sort();
    expect(recipients).toEqual([
      "felix@tidewater.example",
      "lena@tidewater.example",
      "samir@tidewater.example",
      "yuki@tidewater.example",
    ]);
    const message = mail.latestTo("samir@tidewater.example");
    expect(message.subject).toBe("Ines Marlowe is looking forward to your next take");
    expect(message.text).toContain("http://127.0.0.1:3000/takes/new");
    expect(message.text).toMatch(/breaks/);
    // A second click the same week sends nothing more.
    await ask(post("/board", { intent: "remind" }, jars.coTeacher));
    expect(mail.all().length).toBe(4);
    const page = await ask<{ quiet: { name: string; reminded: boolean }[] }>(get("/board", jars.owner));
    const quiet = page.data.quiet;
    expect(quiet.map((q) => q.name)).not.toContain("Dara Okafor");
    expect(quiet.every((q) => q.reminded)).toBe(true);
    expect((await ask(post("/board", { intent: "shout" }, jars.owner))).status).toBe(400);
  });

  it("keeps the chart's choice from the address and refuses another studio's students", async () => {
    const page = await ask<{
      choice: { metric: string; studentIds: string[]; from: string; to: string };
      chart: { weeks: string[]; series: unknown[] };
    }>(get(`/board?metric=accuracy&student=${s.slider}&from=2026-10-05&to=2026-11-29`, jars.owner));
    const d = page.data;
    expect(d.choice).toEqual({ metric: "accuracy", studentIds: [s.slider], from: "2026-10-05", to: "2026-11-29" });
    expect(d.chart.weeks[0]).toBe("2026-W41");
    expect(d.chart.weeks.at(-1)).toBe("2026-W48");
    expect(d.chart.series).toHaveLength(1);
    expect((await ask(get(`/board?student=${s.slider}`, jars.otherTeacher))).status).toBe(403);
    // A hand-edited bad value falls back to the default view.
    expect((await ask(get("/board?metric=zzz", jars.owner))).location).toBe("/board");
    expect((await ask(get("/board?week=1999-W01", jars.owner))).location).toBe("/board");
  });

  it("shows an earlier week on request, against the week before it, without the reminder card", async () => {
    const current = (
      await ask<{
        week: { key: string; isCurrent: boolean };
        weekOptions: { key: string; label: string }[];
      }>(get("/board", jars.owner))
    ).data;
    expect(current.week.isCurrent).toBe(true);
    expect(current.weekOptions.slice(0, 2).map((o) => o.label)).toEqual(["This week", "Last week"]);
    const lastWeek = current.weekOptions[1].key;
    insertHandTake({
      studentId: s.slider,
      studioId: s.studio,
      at: new Date(Date.now() - 7 * DAY).toISOString(),
      score: 64,
    });
    const page = await ask<{
      week: { key: string; isCurrent: boolean };
      quiet: unknown[];
      table: { rows: { name: string; thisWeek: { score: number | null } }[] };
    }>(get(`/board?week=${lastWeek}`, jars.owner));
    const d = page.data;
    expect(d.week).toMatchObject({ key: lastWeek, isCurrent: false });
    expect(d.quiet).toEqual([]);
    expect(d.table.rows.find((r) => r.name === "Felix Brandt")!.thisWeek.score).toBe(64);
  });

  it("says there are no students yet in an empty studio", async () => {
    const page = await ask<{ table: { rows: unknown[]; total: number }; chart: unknown }>(
      get("/board", jars.otherTeacher),
    );
    expect(page.data.table).toMatchObject({ rows: [], total: 0 });
    expect(page.data.chart).toBeNull();
  });
});

describe("studio time zone", () => {
  it("lets the owner change it, recomputing week keys; a co-teacher only reads it", async () => {
    const t = insertHandTake({ studentId: s.climber, studioId: s.studio, at: "2026-11-30T02:00:00Z" }); // Monday 02:00 UTC
    expect(t.weekKey).toBe("2026-W49");
    const changed = await ask(post("/studio/settings", { timeZone: "America/Los_Angeles" }, jars.owner));
    expect(changed.status).toBe(302);
    // Sunday 18:00 in Los Angeles: the take moves back to week 48.
    expect(db().select({ w: takes.weekKey }).from(takes).where(eq(takes.id, t.id)).get()!.w).toBe("2026-W48");
    expect(db().select({ tz: studios.timeZone }).from(studios).where(eq(studios.id, s.studio)).get()!.tz).toBe(
      "America/Los_Angeles",
    );
    expect((await ask(post("/studio/settings", { timeZone: "Nowhere/Atlantis" }, jars.owner))).status).toBe(400);
    expect((await ask(post("/studio/settings", { timeZone: "UTC" }, jars.coTeacher))).status).toBe(403);
    const view = await ask(get("/studio/settings", jars.coTeacher));
    expect(view.data).toMatchObject({ canEdit: false, timeZone: "America/Los_Angeles" });
  });
});

describe("reports and the student page", () => {
  it("saves a report with the teacher's summary and reopens it; other studios get 404 or 403", async () => {
    insertHandTake({
      studentId: s.climber,
      studioId: s.studio,
      at: "2026-11-18T15:00:00Z",
      score: 72,
      changes: 10,
      motion: 20,
      best: 15,
      techniques: { "open-voicing": 2 },
    });
    const empty = await ask(
      post(
        `/reports/${s.climber}`,
        { intent: "save", from: "2026-11-01", to: "2026-11-30", summary: "  " },
        jars.owner,
      ),
    );
    expect(empty.status).toBe(400);
    const badDate = await ask(
      post(
        `/reports/${s.climber}`,
        { intent: "save", from: "2026-02-30", to: "2026-03-31", summary: "Fine." },
        jars.owner,
      ),
    );
    expect(badDate.status).toBe(400);
    const saved = await ask(
      post(
        `/reports/${s.climber}`,
        { intent: "save", from: "2026-11-01", to: "2026-11-30", summary: "Smoother changes; open voicings are new." },
        jars.owner,
      ),
    );
    expect(saved.status).toBe(302);
    const reportId = new URL(saved.location!, "http://x").searchParams.get("report")!;
    const reopened = await ask<{
      from: string;
      to: string;
      saved: { summary: string };
      progress: { total: { score: number; smoothness: number }; gained: string[] };
      savedReports: unknown[];
    }>(get(`/reports/${s.climber}?report=${reportId}`, jars.coTeacher));
    const d = reopened.data;
    expect(d).toMatchObject({
      from: "2026-11-01",
      to: "2026-11-30",
      saved: { summary: "Smoother changes; open voicings are new." },
    });
    expect(d.progress.total.score).toBe(72);
    expect(d.progress.total.smoothness).toBe(0.75); // 15 / 20
    expect(d.progress.gained).toEqual(["open-voicing"]);
    expect(d.savedReports).toHaveLength(1);
    expect((await ask(get(`/reports/${s.slider}?report=${reportId}`, jars.owner))).status).toBe(404);
    expect((await ask(get(`/reports/${s.climber}`, jars.otherTeacher))).status).toBe(403);
    expect((await ask(get(`/reports/${s.climber}`, jars.student))).status).toBe(403);
  });

  it("shows one student's weeks, techniques, exercises and takes to their teacher", async () => {
    insertHandTake({ studentId: s.climber, studioId: s.studio, at: "2026-11-18T15:00:00Z", score: 60 });
    insertHandTake({ studentId: s.climber, studioId: s.studio, at: "2026-11-25T15:00:00Z", failed: true });
    const page = await ask<{
      weeks: { week: string; takes: number }[];
      takes: unknown[];
      exercises: { title: string; takes: number }[];
    }>(get(`/students/${s.climber}?from=2026-11-16&to=2026-11-29`, jars.owner));
    const d = page.data;
    expect(d.weeks.map((w) => [w.week, w.takes])).toEqual([
      ["2026-W47", 1],
      ["2026-W48", 1],
    ]);
    expect(d.takes).toHaveLength(2);
    expect(d.exercises).toEqual([expect.objectContaining({ title: "Free practice", takes: 2 })]);
  });
});
