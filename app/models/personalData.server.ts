import { and, eq, inArray, type SQL } from "drizzle-orm";
import { strToU8, zipSync, type Zippable } from "fflate";
import { db, type Tx } from "~/db/client.server";
import {
  comments,
  invitations,
  memberships,
  practiceReminders,
  progressReports,
  studioVisits,
  sentMails,
  sessions,
  studios,
  takeMetrics,
  takeReviews,
  takes,
  users,
} from "~/db/schema";
import { env } from "~/server/env.server";
import { mailDir } from "~/mail/mail.server";
import { deleteStoredMailTo } from "~/mail/mailStore.server";
import { readTakeFile, removeTakeFilesAfterRows } from "~/takes/takeFiles.server";

/**
 * Deletes the matching take rows (analysis rows cascade) in one transaction, then
 * their files: a crash in between leaves files without rows (the orphan sweep
 * removes them), never rows that pages would list without a file.
 */
export async function removeTakesWithFiles(where: SQL, alsoInTransaction?: (tx: Tx) => void) {
  const fileKeys = db().transaction((tx) => {
    const rows = tx.select({ id: takes.id, fileKey: takes.fileKey }).from(takes).where(where).all();
    for (let i = 0; i < rows.length; i += 500) {
      tx.delete(takes)
        .where(
          inArray(
            takes.id,
            rows.slice(i, i + 500).map((r) => r.id),
          ),
        )
        .run();
    }
    alsoInTransaction?.(tx);
    return rows.map((r) => r.fileKey);
  });
  await removeTakeFilesAfterRows(fileKeys);
  return fileKeys.length;
}

function commentsOnTake(takeId: string) {
  return db()
    .select({ author: users.name, changeIdx: comments.changeIdx, body: comments.body, createdAt: comments.createdAt })
    .from(comments)
    .innerJoin(users, eq(users.id, comments.authorId))
    .where(eq(comments.takeId, takeId))
    .orderBy(comments.createdAt)
    .all();
}

/** A file name safe inside a ZIP on every system. */
function safeName(name: string) {
  return name.replace(/[^\w.\- ]+/g, "_").slice(0, 80) || "take.mid";
}

/**
 * Everything Nearnote holds about a person, as ZIP bytes: `takes/` with each
 * MIDI file as uploaded, and `nearnote-data.json` with the rest. With
 * `studioId`, only what belongs to that studio (a teacher's export of a student).
 */
