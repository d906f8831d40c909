import { and, eq, lt, ne } from "drizzle-orm";
import { z } from "zod";
import { hashPassword, spendPasswordCheck, verifyPassword } from "~/auth/password.server";
import { accountKey, addressKey, claimAccountMail, type MailClaim } from "~/auth/mailLimits.server";
import { consumeUserToken, DAY_MS, hashToken, issueUserToken, newToken } from "~/auth/tokens.server";
import { db } from "~/db/client.server";
import { memberships, pendingSignups, sessions, studios, users, type User } from "~/db/schema";
import { sendMail, sendMailLater } from "~/mail/mail.server";
import {
  confirmSignupMail,
  existingAccountMail,
  resetPasswordMail,
  verifyEmailMail,
} from "~/mail/mailTemplates.server";

export const emailSchema = z
  .string({ error: "Enter your e-mail address" })
  .trim()
  .toLowerCase()
  .min(1, "Enter your e-mail address")
  .max(254, "That address is too long")
  .pipe(z.email({ error: "Enter a valid e-mail address" }));

export const nameSchema = z
  .string({ error: "Enter a name" })
  .trim()
  .min(1, "Enter a name")
  .max(80, "Use at most 80 characters");

export function normaliseEmail(email: string) {
  return email.trim().toLowerCase();
}

export function findUserByEmail(email: string): User | undefined {
  return db()
    .select()
    .from(users)
    .where(eq(users.email, normaliseEmail(email)))
    .get();
}

export function getUser(id: string): User | undefined {
  return db().select().from(users).where(eq(users.id, id)).get();
}

/** The person behind these credentials, or null; an unknown e-mail costs as much time as a wrong password. */
export async function checkCredentials(email: string, password: string): Promise<User | null> {
  const user = findUserByEmail(email);
  if (!user) {
    await spendPasswordCheck(password);
    return null;
  }
  return (await verifyPassword(password, user.passwordHash)) ? user : null;
}

export const SIGNUP_TTL_MS = DAY_MS;

export type SignupInput = { name: string; email: string; password: string; studioName: string };

/**
 * Starts a studio sign-up. Nothing is created yet: a new address gets a link that creates
 * the account and studio when opened; an address that already has an account gets a
 * "you already have an account" mail instead. Either way the same work is done before the
 * caller answers (one bcrypt hash) and the mail goes out afterwards, so neither the answer
 * nor its timing tells whether the address is taken.
 */
export async function startSignup(input: SignupInput, now = new Date()): Promise<void> {
  const email = normaliseEmail(input.email);
  const passwordHash = await hashPassword(input.password);
  // Limited per address whether or not it has an account, so the limit reveals nothing either.
  if (!claimAccountMail("signup", addressKey(email), now).ok) return;
  if (findUserByEmail(email)) {
    sendMailLater(existingAccountMail(email));
    return;
  }
  const token = newToken();
  db().transaction((tx) => {
    tx.delete(pendingSignups).where(lt(pendingSignups.expiresAt, now)).run();
    tx.insert(pendingSignups)
      .values({
        email,
        name: input.name,
        passwordHash,
        studioName: input.studioName,
        tokenHash: hashToken(token),
        expiresAt: new Date(now.getTime() + SIGNUP_TTL_MS),
        createdAt: now,
      })
      .run();
  });
  sendMailLater(confirmSignupMail(email, { name: input.name, studioName: input.studioName, token }));
}

export type SignupConfirmation =
  { kind: "created"; user: User; studioId: string } | { kind: "taken" } | { kind: "invalid" };

/**
 * Opening a sign-up link: the address is proven, so the teacher, their studio and the owner
 * membership are created verified. Only now may we say the address is taken (another
 * sign-up or an invitation got there first). A link works once.
 */
