// What a teacher's home page says about the week: who has not practised, who
// dropped, which takes are new since the last visit, what falls due in the next
// seven days, and, for a new studio, the first steps still to take.
import { and, count, desc, eq, gt, isNull } from "drizzle-orm";
import { db } from "~/db/client.server";
import { exercises, invitations, memberships, studioVisits, takes, users } from "~/db/schema";
import { boardRows, type StatusComparison } from "./board.server";
import { listExercisesForTeacher } from "./exercises.server";
import { studioTimeZone } from "./progress.server";
import { todayIn } from "./progressQuery.server";

/** A reload within this time belongs to the same sitting and keeps its "since". */
export const SITTING_MS = 30 * 60_000;
/** How far ahead "due soon" looks, in days. */
export const DUE_WINDOW_DAYS = 7;
/** How many new takes home lists by name; the rest are counted. */
const NEW_TAKES_SHOWN = 5;

/**
 * Records this visit and answers the instant "new since your last visit" counts
 * from: the previous sitting's visit, or null on a first visit.
 */
export function recordHomeVisit(userId: string, studioId: string, now = new Date()): Date | null {
  return db().transaction((tx) => {
    const row = tx
      .select()
      .from(studioVisits)
      .where(and(eq(studioVisits.userId, userId), eq(studioVisits.studioId, studioId)))
      .get();
    if (!row) {
      tx.insert(studioVisits).values({ userId, studioId, lastVisitAt: now, sinceAt: null }).run();
      return null;
    }
    const newSitting = now.getTime() - row.lastVisitAt.getTime() > SITTING_MS;
    const sinceAt = newSitting ? row.lastVisitAt : row.sinceAt;
    tx.update(studioVisits)
      .set({ lastVisitAt: now, sinceAt })
      .where(and(eq(studioVisits.userId, userId), eq(studioVisits.studioId, studioId)))
      .run();
    return sinceAt;
  });
}

/**
 * New takes of the studio, newest played first: those that arrived after
 * `since` (the last visit), or, before there is one, those played in the week
 * up to `now`.
 */
function newTakes(studioId: string, since: Date | null, now: Date) {
  const where = and(
    eq(takes.studioId, studioId),
    since ? gt(takes.createdAt, since) : gt(takes.recordedAt, new Date(now.getTime() - DUE_WINDOW_DAYS * 86_400_000)),
  );
  const total = db().select({ n: count() }).from(takes).where(where).get()?.n ?? 0;
  const latest = db()
    .select({ id: takes.id, recordedAt: takes.recordedAt, studentName: users.name, exerciseTitle: exercises.title })
    .from(takes)
    .innerJoin(users, eq(users.id, takes.studentId))
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .where(where)
    .orderBy(desc(takes.recordedAt), desc(takes.createdAt))
    .limit(NEW_TAKES_SHOWN)
    .all()
    .map((t) => ({ ...t, recordedAt: t.recordedAt.toISOString() }));
  return { total, latest };
}

/** YYYY-MM-DD plus n days (calendar arithmetic, no time zone involved). */
function addDays(isoDate: string, n: number): string {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
}

export type FirstRunStep = { id: "confirm-email" | "invite-students" | "set-exercise"; done: boolean };

/** The three first steps of a studio, each ticked off by what is really in the database. */
export function firstRunSteps(studioId: string, teacher: { emailVerified: boolean }): FirstRunStep[] {
  const students =
    db()
      .select({ n: count() })
      .from(memberships)
      .where(and(eq(memberships.studioId, studioId), eq(memberships.role, "student")))
      .get()?.n ?? 0;
  const invited =
    db()
      .select({ n: count() })
      .from(invitations)
      .where(and(eq(invitations.studioId, studioId), eq(invitations.role, "student"), isNull(invitations.revokedAt)))
      .get()?.n ?? 0;
  const exerciseCount =
    db().select({ n: count() }).from(exercises).where(eq(exercises.studioId, studioId)).get()?.n ?? 0;
  return [
    { id: "confirm-email", done: teacher.emailVerified },
    { id: "invite-students", done: students + invited > 0 },
    { id: "set-exercise", done: exerciseCount > 0 },
  ];
}

export type WeekStudent = { id: string; name: string; lastTakeAt: string | null; compare?: StatusComparison };

/**
 * Everything the teacher's home shows, for the studio's current week. Records
 * the visit, so call it once per page view.
 */
export function teacherWeek(studioId: string, teacher: { id: string; emailVerified: boolean }, now = new Date()) {
  const timeZone = studioTimeZone(studioId);
  const since = recordHomeVisit(teacher.id, studioId, now);
  const { rows } = boardRows(studioId, now);
  const today = todayIn(timeZone, now);
  const until = addDays(today, DUE_WINDOW_DAYS);
  const dueSoon = listExercisesForTeacher(studioId)
    .filter((e) => !e.archived && e.dueDate !== null && e.dueDate >= today && e.dueDate <= until)
    .map((e) => ({ id: e.id, title: e.title, dueDate: e.dueDate!, setFor: e.setFor, handedIn: e.handedIn }));
  const steps = firstRunSteps(studioId, teacher);
  return {
    timeZone,
    today,
    until,
    since: since?.toISOString() ?? null,
    students: rows.length,
    notPractised: rows
      .filter((r) => r.thisWeek.takes === 0)
      .map((r): WeekStudent => ({ id: r.studentId, name: r.name, lastTakeAt: r.lastTakeAt })),
    dropped: rows
      .filter((r) => r.status === "slipping")
      .map((r): WeekStudent => ({ id: r.studentId, name: r.name, lastTakeAt: r.lastTakeAt, compare: r.compare })),
    newTakes: newTakes(studioId, since, now),
    dueSoon,
    firstRun: steps.every((s) => s.done) ? null : steps,
  };
}
export type TeacherWeek = ReturnType<typeof teacherWeek>;
