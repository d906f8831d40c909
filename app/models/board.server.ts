// What the progress board, its chart API and the CSV export read: one query of
// week sums per request, shaped three ways.
import { and, asc, eq, inArray } from "drizzle-orm";
import { db } from "~/db/client.server";
import { practiceReminders, users } from "~/db/schema";
import {
  combineSums,
  EMPTY_SUMS,
  figuresFrom,
  metricValue,
  shiftWeek,
  weeksBetween,
  type Figures,
  type MetricId,
  type WeekSums,
} from "~/utils/progressFigures";
import { currentWeek, lastTakeDates, studioStudents, weeklySums, type StudentRef } from "./progress.server";

export const TREND_WEEKS = 8;

/**
 * What a teacher scans for first. "improving", "level" and "slipping" compare two
 * mean scores (see `StatusComparison`); "stopped" is a student with takes before
 * but none this week, "new" one without any take, "early" one who practised this
 * week but has no earlier weeks to compare with.
 */
export type StudentStatus = "improving" | "level" | "slipping" | "stopped" | "new" | "early";

/** Weeks on each side of the status comparison. */
export const STATUS_WEEKS = 3;
/** Whole score points the two means must differ by before the status says "improving" or "slipping". */
export const STATUS_BAND = 3;

/**
 * The two figures a trend status rests on, rounded as the board prints them:
 * the mean score of the last three weeks (this one included) and of the three
 * before. Null: no analysed take in those weeks.
 */
export type StatusComparison = { before: number | null; recent: number | null };

export type BoardRow = {
  studentId: string;
  name: string;
  email: string;
  thisWeek: Figures;
  lastWeek: Figures;
  /** Mean score of each of the last TREND_WEEKS weeks, oldest first (null: no analysed take). */
  trend: (number | null)[];
  status: StudentStatus;
  /** The mean scores the status compares (three weeks before → last three weeks). */
  compare: StatusComparison;
  lastTakeAt: string | null;
  remindedThisWeek: boolean;
};

/**
 * A student's status for the week `thisWeek` and the figures it compares. A
 * student with no take this week gets no trend status, whatever older weeks
 * say, so the status never contradicts an empty row. The decision uses the
 * rounded means the page shows, so "78 → 76" can never read "slipping". The
 * 3-point band is our own choice: smaller moves are week-to-week noise.
 */
export function studentStatus(
  weeks: Map<string, WeekSums>,
  thisWeek: string,
  hasEarlierTakes = weeks.size > 0,
): { status: StudentStatus; compare: StatusComparison } {
  const at = (n: number) => weeks.get(shiftWeek(thisWeek, -n)) ?? EMPTY_SUMS;
  const mean = (from: number) => {
    const score = figuresFrom(combineSums(Array.from({ length: STATUS_WEEKS }, (_, i) => at(from + i)))).score;
    return score === null ? null : Math.round(score);
  };
  const compare = { recent: mean(0), before: mean(STATUS_WEEKS) };
  if (at(0).takes === 0) return { status: hasEarlierTakes ? "stopped" : "new", compare };
  if (compare.recent === null || compare.before === null) return { status: "early", compare };
  const diff = compare.recent - compare.before;
  return { status: diff >= STATUS_BAND ? "improving" : diff <= -STATUS_BAND ? "slipping" : "level", compare };
}

/**
 * The board for one week (the studio's current week unless another is chosen):
 * each student's figures that week against the week before, trend and status
 * up to it.
 */
