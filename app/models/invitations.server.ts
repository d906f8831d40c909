import { and, count, desc, eq, gt, isNull } from "drizzle-orm";
import { hashToken, newToken, DAY_MS } from "~/auth/tokens.server";
import { db } from "~/db/client.server";
import { invitationSends, invitations, studios, users, type Invitation, type InvitationRole } from "~/db/schema";
import { sendMail } from "~/mail/mail.server";
import { invitationMail } from "~/mail/mailTemplates.server";
import { hashPassword } from "~/auth/password.server";
import { addMember, getMembership } from "./studios.server";
import { findUserByEmail, normaliseEmail } from "./users.server";

export const INVITATION_TTL_MS = 7 * DAY_MS;
/** Invitation mails (first sends and resends) a studio may send in any 24 hours. */
export const DAILY_INVITATION_LIMIT = 50;

export function invitationsSentToday(studioId: string, now = new Date()): number {
  const row = db()
    .select({ n: count() })
    .from(invitationSends)
    .where(and(eq(invitationSends.studioId, studioId), gt(invitationSends.sentAt, new Date(now.getTime() - DAY_MS))))
    .get();
  return row?.n ?? 0;
}

type Inviter = { id: string; name: string };

async function mailInvitation(invitation: Invitation, token: string, inviterName: string) {
  const studio = db().select().from(studios).where(eq(studios.id, invitation.studioId)).get();
  await sendMail(
    invitationMail(invitation.email, {
      studioName: studio?.name ?? "a studio",
      inviterName,
      role: invitation.role,
      token,
    }),
  );
  db().insert(invitationSends).values({ studioId: invitation.studioId, invitationId: invitation.id }).run();
}

export type InviteOutcome =
  | { kind: "sent"; emails: string[]; skipped: { email: string; reason: string }[] }
  | { kind: "over-limit"; remaining: number };

/**
 * Invites each address once. People already active in the studio are skipped
 * with a reason; an address with a pending invitation gets a fresh link (the old
 * one stops working). The whole batch is refused when it would pass the daily limit.
 */
export async function inviteToStudio(
  studioId: string,
  inviter: Inviter,
  emails: string[],
  role: InvitationRole,
  now = new Date(),
): Promise<InviteOutcome> {
  const unique = [...new Set(emails.map(normaliseEmail))];
  const skipped: { email: string; reason: string }[] = [];
  const toSend: string[] = [];
  for (const email of unique) {
    const existing = findUserByEmail(email);
    const member = existing ? getMembership(studioId, existing.id) : undefined;
    if (member?.status === "active") skipped.push({ email, reason: "already in this studio" });
    else toSend.push(email);
  }
  const remaining = DAILY_INVITATION_LIMIT - invitationsSentToday(studioId, now);
  if (toSend.length > remaining) return { kind: "over-limit", remaining: Math.max(0, remaining) };
  for (const email of toSend) {
    // A new invitation replaces any pending one for the same address and studio.
    db()
      .update(invitations)
      .set({ revokedAt: now })
      .where(
        and(
          eq(invitations.studioId, studioId),
          eq(invitations.email, email),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
        ),
      )
      .run();
    const token = newToken();
    const invitation = db()
      .insert(invitations)
      .values({
        studioId,
        email,
        role,
        tokenHash: hashToken(token),
        invitedById: inviter.id,
        expiresAt: new Date(now.getTime() + INVITATION_TTL_MS),
        lastSentAt: now,
      })
      .returning()
      .get();
    await mailInvitation(invitation, token, inviter.name);
  }
  return { kind: "sent", emails: toSend, skipped };
}