export function confirmSignup(token: string, now = new Date()): SignupConfirmation {
  return db().transaction(
    (tx) => {
      const pending = tx
        .select()
        .from(pendingSignups)
        .where(eq(pendingSignups.tokenHash, hashToken(token)))
        .get();
      if (!pending) return { kind: "invalid" as const };
      tx.delete(pendingSignups).where(eq(pendingSignups.id, pending.id)).run();
      if (pending.expiresAt.getTime() <= now.getTime()) return { kind: "invalid" as const };
      if (findUserByEmail(pending.email)) return { kind: "taken" as const };
      // Other sign-ups for this address could only ever say "taken" now.
      tx.delete(pendingSignups).where(eq(pendingSignups.email, pending.email)).run();
      const user = tx
        .insert(users)
        .values({ name: pending.name, email: pending.email, passwordHash: pending.passwordHash, emailVerifiedAt: now })
        .returning()
        .get();
      const studio = tx.insert(studios).values({ name: pending.studioName }).returning().get();
      tx.insert(memberships).values({ userId: user.id, studioId: studio.id, role: "owner" }).run();
      return { kind: "created" as const, user, studioId: studio.id };
    },
    { behavior: "immediate" },
  );
}

/**
 * Mails a fresh confirmation link to the person's current address, within the account mail
 * limits (one a minute, a few a day per account, however often the address changes).
 */
export async function sendVerificationMail(
  user: Pick<User, "id" | "email" | "name">,
  now = new Date(),
): Promise<MailClaim> {
  const claim = claimAccountMail("verify-email", accountKey(user.id), now);
  if (!claim.ok) return claim;
  const token = issueUserToken(user.id, "verify-email", now);
  await sendMail(verifyEmailMail(user.email, user.name, token));
  return claim;
}

/** Marks the address verified when the token is good; returns the user id or null. */
export function verifyEmailToken(token: string): string | null {
  const check = consumeUserToken(token, "verify-email");
  if (!check.ok) return null;
  db().update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, check.userId)).run();
  return check.userId;
}

/**
 * Mails a reset link when the address is known, within the account mail limits. The mail
 * goes out after the caller has answered, so a known address answers as fast as an unknown one.
 */
export function requestPasswordReset(email: string, now = new Date()): void {
  // Claimed per address before the lookup, so a known and an unknown address do the same
  // database write (and the limit behaves the same for both).
  if (!claimAccountMail("reset-password", addressKey(normaliseEmail(email)), now).ok) return;
  const user = findUserByEmail(email);
  if (!user) return;
  const token = issueUserToken(user.id, "reset-password", now);
  sendMailLater(resetPasswordMail(user.email, user.name, token));
}

/** Sets a new password and ends every session of that person except `keepSessionId`. */
export async function setPassword(userId: string, password: string, keepSessionId?: string) {
  const passwordHash = await hashPassword(password);
  db().transaction((tx) => {
    tx.update(users).set({ passwordHash }).where(eq(users.id, userId)).run();
    tx.delete(sessions)
      .where(
        keepSessionId ? and(eq(sessions.userId, userId), ne(sessions.id, keepSessionId)) : eq(sessions.userId, userId),
      )
      .run();
  });
}

export function updateName(userId: string, name: string) {
  db().update(users).set({ name }).where(eq(users.id, userId)).run();
}

export function updateMailPreferences(userId: string, prefs: { mailOnFeedback: boolean; mailDigest: boolean }) {
  db().update(users).set(prefs).where(eq(users.id, userId)).run();
}

/** A new address must be confirmed again before it counts as verified. */
export async function changeEmail(
  userId: string,
  email: string,
): Promise<{ kind: "taken" } | { kind: "changed"; mail: MailClaim }> {
  const normalised = normaliseEmail(email);
  const other = findUserByEmail(normalised);
  if (other && other.id !== userId) return { kind: "taken" };
  const user = db()
    .update(users)
    .set({ email: normalised, emailVerifiedAt: null })
    .where(eq(users.id, userId))
    .returning()
    .get();
  return { kind: "changed", mail: await sendVerificationMail(user) };
}
