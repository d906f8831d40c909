// Weekly figures per student, aggregated in SQL over take rows and their one
// take_metrics row each; chord and change rows are never read here, so the board
// stays fast however long the takes are.
import { and, asc, eq, gte, inArray, isNotNull, lte, max, sql } from "drizzle-orm";
import type { TechniqueName } from "~/analysis/types";
import { db, preparedQuery } from "~/db/client.server";
import { exercises, memberships, studios, takeMetrics, takes, users } from "~/db/schema";
import {
  combineSums,
  EMPTY_SUMS,
  figuresFrom,
  weeksBetween,
  type Figures,
  type WeekSums,
} from "~/utils/progressFigures";
import { weekKey } from "~/utils/weeks";

export type StudentRef = { id: string; name: string; email: string };
export type SumsFilter = { fromWeek: string; toWeek: string; studentIds?: string[] };

/** Active students of a studio, by name. */
export function studioStudents(studioId: string): StudentRef[] {
  return db()
    .select({ id: users.id, name: users.name, email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.studioId, studioId), eq(memberships.role, "student"), eq(memberships.status, "active")))
    .orderBy(asc(users.name))
    .all();
}

const timeZoneQuery = preparedQuery((database) =>
  database
    .select({ tz: studios.timeZone })
    .from(studios)
    .where(eq(studios.id, sql.placeholder("studioId")))
    .prepare(),
);

export function studioTimeZone(studioId: string): string {
  return timeZoneQuery().get({ studioId })?.tz ?? "UTC";
}

/** The studio's current week, in its own time zone. */
export function currentWeek(studioId: string, now = new Date()): string {
  return weekKey(now, studioTimeZone(studioId));
}

function takeFilter(studioId: string, f: SumsFilter) {
  return and(
    eq(takes.studioId, studioId),
    gte(takes.weekKey, f.fromWeek),
    lte(takes.weekKey, f.toWeek),
    f.studentIds ? inArray(takes.studentId, f.studentIds) : undefined,
  );
}

/**
 * Sums per (student, group) where group is the week key or the exercise id.
 * Failed takes have no metric row: the left join keeps them in `takes` only.
 */
function sumsBy(studioId: string, f: SumsFilter, by: "week" | "exercise") {
  const group = by === "week" ? takes.weekKey : takes.exerciseId;
  const m = takeMetrics;
  const rows = db()
    .select({
      studentId: takes.studentId,
      group,
      takes: sql<number>`count(*)`,
      analysed: sql<number>`count(${m.takeId})`,
      durationSec: sql<number>`coalesce(sum(case when ${m.takeId} is not null then ${takes.durationSec} end), 0)`,
      changes: sql<number>`coalesce(sum(${m.changeCount}), 0)`,
      totalMotion: sql<number>`coalesce(sum(${m.totalMotion}), 0)`,
      bestTotalMotion: sql<number>`coalesce(sum(${m.bestTotalMotion}), 0)`,
      leaps: sql<number>`coalesce(sum(${m.rootPositionLeaps}), 0)`,
      scoreSum: sql<number>`coalesce(sum(${m.score}), 0)`,
      accuracySum: sql<number>`coalesce(sum(case when ${takes.exerciseId} is not null then ${m.accuracy} end), 0)`,
      accuracyTakes: sql<number>`count(case when ${takes.exerciseId} is not null then ${m.accuracy} end)`,
    })
    .from(takes)
    .leftJoin(m, eq(m.takeId, takes.id))
    .where(takeFilter(studioId, f))
    .groupBy(takes.studentId, group)
    .all();
  // Technique counts live in a small JSON object per metric row; SQLite sums them in place.
  const techniqueRows = db().all<{ studentId: string; grp: string | null; name: TechniqueName; n: number }>(sql`
    select ${takes.studentId} as studentId, ${group} as grp, j.key as name, sum(j.value) as n
    from ${takes} join ${m} on ${m.takeId} = ${takes.id}, json_each(${m.techniques}) j
    where ${takeFilter(studioId, f)}
    group by 1, 2, 3`);
  const key = (studentId: string, g: string | null) => `${studentId}\u0000${g ?? ""}`;
  const out = new Map<string, { studentId: string; group: string | null; sums: WeekSums }>();
  for (const r of rows) {
    const { studentId, group: g, ...numbers } = r;
    out.set(key(studentId, g), { studentId, group: g, sums: { ...numbers, techniques: {} } });
  }
  for (const t of techniqueRows) {
    const entry = out.get(key(t.studentId, t.grp));
    if (entry && t.n) entry.sums.techniques[t.name] = t.n;
  }
  return [...out.values()];
}

