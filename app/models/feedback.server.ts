import { and, desc, eq, gt, isNull, ne, or, sql } from "drizzle-orm";
import { z } from "zod";
import { CHANGE_FLAGS, CHORD_FLAGS } from "~/analysis/types";
import { db, preparedQuery } from "~/db/client.server";
import {
  commentReads,
  comments,
  exercises,
  intendedFlags,
  memberships,
  takeMetrics,
  takeReviews,
  takes,
  users,
} from "~/db/schema";
import { applyIntendedFlags } from "./intendedFlags.server";
import { storedAnalysis } from "./takeAnalysis.server";

// Feedback on takes: comments (whole take or pinned to a change) and replies, who has read
// what, flags the teacher marks as intended, and which takes the teacher has reviewed.

export const commentSchema = z.object({
  body: z.string().trim().min(1, "Write something first.").max(4000, "Keep a comment under 4,000 characters."),
  changeIdx: z
    .string()
    .optional()
    .transform((v) => (v === undefined || v === "" ? null : Number(v)))
    .pipe(z.number().int().min(0).nullable()),
  parentId: z
    .string()
    .max(64)
    .optional()
    .transform((v) => v || null),
});

export const intendSchema = z.object({
  on: z.enum(["chord", "change"]),
  idx: z.coerce.number().int().min(0),
  flag: z.enum([...CHORD_FLAGS, ...CHANGE_FLAGS]),
  reason: z.string().trim().min(1, "Say why it was intended, e.g. “I asked for a jump here”.").max(300),
});

export class FeedbackRefused extends Error {}

function analysisOf(takeId: string) {
  return storedAnalysis(takeId);
}

/** Adds a comment or a reply; a reply to a reply joins the same thread. Returns the new comment's id. */
export function addComment(input: {
  takeId: string;
  authorId: string;
  body: string;
  changeIdx: number | null;
  parentId: string | null;
}): string {
  let { changeIdx, parentId } = input;
  // Only someone active in the take's studio may write on it (a removed student reads, never writes).
  const member = db()
    .select({ id: memberships.id })
    .from(takes)
    .innerJoin(
      memberships,
      and(
        eq(memberships.studioId, takes.studioId),
        eq(memberships.userId, input.authorId),
        eq(memberships.status, "active"),
      ),
    )
    .where(eq(takes.id, input.takeId))
    .get();
  if (!member)
    throw new FeedbackRefused("You are no longer a member of this take's studio, so you cannot write on it.");
  if (parentId) {
    const parent = db().select().from(comments).where(eq(comments.id, parentId)).get();
    if (!parent || parent.takeId !== input.takeId) throw new FeedbackRefused("That comment is not on this take.");
    parentId = parent.parentId ?? parent.id;
    changeIdx = parent.changeIdx;
  } else if (changeIdx !== null) {
    const analysis = analysisOf(input.takeId);
    if (!analysis || changeIdx >= analysis.changes.length) throw new FeedbackRefused("This take has no such change.");
  }
  return db()
    .insert(comments)
    .values({ takeId: input.takeId, authorId: input.authorId, body: input.body, changeIdx, parentId })
    .returning({ id: comments.id })
    .get().id;
}

/** A comment with its replies as the take page shows it (the component owns the shape). */
export type CommentView = CommentItem;

const lastReadQuery = preparedQuery((database) =>
  database
    .select()
    .from(commentReads)
    .where(and(eq(commentReads.userId, sql.placeholder("userId")), eq(commentReads.takeId, sql.placeholder("takeId"))))
    .prepare(),
);

export function lastRead(userId: string, takeId: string): Date | null {
  return lastReadQuery().get({ userId, takeId })?.readAt ?? null;
}

// An inserted value goes through its column (the Date becomes read_at's milliseconds).
const markReadQuery = preparedQuery((database) =>
  database
    .insert(commentReads)
    .values({ userId: sql.placeholder("userId"), takeId: sql.placeholder("takeId"), readAt: sql.placeholder("at") })
    // On a second visit the row keeps its place and takes the new time (`excluded` is the row offered).
    .onConflictDoUpdate({
      target: [commentReads.userId, commentReads.takeId],
      set: { readAt: sql.raw("excluded.read_at") },
    })
    .prepare(),
);

export function markRead(userId: string, takeId: string, at = new Date()) {
  markReadQuery().run({ userId, takeId, at });
}

const threadsQuery = preparedQuery((database) =>
  database
    .select({ c: comments, authorName: users.name })
    .from(comments)
    .innerJoin(users, eq(users.id, comments.authorId))
    .where(eq(comments.takeId, sql.placeholder("takeId")))
    .orderBy(comments.createdAt)
    .prepare(),
);