/** Pending invitations of a studio (not accepted, not revoked), newest first; expired ones included and marked. */
export function pendingInvitations(studioId: string, now = new Date()) {
  return db()
    .select()
    .from(invitations)
    .where(and(eq(invitations.studioId, studioId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .orderBy(desc(invitations.createdAt))
    .all()
    .map((i) => ({ ...i, expired: i.expiresAt.getTime() <= now.getTime() }));
}

function pendingInStudio(studioId: string, invitationId: string) {
  return db()
    .select()
    .from(invitations)
    .where(
      and(
        eq(invitations.id, invitationId),
        eq(invitations.studioId, studioId),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
      ),
    )
    .get();
}

/** A new link (the old one stops working) and 7 more days. */
export async function resendInvitation(
  studioId: string,
  invitationId: string,
  inviter: Inviter,
  now = new Date(),
): Promise<"sent" | "not-found" | "over-limit"> {
  const invitation = pendingInStudio(studioId, invitationId);
  if (!invitation) return "not-found";
  if (invitationsSentToday(studioId, now) >= DAILY_INVITATION_LIMIT) return "over-limit";
  const token = newToken();
  const updated = db()
    .update(invitations)
    .set({
      tokenHash: hashToken(token),
      expiresAt: new Date(now.getTime() + INVITATION_TTL_MS),
      sentCount: invitation.sentCount + 1,
      lastSentAt: now,
    })
    .where(eq(invitations.id, invitation.id))
    .returning()
    .get();
  await mailInvitation(updated, token, inviter.name);
  return "sent";
}

export function revokeInvitation(studioId: string, invitationId: string, now = new Date()): boolean {
  const invitation = pendingInStudio(studioId, invitationId);
  if (!invitation) return false;
  db().update(invitations).set({ revokedAt: now }).where(eq(invitations.id, invitation.id)).run();
  return true;
}

export type InvitationLookup =
  | { ok: true; invitation: Invitation; studioName: string; hasAccount: boolean }
  | { ok: false; reason: "unknown" | "used" | "revoked" | "expired" };

export function findInvitationByToken(token: string, now = new Date()): InvitationLookup {
  const row = db()
    .select({ invitation: invitations, studioName: studios.name })
    .from(invitations)
    .innerJoin(studios, eq(studios.id, invitations.studioId))
    .where(eq(invitations.tokenHash, hashToken(token)))
    .get();
  if (!row) return { ok: false, reason: "unknown" };
  if (row.invitation.acceptedAt) return { ok: false, reason: "used" };
  if (row.invitation.revokedAt) return { ok: false, reason: "revoked" };
  if (row.invitation.expiresAt.getTime() <= now.getTime()) return { ok: false, reason: "expired" };
  return {
    ok: true,
    invitation: row.invitation,
    studioName: row.studioName,
    hasAccount: !!findUserByEmail(row.invitation.email),
  };
}

/**
 * Marks the invitation used (only the first caller wins) and adds the person to
 * the studio, creating the account when `newAccount` is given. The invitee proved
 * they read mail at this address, so a new account starts verified.
 */
export async function acceptInvitation(
  invitation: Invitation,
  who: { existingUserId: string } | { newAccount: { name: string; password: string } },
  now = new Date(),
): Promise<string | null> {
  const passwordHash = "newAccount" in who ? await hashPassword(who.newAccount.password) : null;
  return db().transaction((tx) => {
    const claimed = tx
      .update(invitations)
      .set({ acceptedAt: now })
      .where(and(eq(invitations.id, invitation.id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      .run();
    if (claimed.changes !== 1) return null;
    let userId: string;
    if ("existingUserId" in who) userId = who.existingUserId;
    else {
      const user = tx
        .insert(users)
        .values({
          name: who.newAccount.name,
          email: invitation.email,
          passwordHash: passwordHash!,
          emailVerifiedAt: now,
        })
        .returning()
        .get();
      userId = user.id;
    }
    tx.update(invitations).set({ acceptedById: userId }).where(eq(invitations.id, invitation.id)).run();
    addMember(invitation.studioId, userId, invitation.role === "teacher" ? "teacher" : "student");
    return userId;
  });
}
