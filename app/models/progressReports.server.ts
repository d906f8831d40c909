import { and, desc, eq } from "drizzle-orm";
import { db } from "~/db/client.server";
import { progressReports, users } from "~/db/schema";

export function saveProgressReport(r: {
  studioId: string;
  studentId: string;
  fromDate: string;
  toDate: string;
  summary: string;
  createdById: string;
}) {
  return db().insert(progressReports).values(r).returning().get();
}

export function getProgressReport(studioId: string, studentId: string, id: string) {
  return db()
    .select()
    .from(progressReports)
    .where(
      and(eq(progressReports.id, id), eq(progressReports.studioId, studioId), eq(progressReports.studentId, studentId)),
    )
    .get();
}

/** Saved reports of one student, newest first, with who wrote them. */
export function listProgressReports(studioId: string, studentId: string) {
  return db()
    .select({
      id: progressReports.id,
      fromDate: progressReports.fromDate,
      toDate: progressReports.toDate,
      createdAt: progressReports.createdAt,
      author: users.name,
    })
    .from(progressReports)
    .leftJoin(users, eq(users.id, progressReports.createdById))
    .where(and(eq(progressReports.studioId, studioId), eq(progressReports.studentId, studentId)))
    .orderBy(desc(progressReports.createdAt))
    .limit(50)
    .all()
    .map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}
