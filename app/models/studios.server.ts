import { and, count, eq, inArray, ne, sql } from "drizzle-orm";
import { db } from "~/db/client.server";
import { memberships, sessions, studios, takes, users, type MembershipRole } from "~/db/schema";
import { deletePersonData, removeTakesWithFiles } from "./personalData.server";

export type RosterPerson = {
  userId: string;
  name: string;
  email: string;
  role: MembershipRole;
  status: "active" | "removed";
  joinedAt: Date;
  removedAt: Date | null;
  takeCount: number;
};

export function getStudio(studioId: string) {
  return db().select().from(studios).where(eq(studios.id, studioId)).get();
}

export function getMembership(studioId: string, userId: string) {
  return db()
    .select()
    .from(memberships)
    .where(and(eq(memberships.studioId, studioId), eq(memberships.userId, userId)))
    .get();
}

/** Everyone in a studio, active first, with how many takes each student has there. */
export function studioRoster(studioId: string): RosterPerson[] {
  const takeCounts = db()
    .select({ studentId: takes.studentId, n: count() })
    .from(takes)
    .where(eq(takes.studioId, studioId))
    .groupBy(takes.studentId)
    .all();
  const byStudent = new Map(takeCounts.map((r) => [r.studentId, r.n]));
  return db()
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      status: memberships.status,
      joinedAt: memberships.createdAt,
      removedAt: memberships.removedAt,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.studioId, studioId))
    .orderBy(memberships.status, users.name)
    .all()
    .map((p) => ({ ...p, takeCount: byStudent.get(p.userId) ?? 0 }));
}

/** Adds someone to a studio, or brings a removed member back with the new role. */
export function addMember(studioId: string, userId: string, role: MembershipRole) {
  const existing = getMembership(studioId, userId);
  if (existing) {
    db()
      .update(memberships)
      .set({ status: "active", removedAt: null, role: existing.role === "owner" ? "owner" : role })
      .where(eq(memberships.id, existing.id))
      .run();
    return;
  }
  db().insert(memberships).values({ studioId, userId, role }).run();
}

/**
 * Takes a student or co-teacher off the roster: the membership is marked removed, so every
 * power it gave (board, exports, deleting students' data) ends with the next request; a
 * student's takes stay. Never the owner: the role must match.
 */
export function removeMember(studioId: string, userId: string, role: "student" | "teacher"): boolean {
  const result = db()
    .update(memberships)
    .set({ status: "removed", removedAt: new Date() })
    .where(
      and(
        eq(memberships.studioId, studioId),
        eq(memberships.userId, userId),
        eq(memberships.role, role),
        eq(memberships.status, "active"),
      ),
    )
    .run();
  // Sessions pointed at this studio fall back to another one on the next request.
  db()
    .update(sessions)
    .set({ activeStudioId: null })
    .where(and(eq(sessions.userId, userId), eq(sessions.activeStudioId, studioId)))
    .run();
  return result.changes === 1;
}

/**
 * Deletes for good a student's takes (and their files) in this studio and the
 * membership. When the person belongs to no other studio their account goes too.
 */
export async function deleteStudentData(studioId: string, studentId: string): Promise<{ accountDeleted: boolean }> {
  const membership = getMembership(studioId, studentId);
  if (!membership || membership.role !== "student") return { accountDeleted: false };
  // The takes and the membership go in one transaction, the files only after it.
  await removeTakesWithFiles(and(eq(takes.studioId, studioId), eq(takes.studentId, studentId))!, (tx) => {
    tx.delete(memberships).where(eq(memberships.id, membership.id)).run();
  });
  const others = db().select({ n: count() }).from(memberships).where(eq(memberships.userId, studentId)).get();
  if ((others?.n ?? 0) === 0) {
    await deletePersonData(studentId);
    return { accountDeleted: true };
  }
  return { accountDeleted: false };
}

/** Points a session at another of the person's active studios. */
export function switchActiveStudio(sessionId: string, userId: string, studioId: string): boolean {
  const membership = getMembership(studioId, userId);
  if (!membership || membership.status !== "active") return false;
  db().update(sessions).set({ activeStudioId: studioId }).where(eq(sessions.id, sessionId)).run();
  return true;
}

export type OwnershipPlan =
  | { kind: "ok"; promote: { studioId: string; userId: string }[]; deleteStudios: string[] }
  | { kind: "blocked"; studioName: string };

/**
 * What leaving means for the studios this person owns: another active teacher
 * takes over; a studio with nobody else in it goes too; a studio that still has
 * students and no other teacher blocks the deletion (their takes would vanish).
 */
export function planOwnershipOnLeave(userId: string): OwnershipPlan {
  const owned = db()
    .select({ studioId: memberships.studioId, studioName: studios.name })
    .from(memberships)
    .innerJoin(studios, eq(studios.id, memberships.studioId))
    .where(and(eq(memberships.userId, userId), eq(memberships.role, "owner")))
    .all();
  const promote: { studioId: string; userId: string }[] = [];
  const deleteStudios: string[] = [];
  for (const s of owned) {
    const others = db()
      .select({ userId: memberships.userId, role: memberships.role, status: memberships.status })
      .from(memberships)
      .where(and(eq(memberships.studioId, s.studioId), ne(memberships.userId, userId)))
      .orderBy(memberships.createdAt)
      .all();
    if (others.some((o) => o.role === "owner" && o.status === "active")) continue;
    const teacher = others.find((o) => o.role === "teacher" && o.status === "active");
    if (teacher) promote.push({ studioId: s.studioId, userId: teacher.userId });
    else if (others.length === 0) deleteStudios.push(s.studioId);
    else return { kind: "blocked", studioName: s.studioName };
  }
  return { kind: "ok", promote, deleteStudios };
}

export function applyOwnershipPlan(plan: Extract<OwnershipPlan, { kind: "ok" }>) {
  for (const p of plan.promote) {
    db()
      .update(memberships)
      .set({ role: "owner" })
      .where(and(eq(memberships.studioId, p.studioId), eq(memberships.userId, p.userId)))
      .run();
  }
  if (plan.deleteStudios.length) db().delete(studios).where(inArray(studios.id, plan.deleteStudios)).run();
}

/** Ids of the studios where this person teaches (owner or teacher), active memberships only. */
export function teachingStudioIds(userId: string): string[] {
  return db()
    .select({ studioId: memberships.studioId })
    .from(memberships)
    .where(
      and(
        eq(memberships.userId, userId),
        eq(memberships.status, "active"),
        sql`${memberships.role} in ('owner', 'teacher')`,
      ),
    )
    .all()
    .map((r) => r.studioId);
}