export type StudentWeeks = { studentId: string; weeks: Map<string, WeekSums> };

/** Sums of each student's weeks in the range; weeks without takes are simply absent. */
export function weeklySums(studioId: string, f: SumsFilter): Map<string, Map<string, WeekSums>> {
  const byStudent = new Map<string, Map<string, WeekSums>>();
  for (const r of sumsBy(studioId, f, "week")) {
    if (!byStudent.has(r.studentId)) byStudent.set(r.studentId, new Map());
    byStudent.get(r.studentId)!.set(r.group!, r.sums);
  }
  return byStudent;
}

export type WeekFigures = Figures & { week: string };

/** One student's figures for every week of the range, empty weeks included. */
export function weeklyFigures(studioId: string, studentId: string, fromWeek: string, toWeek: string): WeekFigures[] {
  const weeks = weeklySums(studioId, { fromWeek, toWeek, studentIds: [studentId] }).get(studentId) ?? new Map();
  return weeksBetween(fromWeek, toWeek).map((week) => ({ week, ...figuresFrom(weeks.get(week) ?? EMPTY_SUMS) }));
}

/** The whole range as one set of figures (ratios of the summed sums). */
export function periodFigures(studioId: string, studentId: string, fromWeek: string, toWeek: string): Figures {
  const weeks = weeklySums(studioId, { fromWeek, toWeek, studentIds: [studentId] }).get(studentId) ?? new Map();
  return figuresFrom(combineSums([...weeks.values()]));
}

export type ExerciseFigures = Figures & { exerciseId: string | null; title: string };

/** Figures per exercise over the range ("free practice" for takes without one). */
export function exerciseFigures(
  studioId: string,
  studentId: string,
  fromWeek: string,
  toWeek: string,
): ExerciseFigures[] {
  const rows = sumsBy(studioId, { fromWeek, toWeek, studentIds: [studentId] }, "exercise");
  const ids = rows.map((r) => r.group).filter((g): g is string => g !== null);
  const titles = new Map(
    ids.length
      ? db()
          .select({ id: exercises.id, title: exercises.title })
          .from(exercises)
          .where(inArray(exercises.id, ids))
          .all()
          .map((e) => [e.id, e.title])
      : [],
  );
  return rows
    .map((r) => ({
      exerciseId: r.group,
      title: r.group ? (titles.get(r.group) ?? "Exercise") : "Free practice",
      ...figuresFrom(r.sums),
    }))
    .sort((a, b) => (a.exerciseId === null ? 1 : b.exerciseId === null ? -1 : a.title.localeCompare(b.title)));
}

/** When each student last recorded a take in the studio (ISO string), any status. */
export function lastTakeDates(studioId: string, studentIds: string[]): Map<string, string> {
  if (studentIds.length === 0) return new Map();
  const rows = db()
    .select({ studentId: takes.studentId, last: max(takes.recordedAt) })
    .from(takes)
    .where(and(eq(takes.studioId, studioId), inArray(takes.studentId, studentIds), isNotNull(takes.recordedAt)))
    .groupBy(takes.studentId)
    .all();
  return new Map(
    rows.filter((r) => r.last).map((r) => [r.studentId, new Date(r.last as unknown as number).toISOString()]),
  );
}

/** Techniques first used in the period: used in it and never in any earlier week. */
export function techniquesGained(
  studioId: string,
  studentId: string,
  fromWeek: string,
  toWeek: string,
): TechniqueName[] {
  const before = weeklySums(studioId, {
    fromWeek: "0000-W01",
    toWeek: weeksBefore(fromWeek),
    studentIds: [studentId],
  }).get(studentId);
  const earlier = combineSums([...(before?.values() ?? [])]).techniques;
  const during = figuresFrom(
    combineSums([
      ...(weeklySums(studioId, { fromWeek, toWeek, studentIds: [studentId] })
        .get(studentId)
        ?.values() ?? []),
    ]),
  ).techniques;
  return (Object.keys(during) as TechniqueName[]).filter((t) => during[t] > 0 && !(earlier[t] ?? 0));
}

/** The key just before `week` in text order (week keys compare as text). */
function weeksBefore(week: string): string {
  return `${week.slice(0, 6)}${String(Number(week.slice(6)) - 1).padStart(2, "0")}`;
}
