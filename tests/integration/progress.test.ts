// Weekly figures against values worked out by hand (the arithmetic is in the
// comments), across a week boundary, a time-zone boundary and a time-zone change;
// the CSV export parsed back with csv-parse; access for students and other studios.
import { parse } from "csv-parse/sync";
import { beforeEach, describe, expect, it } from "vitest";
import { createUserSession } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { studios, takes, users } from "~/db/schema";
import { eq } from "drizzle-orm";
import { weeklyFigures } from "~/models/progress.server";
import { weekKey } from "~/utils/weeks";
import { setStudioTimeZone } from "~/models/studioSettings.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { CookieJar, get, join, makeExercise, makeStudio, makeUser } from "./accountsKit";
import { insertHandTake } from "./progressKit";

useFreshApp();

// A name with a comma, double quotes and letters outside ASCII; another with a leading "=".
const ZOE = 'Zoë "Ace" Åkesson, Jr.';
const BJORN = "Björn Ørsted";

let ids: { studio: string; zoe: string; bjorn: string; other: string };
let jars: Record<"teacher" | "student" | "otherTeacher", CookieJar>;

async function jarFor(userId: string) {
  return new CookieJar().take((await createUserSession(userId, "/home")).headers);
}

beforeEach(async () => {
  const studio = makeStudio("Tidewater Keys");
  db().update(studios).set({ timeZone: "America/New_York" }).where(eq(studios.id, studio.id)).run();
  const other = makeStudio("Harbour Lights");
  const teacher = makeUser("ines@tidewater.example", "Ines Marlowe");
  const zoe = makeUser("zoe@tidewater.example", ZOE);
  const bjorn = makeUser("bjorn@tidewater.example", BJORN);
  const otherTeacher = makeUser("owen@harbour.example", "Owen Harbour");
  join(studio.id, teacher.id, "owner");
  join(studio.id, zoe.id, "student");
  join(studio.id, bjorn.id, "student");
  join(other.id, otherTeacher.id, "owner");
  const ex = makeExercise(studio.id).id;
  const s = studio.id;
  // 2026-11-16 is the Monday of ISO week 47 and 2026-11-23 that of week 48
  // (1 January 2026 is a Thursday, so week 1 began on Monday 29 December 2025).
  insertHandTake({
    studentId: zoe.id,
    studioId: s,
    at: "2026-11-18T15:00:00Z",
    exerciseId: ex,
    durationSec: 120,
    changes: 10,
    motion: 40,
    best: 30,
    leaps: 2,
    score: 60,
    accuracy: 0.5,
    techniques: { inversion: 3 },
  });
  insertHandTake({
    studentId: zoe.id,
    studioId: s,
    at: "2026-11-19T15:00:00Z",
    durationSec: 180,
    changes: 20,
    motion: 60,
    best: 54,
    leaps: 1,
    score: 80,
    techniques: { inversion: 1, "open-voicing": 2 },
  });
  insertHandTake({ studentId: zoe.id, studioId: s, at: "2026-11-20T15:00:00Z", failed: true });
  // Monday 01:30 UTC is still Sunday 20:30 in New York (UTC−5 in November): week 47 there, week 48 in UTC.
  insertHandTake({
    studentId: zoe.id,
    studioId: s,
    at: "2026-11-23T01:30:00Z",
    exerciseId: ex,
    durationSec: 60,
    changes: 10,
    motion: 0,
    best: 0,
    leaps: 0,
    score: 90,
    accuracy: 1,
  });
  insertHandTake({
    studentId: zoe.id,
    studioId: s,
    at: "2026-11-24T15:00:00Z",
    exerciseId: ex,
    durationSec: 240,
    changes: 5,
    motion: 10,
    best: 10,
    leaps: 0,
    score: 70,
    accuracy: 0.75,
    techniques: { "slash-bass": 4 },
  });
  insertHandTake({
    studentId: bjorn.id,
    studioId: s,
    at: "2026-11-25T12:00:00Z",
    durationSec: 90,
    changes: 8,
    motion: 16,
    best: 8,
    leaps: 4,
    score: 40,
  });
  ids = { studio: s, zoe: zoe.id, bjorn: bjorn.id, other: other.id };
  jars = {
    teacher: await jarFor(teacher.id),
    student: await jarFor(zoe.id),
    otherTeacher: await jarFor(otherTeacher.id),
  };
});