/** Threads on a take, oldest first, with what is new to `viewerId` marked unread. */
export function commentThreads(takeId: string, viewerId: string): CommentView[] {
  const readAt = lastRead(viewerId, takeId);
  const rows = threadsQuery().all({ takeId });
  const view = (r: (typeof rows)[number]): CommentView => ({
    id: r.c.id,
    authorId: r.c.authorId,
    authorName: r.authorName,
    body: r.c.body,
    changeIdx: r.c.changeIdx,
    createdAt: r.c.createdAt.toISOString(),
    unread: r.c.authorId !== viewerId && (readAt === null || r.c.createdAt > readAt),
    replies: [],
  });
  const top = rows.filter((r) => r.c.parentId === null).map(view);
  for (const r of rows) if (r.c.parentId) top.find((t) => t.id === r.c.parentId)?.replies.push(view(r));
  return top;
}

export type IntendedView = {
  id: string;
  on: "chord" | "change";
  idx: number;
  flag: string;
  reason: string;
  byName: string | null;
};

const intendedListQuery = preparedQuery((database) =>
  database
    .select({
      id: intendedFlags.id,
      on: intendedFlags.on,
      idx: intendedFlags.idx,
      flag: intendedFlags.flag,
      reason: intendedFlags.reason,
      byName: users.name,
    })
    .from(intendedFlags)
    .leftJoin(users, eq(users.id, intendedFlags.byId))
    .where(eq(intendedFlags.takeId, sql.placeholder("takeId")))
    .prepare(),
);

export function intendedFlagList(takeId: string): IntendedView[] {
  return intendedListQuery().all({ takeId });
}

function rescore(takeId: string) {
  const analysis = analysisOf(takeId);
  if (analysis) applyIntendedFlags(db(), takeId, analysis);
}

/** Marks a flag as intended and re-scores the take; refuses a flag the take does not carry there. */
export function markIntended(takeId: string, byId: string, mark: z.infer<typeof intendSchema>) {
  const analysis = analysisOf(takeId);
  const item = mark.on === "chord" ? analysis?.chords[mark.idx] : analysis?.changes[mark.idx];
  if (!item || !(item.flags as string[]).includes(mark.flag))
    throw new FeedbackRefused("This take has no such flag there.");
  db()
    .insert(intendedFlags)
    .values({ takeId, byId, ...mark })
    .onConflictDoUpdate({
      target: [intendedFlags.takeId, intendedFlags.on, intendedFlags.idx, intendedFlags.flag],
      set: { reason: mark.reason, byId },
    })
    .run();
  rescore(takeId);
}

export function unmarkIntended(takeId: string, markId: string) {
  db()
    .delete(intendedFlags)
    .where(and(eq(intendedFlags.id, markId), eq(intendedFlags.takeId, takeId)))
    .run();
  rescore(takeId);
}

/** The two review actions a teacher can post, from the review queue or the take page. */
export const reviewIntentSchema = z.enum(["review", "unreview"]);
export type ReviewIntent = z.infer<typeof reviewIntentSchema>;

/**
 * Marks the take reviewed by this teacher ("review") or puts it back in the review queue
 * ("unreview"); the caller has checked that the teacher teaches the take's studio.
 * Returns the words for the flash message.
 */
export function applyReviewIntent(intent: ReviewIntent, takeId: string, teacherId: string, at = new Date()): string {
  if (intent === "review") {
    db().insert(takeReviews).values({ takeId, reviewedById: teacherId, reviewedAt: at }).onConflictDoNothing().run();
    return "Marked as reviewed.";
  }
  db().delete(takeReviews).where(eq(takeReviews.takeId, takeId)).run();
  return "Back in the review queue.";
}

const reviewQuery = preparedQuery((database) =>
  database
    .select({ at: takeReviews.reviewedAt, byName: users.name })
    .from(takeReviews)
    .leftJoin(users, eq(users.id, takeReviews.reviewedById))
    .where(eq(takeReviews.takeId, sql.placeholder("takeId")))
    .prepare(),
);

export function reviewOf(takeId: string) {
  const row = reviewQuery().get({ takeId });
  return row ? { at: row.at.toISOString(), byName: row.byName } : null;
}

/** The review queue: the studio's takes no teacher has marked reviewed, newest first. */
export function reviewQueue(studioId: string, limit = 200) {
  return db()
    .select({
      id: takes.id,
      createdAt: takes.createdAt,
      recordedAt: takes.recordedAt,
      studentName: users.name,
      exerciseTitle: exercises.title,
      key: takes.key,
      status: takes.status,
      score: takeMetrics.score,
      accuracy: takeMetrics.accuracy,
      flags: takeMetrics.flags,
    })
    .from(takes)
    .innerJoin(users, eq(users.id, takes.studentId))
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .leftJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
    .leftJoin(takeReviews, eq(takeReviews.takeId, takes.id))
    .where(and(eq(takes.studioId, studioId), isNull(takeReviews.takeId)))
    .orderBy(desc(takes.createdAt), desc(takes.recordedAt))
    .limit(limit)
    .all()
    .map((r) => ({ ...r, createdAt: r.createdAt.toISOString(), recordedAt: r.recordedAt.toISOString() }));
}

