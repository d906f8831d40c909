import { and, desc, eq, gt, inArray } from "drizzle-orm";
import { db } from "~/db/client.server";
import { comments, exercises, memberships, sentMails, studios, takeMetrics, takes, users } from "~/db/schema";
import { link } from "~/mail/mailTemplates.server";
import { mailFooter, sendOnce } from "~/mail/notifyMail.server";
import { pretty } from "~/utils/noteText";
import { localDate } from "~/utils/weeks";
import { studentsOfExercise } from "./exercises.server";
import { repliesSince, reviewQueueCount } from "./feedback.server";

// The mail Nearnote sends on its own: a notice when a teacher comments on a student's take,
// the teacher's daily digest of new takes and replies, and a reminder the day before an
// exercise is due when no take has been sent. Each goes through `sendOnce`.

/** Digests go out from this local hour on, so a teacher reads the day's takes in one mail. */
export const DIGEST_HOUR = 18;

const iso = (d: { year: number; month: number; day: number }) =>
  `${d.year}-${String(d.month).padStart(2, "0")}-${String(d.day).padStart(2, "0")}`;

function localHour(now: Date, timeZone: string): number {
  return Number(new Intl.DateTimeFormat("en-GB", { timeZone, hour: "2-digit", hourCycle: "h23" }).format(now));
}

