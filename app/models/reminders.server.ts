// The board's one-click nudge for students with no takes this week: one plain
// mail per student per studio week, however often the button is pressed.
import { and, eq, inArray } from "drizzle-orm";
import { db } from "~/db/client.server";
import { practiceReminders, takes } from "~/db/schema";
import { sendMail, type OutgoingMail } from "~/mail/mail.server";
import { link } from "~/mail/mailTemplates.server";
import { currentWeek, studioStudents } from "./progress.server";

export function practiceReminderMail(
  to: string,
  p: { studentName: string; teacherName: string; studioName: string },
): OutgoingMail {
  return {
    to,
    subject: `${p.teacherName} is looking forward to your next take`,
    text: [
      `Hello ${p.studentName.split(" ")[0]},`,
      "",
      `No practice takes have reached ${p.studioName} this week yet. When you next sit down at the keyboard,`,
      "record a take of your current exercise and upload it, so your teacher can give you feedback before the next lesson:",
      "",
      link("/takes/new"),
      "",
      "A few short sessions help more than one long one. Take breaks, and if your hands or wrists hurt, stop and tell your teacher.",
      "",
      `${p.teacherName}, ${p.studioName}`,
    ].join("\n"),
  };
}

/** Active students of the studio without a single take (any status) in the studio's current week. */
export function studentsWithoutTakesThisWeek(studioId: string, now = new Date()) {
  const week = currentWeek(studioId, now);
  const students = studioStudents(studioId);
  if (!students.length) return { week, students };
  const practised = new Set(
    db()
      .selectDistinct({ id: takes.studentId })
      .from(takes)
      .where(
        and(
          eq(takes.studioId, studioId),
          eq(takes.weekKey, week),
          inArray(
            takes.studentId,
            students.map((s) => s.id),
          ),
        ),
      )
      .all()
      .map((r) => r.id),
  );
  return { week, students: students.filter((s) => !practised.has(s.id)) };
}

/**
 * Mails every student without a take this week who has not been reminded this
 * week yet. The reminder row is written first (the unique index decides), so two
 * quick clicks still send one mail.
 */
export async function sendPracticeReminders(
  studio: { id: string; name: string },
  teacher: { id: string; name: string },
  now = new Date(),
): Promise<{ sent: string[]; alreadyReminded: number }> {
  const { week, students } = studentsWithoutTakesThisWeek(studio.id, now);
  const sent: string[] = [];
  let alreadyReminded = 0;
  for (const s of students) {
    const claimed = db()
      .insert(practiceReminders)
      .values({ studioId: studio.id, studentId: s.id, weekKey: week, sentById: teacher.id })
      .onConflictDoNothing()
      .run();
    if (claimed.changes === 0) {
      alreadyReminded++;
      continue;
    }
    await sendMail(
      practiceReminderMail(s.email, { studentName: s.name, teacherName: teacher.name, studioName: studio.name }),
    );
    sent.push(s.name);
  }
  return { sent, alreadyReminded };
}