/** Zoë's two weeks in New York time, worked by hand. */
const NEW_YORK = {
  // Week 47: takes 1, 2, 3 (failed) and 4 (Sunday evening locally).
  "2026-W47": {
    takes: 4, // the failed take counts here only
    practiceMinutes: 6, // (120 + 180 + 60) s / 60
    changes: 40, // 10 + 20 + 10
    motionPerChange: 2.5, // (40 + 60 + 0) / 40
    smoothness: 0.84, // (30 + 54 + 0) / (40 + 60 + 0): a ratio of sums, not the mean 0.75, 0.9, 1.0
    leapsPer10: 0.75, // 10 × (2 + 1 + 0) / 40
    accuracy: 0.75, // mean over takes with an exercise: (0.5 + 1) / 2
    score: 230 / 3, // (60 + 80 + 90) / 3
    techniques: { inversion: 4, "open-voicing": 2, "slash-bass": 0 },
  },
  "2026-W48": {
    takes: 1,
    practiceMinutes: 4,
    changes: 5,
    motionPerChange: 2,
    smoothness: 1,
    leapsPer10: 0,
    accuracy: 0.75,
    score: 70,
    techniques: { inversion: 0, "open-voicing": 0, "slash-bass": 4 },
  },
};

/** The same takes after the studio moves to UTC: take 4 (Monday 01:30 UTC) joins week 48. */
const UTC = {
  "2026-W47": {
    takes: 3,
    practiceMinutes: 5,
    changes: 30,
    motionPerChange: 100 / 30,
    smoothness: 0.84,
    leapsPer10: 1,
    accuracy: 0.5,
    score: 70,
    techniques: { inversion: 4, "open-voicing": 2, "slash-bass": 0 },
  },
  // (0 + 10) / (0 + 10) = 1; 10 × 0 / 15; (1 + 0.75) / 2; (90 + 70) / 2
  "2026-W48": {
    takes: 2,
    practiceMinutes: 5,
    changes: 15,
    motionPerChange: 10 / 15,
    smoothness: 1,
    leapsPer10: 0,
    accuracy: 0.875,
    score: 80,
    techniques: { inversion: 0, "open-voicing": 0, "slash-bass": 4 },
  },
};

function expectWeek(actual: ReturnType<typeof weeklyFigures>[number], wanted: (typeof NEW_YORK)["2026-W47"]) {
  const { techniques, ...numbers } = wanted;
  for (const [k, v] of Object.entries(numbers)) expect(actual[k as keyof typeof numbers], k).toBeCloseTo(v, 9);
  expect(actual.techniques).toMatchObject(techniques);
}

describe("weekly figures", () => {
  it("match the hand-computed values across a week boundary, in the studio's time zone", () => {
    const weeks = weeklyFigures(ids.studio, ids.zoe, "2026-W46", "2026-W49");
    expect(weeks.map((w) => w.week)).toEqual(["2026-W46", "2026-W47", "2026-W48", "2026-W49"]);
    expectWeek(weeks[1], NEW_YORK["2026-W47"]);
    expectWeek(weeks[2], NEW_YORK["2026-W48"]);
    // Weeks without takes have nothing to measure, not zeros that would drag a chart down.
    expect(weeks[0]).toMatchObject({
      takes: 0,
      practiceMinutes: 0,
      smoothness: null,
      score: null,
      accuracy: null,
      motionPerChange: null,
    });
  });

  it("stores each take's local week when it is saved: Monday 01:30 UTC is Sunday in New York", () => {
    const keys = db()
      .select({ at: takes.recordedAt, week: takes.weekKey })
      .from(takes)
      .where(eq(takes.studentId, ids.zoe))
      .all();
    expect(keys.find((k) => k.at.toISOString() === "2026-11-23T01:30:00.000Z")?.week).toBe("2026-W47");
  });

  it("recomputes every week key when the studio's time zone changes", () => {
    expect(setStudioTimeZone(ids.studio, "UTC")).toBe(1); // only the Monday 01:30 take moves
    const weeks = weeklyFigures(ids.studio, ids.zoe, "2026-W47", "2026-W48");
    expectWeek(weeks[0], UTC["2026-W47"]);
    expectWeek(weeks[1], UTC["2026-W48"]);
    // And back: the figures return to the New York ones.
    setStudioTimeZone(ids.studio, "America/New_York");
    expectWeek(weeklyFigures(ids.studio, ids.zoe, "2026-W47", "2026-W47")[0], NEW_YORK["2026-W47"]);
    expect(() => setStudioTimeZone(ids.studio, "Mars/Olympus_Mons")).toThrow(/Unknown time zone/);
  });
});