/** A mail to the student when someone else comments on their take (if they want such mail). */
export async function sendFeedbackNotice(commentId: string, now = new Date()): Promise<boolean> {
  const row = db()
    .select({ c: comments, take: takes, author: users.name, exerciseTitle: exercises.title })
    .from(comments)
    .innerJoin(takes, eq(takes.id, comments.takeId))
    .innerJoin(users, eq(users.id, comments.authorId))
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .where(eq(comments.id, commentId))
    .get();
  if (!row || row.c.authorId === row.take.studentId) return false;
  const student = db().select().from(users).where(eq(users.id, row.take.studentId)).get();
  if (!student || !student.mailOnFeedback) return false;
  const where = row.c.changeIdx === null ? "your take" : `change ${row.c.changeIdx + 1} of your take`;
  const title = row.exerciseTitle ?? "a free practice take";
  return sendOnce(
    "feedback",
    student.id,
    `feedback:${commentId}`,
    {
      to: student.email,
      subject: `${row.author} commented on your take (${title})`,
      text: [
        `Hello ${student.name.split(" ")[0]},`,
        "",
        `${row.author} wrote about ${where}:`,
        "",
        ...row.c.body.split("\n").map((l) => `> ${l}`),
        "",
        "Read it at that place in the take, and reply if you like:",
        link(`/takes/${row.take.id}${row.c.changeIdx === null ? "" : `#change-${row.c.changeIdx}`}`),
        ...mailFooter(student.id, "feedback"),
      ].join("\n"),
    },
    now,
  );
}

function lastDigestAt(userId: string): Date | null {
  return (
    db()
      .select({ at: sentMails.sentAt })
      .from(sentMails)
      .where(and(eq(sentMails.userId, userId), eq(sentMails.kind, "digest")))
      .orderBy(desc(sentMails.sentAt))
      .get()?.at ?? null
  );
}

/** New takes of a studio since a moment, for the digest. */
function takesSince(studioId: string, since: Date) {
  return db()
    .select({
      id: takes.id,
      student: users.name,
      exercise: exercises.title,
      key: takes.key,
      status: takes.status,
      score: takeMetrics.score,
    })
    .from(takes)
    .innerJoin(users, eq(users.id, takes.studentId))
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .leftJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
    .where(and(eq(takes.studioId, studioId), gt(takes.createdAt, since)))
    .orderBy(takes.createdAt)
    .all();
}

export type DigestContent = { subject: string; text: string; takeCount: number; replyCount: number };

/** What a teacher's digest says: new takes and students' replies since `since`; null when there is nothing new. */
export function digestContent(
  teacher: { id: string; name: string },
  studio: { id: string; name: string },
  since: Date,
): DigestContent | null {
  const newTakes = takesSince(studio.id, since);
  const replies = repliesSince(studio.id, since);
  if (newTakes.length === 0 && replies.length === 0) return null;
  const lines = [`Hello ${teacher.name.split(" ")[0]},`, "", `New in ${studio.name} since your last digest:`, ""];
  if (newTakes.length) {
    lines.push(`${newTakes.length} new take${newTakes.length === 1 ? "" : "s"}:`);
    for (const t of newTakes) {
      const what = t.exercise ? `${t.exercise}${t.key ? ` in ${pretty(t.key)}` : ""}` : "free practice";
      const result =
        t.status === "analysed" && t.score !== null
          ? `score ${Math.round(t.score)}`
          : t.status === "failed"
            ? "could not be analysed"
            : "waiting";
      lines.push(`- ${t.student}: ${what}, ${result}. ${link(`/takes/${t.id}`)}`);
    }
    lines.push("");
  }
  if (replies.length) {
    lines.push(`${replies.length} repl${replies.length === 1 ? "y" : "ies"} from students:`);
    for (const r of replies) lines.push(`- ${r.authorName}: "${r.body.slice(0, 120)}" ${link(`/takes/${r.takeId}`)}`);
    lines.push("");
  }
  lines.push(
    `Takes waiting for review: ${reviewQueueCount(studio.id)}. ${link("/review")}`,
    ...mailFooter(teacher.id, "digest"),
  );
  return {
    subject: `Nearnote digest for ${studio.name}: ${newTakes.length} new take${newTakes.length === 1 ? "" : "s"}`,
    text: lines.join("\n"),
    takeCount: newTakes.length,
    replyCount: replies.length,
  };
}

/** One digest a day per teacher and studio, after DIGEST_HOUR local time (any hour with `anyHour`). */
export async function runDigests(now = new Date(), opts: { anyHour?: boolean } = {}): Promise<number> {
  let sent = 0;
  for (const studio of db().select().from(studios).all()) {
    if (!opts.anyHour && localHour(now, studio.timeZone) < DIGEST_HOUR) continue;
    const today = iso(localDate(now, studio.timeZone));
    const teachers = db()
      .select({ id: users.id, name: users.name, email: users.email, mailDigest: users.mailDigest })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(
        and(
          eq(memberships.studioId, studio.id),
          inArray(memberships.role, ["owner", "teacher"]),
          eq(memberships.status, "active"),
        ),
      )
      .all();
    for (const t of teachers) {
      if (!t.mailDigest) continue;
      const since = lastDigestAt(t.id) ?? new Date(now.getTime() - 86_400_000);
      const content = digestContent(t, studio, since);
      if (!content) continue;
      if (
        await sendOnce(
          "digest",
          t.id,
          `digest:${studio.id}:${today}`,
          { to: t.email, subject: content.subject, text: content.text },
          now,
        )
      )
        sent++;
    }
  }
  return sent;
}

/** The day before an exercise is due (studio time), a reminder to each student set it who has handed nothing in. */
export async function runDueReminders(now = new Date()): Promise<number> {
  let sent = 0;
  for (const studio of db().select().from(studios).all()) {
    const tomorrow = iso(localDate(new Date(now.getTime() + 86_400_000), studio.timeZone));
    const due = db()
      .select()
      .from(exercises)
      .where(and(eq(exercises.studioId, studio.id), eq(exercises.dueDate, tomorrow)))
      .all();
    for (const exercise of due.filter((e) => e.archivedAt === null)) {
      for (const s of studentsOfExercise(exercise)) {
        const handedIn = db()
          .select({ id: takes.id })
          .from(takes)
          .where(and(eq(takes.exerciseId, exercise.id), eq(takes.studentId, s.id)))
          .get();
        const person = db().select({ mailDigest: users.mailDigest }).from(users).where(eq(users.id, s.id)).get();
        if (handedIn || !person?.mailDigest) continue;
        const mail = {
          to: s.email,
          subject: `Due tomorrow: ${exercise.title}`,
          text: [
            `Hello ${s.name.split(" ")[0]},`,
            "",
            `"${exercise.title}" is due tomorrow (${exercise.dueDate}) and no take has been sent yet.`,
            `Keys: ${exercise.keys.map(pretty).join(", ")}. Progression: ${exercise.progression}.`,
            "",
            "Open the exercise to send a take:",
            link(`/exercises/${exercise.id}`),
            "",
            "Short sessions with breaks are better for your hands than one long one.",
            ...mailFooter(s.id, "digest"),
          ].join("\n"),
        };
        if (await sendOnce("due-reminder", s.id, `due:${exercise.id}:${exercise.dueDate}`, mail, now)) sent++;
      }
    }
  }
  return sent;
}

/** Everything the scheduler does on one tick. */
export async function runScheduledMail(now = new Date(), opts: { anyHour?: boolean } = {}) {
  const digests = await runDigests(now, opts);
  const reminders = await runDueReminders(now);
  return { digests, reminders };
}