export async function buildPersonalExport(userId: string, options: { studioId?: string } = {}): Promise<Uint8Array> {
  const user = db().select().from(users).where(eq(users.id, userId)).get();
  if (!user) throw new Error("No such person");
  const takeWhere = options.studioId
    ? and(eq(takes.studentId, userId), eq(takes.studioId, options.studioId))
    : eq(takes.studentId, userId);
  const takeRows = db()
    .select({ take: takes, metrics: takeMetrics, studioName: studios.name })
    .from(takes)
    .leftJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
    .innerJoin(studios, eq(studios.id, takes.studioId))
    .where(takeWhere)
    .orderBy(takes.recordedAt)
    .all();
  const membershipRows = db()
    .select({
      studio: studios.name,
      role: memberships.role,
      status: memberships.status,
      joinedAt: memberships.createdAt,
      removedAt: memberships.removedAt,
    })
    .from(memberships)
    .innerJoin(studios, eq(studios.id, memberships.studioId))
    .where(
      options.studioId
        ? and(eq(memberships.userId, userId), eq(memberships.studioId, options.studioId))
        : eq(memberships.userId, userId),
    )
    .all();

  // Flat paths: no separate directory entries in the archive.
  const zip: Zippable = {};
  const takeJson = [];
  for (const [i, row] of takeRows.entries()) {
    const file = await readTakeFile(row.take.fileKey);
    const zipName = `${String(i + 1).padStart(3, "0")}-${safeName(row.take.originalName)}`;
    if (file) zip[`takes/${zipName}`] = file;
    const { fileKey: _fileKey, ...take } = row.take;
    takeJson.push({
      ...take,
      studio: row.studioName,
      file: file ? `takes/${zipName}` : null,
      metrics: row.metrics,
      reviewedAt: db().select().from(takeReviews).where(eq(takeReviews.takeId, take.id)).get()?.reviewedAt ?? null,
      comments: commentsOnTake(take.id),
    });
  }
  const document = {
    exportedAt: new Date().toISOString(),
    about: "Everything Nearnote stores about this person. MIDI files are in the takes/ folder.",
    person: {
      name: user.name,
      email: user.email,
      emailVerifiedAt: user.emailVerifiedAt,
      mailOnFeedback: user.mailOnFeedback,
      mailDigest: user.mailDigest,
      createdAt: user.createdAt,
    },
    studios: membershipRows,
    takes: takeJson,
    progressReports: db()
      .select({
        studio: studios.name,
        fromDate: progressReports.fromDate,
        toDate: progressReports.toDate,
        summary: progressReports.summary,
        createdAt: progressReports.createdAt,
      })
      .from(progressReports)
      .innerJoin(studios, eq(studios.id, progressReports.studioId))
      .where(
        options.studioId
          ? and(eq(progressReports.studentId, userId), eq(progressReports.studioId, options.studioId))
          : eq(progressReports.studentId, userId),
      )
      .all(),
    ...(options.studioId
      ? {}
      : {
          commentsWritten: db()
            .select({
              takeId: comments.takeId,
              changeIdx: comments.changeIdx,
              body: comments.body,
              createdAt: comments.createdAt,
            })
            .from(comments)
            .where(eq(comments.authorId, userId))
            .all(),
          practiceReminders: db()
            .select({ weekKey: practiceReminders.weekKey, sentAt: practiceReminders.createdAt })
            .from(practiceReminders)
            .where(eq(practiceReminders.studentId, userId))
            .all(),
          automaticMails: db()
            .select({ kind: sentMails.kind, sentAt: sentMails.sentAt })
            .from(sentMails)
            .where(eq(sentMails.userId, userId))
            .all(),
          // When a teacher last opened home in each studio ("new since your last visit"); cascades with the user row.
          homeVisits: db()
            .select({ studio: studios.name, lastVisitAt: studioVisits.lastVisitAt, sinceAt: studioVisits.sinceAt })
            .from(studioVisits)
            .innerJoin(studios, eq(studios.id, studioVisits.studioId))
            .where(eq(studioVisits.userId, userId))
            .all(),
          sessions: db()
            .select({ createdAt: sessions.createdAt, expiresAt: sessions.expiresAt })
            .from(sessions)
            .where(eq(sessions.userId, userId))
            .all(),
          invitationsReceived: db()
            .select({
              studio: studios.name,
              role: invitations.role,
              createdAt: invitations.createdAt,
              acceptedAt: invitations.acceptedAt,
            })
            .from(invitations)
            .innerJoin(studios, eq(studios.id, invitations.studioId))
            .where(eq(invitations.email, user.email))
            .all(),
        }),
  };
  zip["nearnote-data.json"] = strToU8(JSON.stringify(document, null, 2));
  return zipSync(zip, { level: 6 });
}

/**
 * Removes a person: their take rows, invitations and the user row in one
 * transaction (sessions, memberships, tokens, comments, reports and analysis rows
 * cascade), then their take files. Invitations and stored mail to their address
 * go too, since they hold the address.
 */
export async function deletePersonData(userId: string) {
  const user = db().select().from(users).where(eq(users.id, userId)).get();
  if (!user) return;
  const fileKeys = db().transaction((tx) => {
    const keys = tx
      .select({ fileKey: takes.fileKey })
      .from(takes)
      .where(eq(takes.studentId, userId))
      .all()
      .map((r) => r.fileKey);
    tx.delete(takes).where(eq(takes.studentId, userId)).run();
    tx.delete(invitations).where(eq(invitations.email, user.email)).run();
    tx.delete(users).where(eq(users.id, userId)).run();
    return keys;
  });
  await removeTakeFilesAfterRows(fileKeys);
  // Mail kept on disk (no SMTP configured, or the demo's catcher) names them too.
  for (const dir of new Set([mailDir(), env().mailCatcherDir].filter((d): d is string => !!d))) {
    deleteStoredMailTo(dir, user.email);
  }
}