export function reviewQueueCount(studioId: string): number {
  return (
    db()
      .select({ n: sql<number>`count(*)` })
      .from(takes)
      .leftJoin(takeReviews, eq(takeReviews.takeId, takes.id))
      .where(and(eq(takes.studioId, studioId), isNull(takeReviews.takeId)))
      .get()?.n ?? 0
  );
}

/** Comments by others on this person's takes that they have not read yet, grouped by take. */
export function unreadFeedback(studentId: string, studioId: string) {
  const rows = db()
    .select({
      takeId: takes.id,
      exerciseTitle: exercises.title,
      recordedAt: takes.recordedAt,
      authorName: users.name,
      body: comments.body,
      changeIdx: comments.changeIdx,
      createdAt: comments.createdAt,
    })
    .from(comments)
    .innerJoin(takes, eq(takes.id, comments.takeId))
    .innerJoin(users, eq(users.id, comments.authorId))
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .leftJoin(commentReads, and(eq(commentReads.takeId, takes.id), eq(commentReads.userId, studentId)))
    .where(
      and(
        eq(takes.studentId, studentId),
        eq(takes.studioId, studioId),
        ne(comments.authorId, studentId),
        or(isNull(commentReads.readAt), gt(comments.createdAt, commentReads.readAt)),
      ),
    )
    .orderBy(desc(comments.createdAt))
    .all();
  const byTake = new Map<
    string,
    {
      takeId: string;
      exerciseTitle: string | null;
      recordedAt: string;
      count: number;
      latest: { authorName: string; body: string; changeIdx: number | null };
    }
  >();
  for (const r of rows) {
    const entry = byTake.get(r.takeId);
    if (entry) entry.count++;
    else
      byTake.set(r.takeId, {
        takeId: r.takeId,
        exerciseTitle: r.exerciseTitle,
        recordedAt: r.recordedAt.toISOString(),
        count: 1,
        latest: { authorName: r.authorName, body: r.body, changeIdx: r.changeIdx },
      });
  }
  return [...byTake.values()];
}

/** Students' replies on a studio's takes since a moment: the teacher's digest lists them. */
export function repliesSince(studioId: string, since: Date) {
  return db()
    .select({ takeId: comments.takeId, authorName: users.name, body: comments.body, createdAt: comments.createdAt })
    .from(comments)
    .innerJoin(takes, eq(takes.id, comments.takeId))
    .innerJoin(users, eq(users.id, comments.authorId))
    .where(and(eq(takes.studioId, studioId), eq(comments.authorId, takes.studentId), gt(comments.createdAt, since)))
    .orderBy(comments.createdAt)
    .all();
}

const focusQuery = preparedQuery((database) =>
  database
    .select({ f: exercises.focusTechniques })
    .from(exercises)
    .where(eq(exercises.id, sql.placeholder("exerciseId")))
    .prepare(),
);

const scoreQuery = preparedQuery((database) =>
  database
    .select({ score: takeMetrics.score })
    .from(takeMetrics)
    .where(eq(takeMetrics.takeId, sql.placeholder("takeId")))
    .prepare(),
);

/**
 * Everything the take page shows of feedback, for one viewer. Opening the page counts as
 * reading its comments (marking the take reviewed does not happen here: that is a button).
 */
export function takePageFeedback(
  viewer: { id: string },
  take: { id: string; studentId: string; exerciseId: string | null },
  asTeacher: boolean,
) {
  const threads = commentThreads(take.id, viewer.id);
  markRead(viewer.id, take.id);
  const focus = take.exerciseId ? (focusQuery().get({ exerciseId: take.exerciseId })?.f ?? []) : [];
  const metricsRow = scoreQuery().get({ takeId: take.id });
  return {
    asTeacher,
    canReply: asTeacher || viewer.id === take.studentId,
    threads,
    intended: intendedFlagList(take.id),
    review: asTeacher ? reviewOf(take.id) : null,
    score: metricsRow?.score ?? null,
    engineScore: (metricsRow && storedAnalysis(take.id)?.summary.score) ?? null,
    focusTechniques: focus,
  };
}

export type TakePageFeedback = ReturnType<typeof takePageFeedback>;

/** A comment with its replies, as the take page shows it. */
export type CommentItem = {
  id: string;
  authorId: string;
  authorName: string;
  body: string;
  changeIdx: number | null;
  createdAt: string;
  unread: boolean;
  replies: CommentItem[];
};
