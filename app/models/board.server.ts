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
} from "~/lib/progressFigures";
import { currentWeek, lastTakeDates, studioStudents, weeklySums, type StudentRef } from "./progress.server";

export const TREND_WEEKS = 8;

/** Improving, holding level, slipping, or not practising: what a teacher scans for first. */
export type StudentStatus = "improving" | "level" | "slipping" | "stopped" | "new";

export type BoardRow = {
  studentId: string;
  name: string;
  email: string;
  thisWeek: Figures;
  lastWeek: Figures;
  /** Mean score of each of the last TREND_WEEKS weeks, oldest first (null: no analysed take). */
  trend: (number | null)[];
  status: StudentStatus;
  lastTakeAt: string | null;
  remindedThisWeek: boolean;
};

/**
 * Compares the mean score of the last three weeks with the three before (sums,
 * not means of means). Two silent weeks in a row read as "stopped". The 3-point
 * band is our own choice: smaller moves are week-to-week noise in the demo data.
 */
export function studentStatus(weeks: Map<string, WeekSums>, thisWeek: string): StudentStatus {
  const at = (n: number) => weeks.get(shiftWeek(thisWeek, -n)) ?? EMPTY_SUMS;
  if (at(0).takes === 0 && at(1).takes === 0) return weeks.size ? "stopped" : "new";
  const recent = figuresFrom(combineSums([at(0), at(1), at(2)])).score;
  const before = figuresFrom(combineSums([at(3), at(4), at(5)])).score;
  if (recent === null || before === null) return "level";
  if (recent - before >= 3) return "improving";
  if (before - recent >= 3) return "slipping";
  return "level";
}

/**
 * The board for one week (the studio's current week unless another is chosen):
 * each student's figures that week against the week before, trend and status
 * up to it.
 */
export function boardRows(studioId: string, now = new Date(), chosenWeek?: string): { week: string; current: string; rows: BoardRow[] } {
  const current = currentWeek(studioId, now);
  const week = chosenWeek ?? current;
  const students = studioStudents(studioId);
  const fromWeek = shiftWeek(week, -(TREND_WEEKS - 1));
  const sums = weeklySums(studioId, { fromWeek, toWeek: week });
  const last = lastTakeDates(studioId, students.map((s) => s.id));
  const reminded = remindedStudentIds(studioId, week, students.map((s) => s.id));
  const trendWeeks = weeksBetween(fromWeek, week);
  const rows = students.map((s) => {
    const weeks = sums.get(s.id) ?? new Map<string, WeekSums>();
    const fig = (w: string) => figuresFrom(weeks.get(w) ?? EMPTY_SUMS);
    return {
      studentId: s.id,
      name: s.name,
      email: s.email,
      thisWeek: fig(week),
      lastWeek: fig(shiftWeek(week, -1)),
      trend: trendWeeks.map((w) => fig(w).score),
      status: studentStatus(weeks, week),
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
export function chartData(studioId: string, metric: MetricId, students: StudentRef[], fromWeek: string, toWeek: string): ChartData {
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

/** Every (student, week) pair of the range with its figures, students by name, weeks in order. */
export function exportRows(studioId: string, students: StudentRef[], fromWeek: string, toWeek: string) {
  const weeks = weeksBetween(fromWeek, toWeek);
  const sums = weeklySums(studioId, { fromWeek, toWeek, studentIds: students.map((s) => s.id) });
  return students.flatMap((s) => weeks.map((week) => ({ student: s, week, figures: figuresFrom(sums.get(s.id)?.get(week) ?? EMPTY_SUMS) })));
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
      .where(and(eq(practiceReminders.studioId, studioId), eq(practiceReminders.weekKey, week), inArray(practiceReminders.studentId, ids)))
      .all()
      .map((r) => r.id),
  );
}
