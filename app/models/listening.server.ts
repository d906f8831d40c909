// The list of takes to listen to: the studio's takes no teacher has marked as
// heard yet, filtered by student and exercise, paged on the server, and marked
// heard one or many at a time.
import { and, asc, count, desc, eq, inArray, isNull, type SQL } from "drizzle-orm";
import { z } from "zod";
import { db } from "~/db/client.server";
import { exercises, memberships, takeMetrics, takeReviews, takes, users } from "~/db/schema";

export const LISTENING_PAGE_SIZE = 25;
/** How many takes one "mark as heard" may carry: one page's worth and then some. */
export const MAX_MARKED_AT_ONCE = 100;

export const LISTENING_SORTS = ["newest", "oldest", "arrived"] as const;
export type ListeningSort = (typeof LISTENING_SORTS)[number];
/** "free" stands for takes recorded without an exercise. */
export const FREE_PRACTICE = "free";

export const listeningQuerySchema = z.object({
  student: z.string().min(1).max(100).optional().catch(undefined),
  exercise: z.string().min(1).max(100).optional().catch(undefined),
  sort: z.enum(LISTENING_SORTS).catch("newest"),
  page: z.coerce.number().int().min(1).max(10_000).catch(1),
});
export type ListeningQuery = z.infer<typeof listeningQuerySchema>;

/** Reads the list's search params; a bad value falls back to its default rather than an error. */
export function readListeningQuery(params: URLSearchParams): ListeningQuery {
  return listeningQuerySchema.parse({
    student: params.get("student") || undefined,
    exercise: params.get("exercise") || undefined,
    sort: params.get("sort") ?? undefined,
    page: params.get("page") ?? undefined,
  });
}

function waiting(studioId: string, q: Pick<ListeningQuery, "student" | "exercise">): SQL {
  return and(
    eq(takes.studioId, studioId),
    isNull(takeReviews.takeId),
    q.student ? eq(takes.studentId, q.student) : undefined,
    q.exercise === FREE_PRACTICE ? isNull(takes.exerciseId) : q.exercise ? eq(takes.exerciseId, q.exercise) : undefined,
  )!;
}

const ORDER: Record<ListeningSort, SQL[]> = {
  // Newest by when it was played; the arrival time and id break ties so pages never overlap.
  newest: [desc(takes.recordedAt), desc(takes.createdAt), asc(takes.id)],
  oldest: [asc(takes.recordedAt), asc(takes.createdAt), asc(takes.id)],
  arrived: [desc(takes.createdAt), desc(takes.recordedAt), asc(takes.id)],
};

export type ListeningRow = {
  id: string;
  recordedAt: string;
  createdAt: string;
  studentId: string;
  studentName: string;
  exerciseTitle: string | null;
  key: string | null;
  status: string;
  score: number | null;
  flags: Record<string, number> | null;
};

/** One page of the list, with the total the filters leave and the page actually shown. */
export function listeningPage(studioId: string, q: ListeningQuery, pageSize = LISTENING_PAGE_SIZE) {
  const where = waiting(studioId, q);
  const total =
    db().select({ n: count() }).from(takes).leftJoin(takeReviews, eq(takeReviews.takeId, takes.id)).where(where).get()
      ?.n ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const page = Math.min(q.page, pages);
  const rows: ListeningRow[] = db()
    .select({
      id: takes.id,
      recordedAt: takes.recordedAt,
      createdAt: takes.createdAt,
      studentId: takes.studentId,
      studentName: users.name,
      exerciseTitle: exercises.title,
      key: takes.key,
      status: takes.status,
      score: takeMetrics.score,
      flags: takeMetrics.flags,
    })
    .from(takes)
    .innerJoin(users, eq(users.id, takes.studentId))
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .leftJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
    .leftJoin(takeReviews, eq(takeReviews.takeId, takes.id))
    .where(where)
    .orderBy(...ORDER[q.sort])
    .limit(pageSize)
    .offset((page - 1) * pageSize)
    .all()
    .map((r) => ({
      ...r,
      recordedAt: r.recordedAt.toISOString(),
      createdAt: r.createdAt.toISOString(),
      flags: r.flags as Record<string, number> | null,
    }));
  return { rows, total, page, pages, pageSize };
}

/** The choices of the two filters: the studio's students (active or not, if they have takes) and its exercises. */
export function listeningFilters(studioId: string) {
  const students = db()
    .selectDistinct({ id: users.id, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.studioId, studioId), eq(memberships.role, "student")))
    .orderBy(asc(users.name))
    .all();
  const exerciseList = db()
    .select({ id: exercises.id, title: exercises.title })
    .from(exercises)
    .where(eq(exercises.studioId, studioId))
    .orderBy(asc(exercises.title))
    .all();
  return { students, exercises: exerciseList };
}

/**
 * Marks these takes as heard by this teacher ("review") or puts them back on the
 * list ("unreview"). Only takes of `studioId` are touched: an id from another
 * studio is skipped, never marked. Returns how many takes changed.
 */
export function markHeard(
  intent: "review" | "unreview",
  takeIds: readonly string[],
  teacherId: string,
  studioId: string,
  at = new Date(),
): number {
  const ids = [...new Set(takeIds)].slice(0, MAX_MARKED_AT_ONCE);
  if (!ids.length) return 0;
  return db().transaction((tx) => {
    const ours = tx
      .select({ id: takes.id })
      .from(takes)
      .where(and(eq(takes.studioId, studioId), inArray(takes.id, ids)))
      .all()
      .map((r) => r.id);
    if (!ours.length) return 0;
    if (intent === "review") {
      return tx
        .insert(takeReviews)
        .values(ours.map((takeId) => ({ takeId, reviewedById: teacherId, reviewedAt: at })))
        .onConflictDoNothing()
        .run().changes;
    }
    return tx.delete(takeReviews).where(inArray(takeReviews.takeId, ours)).run().changes;
  });
}