describe("CSV export", () => {
  const url = "/api/export/progress.csv?from=2026-11-16&to=2026-11-29";

  it("parses back with csv-parse (7.0.3) to the same numbers: names first, headers in words, the id last", async () => {
    const result = await ask<string>(get(url, jars.teacher));
    expect(result.status).toBe(200);
    expect(result.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(result.headers.get("content-disposition")).toBe(
      'attachment; filename="nearnote-progress-2026-11-16-to-2026-11-29.csv"',
    );
    const text = result.data;
    expect(text.charCodeAt(0)).not.toBe(0xfeff); // plain UTF-8, no byte-order mark
    // RFC 4180: fields with commas or quotes are quoted, inner quotes doubled, CRLF line ends.
    expect(text).toContain('"Zoë ""Ace"" Åkesson, Jr."');
    expect(text.split("\r\n").length).toBe(1 + 2 * 2 + 1); // header, 2 students × 2 weeks, final CRLF
    const table: string[][] = parse(text);
    expect(table[0][0]).toBe("Student");
    expect(table[0].at(-1)).toBe("Student ID");
    // Headers a person reads: words and spaces, no snake_case.
    for (const header of table[0]) expect(header).not.toMatch(/_/);
    const records: Record<string, string>[] = parse(text, { columns: true });
    expect(records.map((r) => [r.Student, r["Week starting"]])).toEqual([
      [BJORN, "2026-11-16"],
      [BJORN, "2026-11-23"],
      [ZOE, "2026-11-16"],
      [ZOE, "2026-11-23"],
    ]);
    for (const [i, week] of (["2026-W47", "2026-W48"] as const).entries()) {
      const r = records[2 + i];
      const w = NEW_YORK[week];
      expect(r["Student ID"]).toBe(ids.zoe);
      expect(r["ISO week"]).toBe(week);
      // Counts and whole numbers as written; percentages as whole percents; two ratios to one decimal.
      expect(r.Takes).toBe(String(w.takes));
      expect(r["Practice minutes"]).toBe(String(Math.round(w.practiceMinutes)));
      expect(r["Chord changes"]).toBe(String(w.changes));
      expect(r["Mean score"]).toBe(String(Math.round(w.score)));
      expect(r["Smoothness %"]).toBe(String(Math.round(w.smoothness * 100)));
      expect(r["Accuracy %"]).toBe(String(Math.round(w.accuracy * 100)));
      expect(r["Motion per change (semitones)"]).toBe(w.motionPerChange.toFixed(1));
      expect(r["Root-position leaps per 10 changes"]).toBe((Math.round(w.leapsPer10 * 10) / 10).toFixed(1));
      expect(r["Inversions (changes)"]).toBe(String(w.techniques.inversion));
      expect(r["Open voicings (changes)"]).toBe(String(w.techniques["open-voicing"]));
      expect(r["Another tone in the bass (changes)"]).toBe(String(w.techniques["slash-bass"]));
    }
    // Week 47 by hand for Zoë: 230 / 3 = 76.67 → 77; smoothness 0.84 → 84; accuracy 0.75 → 75; leaps 0.75 → 0.8.
    expect(records[2]).toMatchObject({
      "Mean score": "77",
      "Smoothness %": "84",
      "Accuracy %": "75",
      "Root-position leaps per 10 changes": "0.8",
      "Practice minutes": "6",
    });
    // Björn's week 47 has no takes: counts are 0 and ratios blank.
    expect(records[0]).toMatchObject({ Takes: "0", "Smoothness %": "", "Mean score": "" });
    // Björn's week 48 by hand: 8 / 16 = 50 % smooth, 10 × 4 / 8 = 5.0 leaps per 10, 16 / 8 = 2.0 per change, 90 s → 2 minutes.
    expect(records[1]).toMatchObject({
      Takes: "1",
      "Smoothness %": "50",
      "Root-position leaps per 10 changes": "5.0",
      "Motion per change (semitones)": "2.0",
      "Practice minutes": "2",
      "Accuracy %": "",
    });
  });

  it("has no rows for weeks that have not happened yet", async () => {
    const thisWeek = weekKey(new Date(), "America/New_York");
    // Ten weeks past today: the range asks for weeks still to come.
    const later = new Date(Date.now() + 70 * 86_400_000).toISOString().slice(0, 10);
    const records: Record<string, string>[] = parse(
      (await ask<string>(get(`/api/export/progress.csv?from=2026-11-16&to=${later}`, jars.teacher))).data,
      { columns: true },
    );
    const weeks = [...new Set(records.map((r) => r["ISO week"]))];
    expect(weeks[0]).toBe("2026-W47");
    expect(weeks.at(-1)).toBe(thisWeek);
    expect(weeks.every((w) => w <= thisWeek)).toBe(true);
    expect(records.length).toBe(2 * weeks.length);
    // A range wholly in the future has the header and nothing else.
    const future: string[][] = parse(
      (await ask<string>(get("/api/export/progress.csv?from=2099-01-05&to=2099-02-01", jars.teacher))).data,
    );
    expect(future.length).toBe(1);
  });

  it("exports only the chosen students, and refuses a bad or missing range with 400", async () => {
    const one = await ask<string>(get(`${url}&student=${ids.zoe}`, jars.teacher));
    expect((parse(one.data, { columns: true }) as unknown[]).length).toBe(2);
    expect((await ask(get("/api/export/progress.csv", jars.teacher))).status).toBe(400);
    expect((await ask(get("/api/export/progress.csv?from=2026-12-01&to=2026-11-01", jars.teacher))).status).toBe(400);
    expect((await ask(get("/api/export/progress.csv?from=2026-02-30&to=2026-03-01", jars.teacher))).status).toBe(400);
  });

  it("keeps a name that looks like a formula as text", async () => {
    db().update(users).set({ name: "=SUM(A1:A9)" }).where(eq(users.id, ids.bjorn)).run();
    const records: Record<string, string>[] = parse((await ask<string>(get(url, jars.teacher))).data, {
      columns: true,
    });
    expect(records[0].Student).toBe("'=SUM(A1:A9)");
  });

  it("is refused to a student (403) and to another studio's teacher naming our students (403)", async () => {
    const asStudent = await ask(get(url, jars.student));
    expect(asStudent.status).toBe(403);
    const asOther = await ask(get(`${url}&student=${ids.zoe}`, jars.otherTeacher));
    expect(asOther.status).toBe(403);
    expect(asOther.data).toEqual({ error: expect.any(String) });
    // Without naming anyone, the other teacher gets their own (empty) studio, never ours.
    const own = await ask(get(url, jars.otherTeacher));
    expect(own.status).toBe(200);
    expect(own.data).not.toContain(ids.zoe);
    expect((await ask(get(url))).status).toBe(401);
  });
});

describe("chart API", () => {
  it("returns one series per chosen student with the chosen metric per week", async () => {
    const result = await ask<{
      metric: string;
      weeks: string[];
      series: { studentId: string; values: (number | null)[] }[];
    }>(
      get(
        `/api/progress?metric=smoothness&from=2026-11-16&to=2026-11-29&student=${ids.zoe}&student=${ids.bjorn}`,
        jars.teacher,
      ),
    );
    expect(result.status).toBe(200);
    const body = result.data;
    expect(body.metric).toBe("smoothness");
    expect(body.weeks).toEqual(["2026-W47", "2026-W48"]);
    const byId = Object.fromEntries(body.series.map((s) => [s.studentId, s.values]));
    expect(byId[ids.zoe][0]).toBeCloseTo(0.84, 9);
    expect(byId[ids.zoe][1]).toBe(1);
    expect(byId[ids.bjorn]).toEqual([null, 0.5]);
  });

  it("refuses unknown metrics (400), students (403) and other studios' teachers (403)", async () => {
    expect((await ask(get("/api/progress?metric=shoe-size", jars.teacher))).status).toBe(400);
    expect((await ask(get("/api/progress", jars.student))).status).toBe(403);
    expect((await ask(get(`/api/progress?student=${ids.zoe}`, jars.otherTeacher))).status).toBe(403);
  });
});