export function boardRows(
  studioId: string,
  now = new Date(),
  chosenWeek?: string,
): { week: string; current: string; rows: BoardRow[] } {
  const current = currentWeek(studioId, now);
  const week = chosenWeek ?? current;
  const students = studioStudents(studioId);
  const fromWeek = shiftWeek(week, -(TREND_WEEKS - 1));
  const sums = weeklySums(studioId, { fromWeek, toWeek: week });
  const last = lastTakeDates(
    studioId,
    students.map((s) => s.id),
  );
  const reminded = remindedStudentIds(
    studioId,
    week,
    students.map((s) => s.id),
  );
  const trendWeeks = weeksBetween(fromWeek, week);
  const rows = students.map((s) => {
    const weeks = sums.get(s.id) ?? new Map<string, WeekSums>();
    const fig = (w: string) => figuresFrom(weeks.get(w) ?? EMPTY_SUMS);
    const { status, compare } = studentStatus(weeks, week, last.has(s.id));
    return {
      studentId: s.id,
      name: s.name,
      email: s.email,
      thisWeek: fig(week),
      lastWeek: fig(shiftWeek(week, -1)),
      trend: trendWeeks.map((w) => fig(w).score),
      status,
      compare,
      lastTakeAt: last.get(s.id) ?? null,
      remindedThisWeek: reminded.has(s.id),
    };
  });
  return { week, current, rows };
}

export type ChartData = {
  metric: MetricId;
  weeks: string[];
  series: { studentId: string; name: string; values: (number | null)[] }[];
};

/** One line per chosen student: the metric for each week of the range (null: nothing to measure). */
export function chartData(
  studioId: string,
  metric: MetricId,
  students: StudentRef[],
  fromWeek: string,
  toWeek: string,
): ChartData {
  const weeks = weeksBetween(fromWeek, toWeek);
  const sums = weeklySums(studioId, { fromWeek, toWeek, studentIds: students.map((s) => s.id) });
  return {
    metric,
    weeks,
    series: students.map((s) => ({
      studentId: s.id,
      name: s.name,
      values: weeks.map((w) => metricValue(figuresFrom(sums.get(s.id)?.get(w) ?? EMPTY_SUMS), metric)),
    })),
  };
}

/**
 * Every (student, week) pair of the range with its figures, students by name,
 * weeks in order. Weeks after `lastWeek` (the studio's current week) have not
 * happened yet and are left out.
 */
export function exportRows(
  studioId: string,
  students: StudentRef[],
  fromWeek: string,
  toWeek: string,
  lastWeek = currentWeek(studioId),
) {
  const end = toWeek < lastWeek ? toWeek : lastWeek;
  if (end < fromWeek) return [];
  const weeks = weeksBetween(fromWeek, end);
  const sums = weeklySums(studioId, { fromWeek, toWeek: end, studentIds: students.map((s) => s.id) });
  return students.flatMap((s) =>
    weeks.map((week) => ({ student: s, week, figures: figuresFrom(sums.get(s.id)?.get(week) ?? EMPTY_SUMS) })),
  );
}

/** Students read together for one stretch of the streamed export. */
export const EXPORT_BATCH = 50;

/**
 * The export's rows a few students at a time, in the same order as `exportRows`
 * (students by name, weeks in order): each batch is read from the database only
 * when the one before has been sent, so a long export is never held whole in memory.
 */
export function* exportRowBatches(
  studioId: string,
  students: StudentRef[],
  fromWeek: string,
  toWeek: string,
  lastWeek = currentWeek(studioId),
  batchSize = EXPORT_BATCH,
) {
  for (let i = 0; i < students.length; i += batchSize) {
    yield exportRows(studioId, students.slice(i, i + batchSize), fromWeek, toWeek, lastWeek);
  }
}

/** The chosen students (access already checked), or every active student when none is named. */
export function pickStudents(studioId: string, ids: string[]): StudentRef[] {
  if (ids.length === 0) return studioStudents(studioId);
  return db()
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(inArray(users.id, ids))
    .orderBy(asc(users.name))
    .all();
}

/** Which of these students were sent a practice reminder in the studio week `week`. */
export function remindedStudentIds(studioId: string, week: string, ids: string[]): Set<string> {
  if (!ids.length) return new Set();
  return new Set(
    db()
      .select({ id: practiceReminders.studentId })
      .from(practiceReminders)
      .where(
        and(
          eq(practiceReminders.studioId, studioId),
          eq(practiceReminders.weekKey, week),
          inArray(practiceReminders.studentId, ids),
        ),
      )
      .all()
      .map((r) => r.id),
  );
}
