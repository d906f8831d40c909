import { and, eq, gt, ne } from "drizzle-orm";
import { z } from "zod";
import { hashPassword, spendPasswordCheck, verifyPassword } from "~/auth/password.server";
import { consumeUserToken, issueUserToken } from "~/auth/tokens.server";
import { db } from "~/db/client.server";
import { memberships, sessions, studios, userTokens, users, type User } from "~/db/schema";
import { sendMail } from "~/lib/mail.server";
import { resetPasswordMail, verifyEmailMail } from "~/lib/mailTemplates.server";

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
  return db().select().from(users).where(eq(users.email, normaliseEmail(email))).get();
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

/** A new teacher and the studio they own. The e-mail is unverified until the mailed link is opened. */
export async function createTeacherWithStudio(input: {
  name: string;
  email: string;
  password: string;
  studioName: string;
}): Promise<{ user: User; studioId: string }> {
  const passwordHash = await hashPassword(input.password);
  const result = db().transaction((tx) => {
    const user = tx
      .insert(users)
      .values({ name: input.name, email: normaliseEmail(input.email), passwordHash })
      .returning()
      .get();
    const studio = tx.insert(studios).values({ name: input.studioName }).returning().get();
    tx.insert(memberships).values({ userId: user.id, studioId: studio.id, role: "owner" }).run();
    return { user, studioId: studio.id };
  });
  await sendVerificationMail(result.user);
  return result;
}

export async function sendVerificationMail(user: Pick<User, "id" | "email" | "name">) {
  const token = issueUserToken(user.id, "verify-email");
  await sendMail(verifyEmailMail(user.email, user.name, token));
}

/** Marks the address verified when the token is good; returns the user id or null. */
export function verifyEmailToken(token: string): string | null {
  const check = consumeUserToken(token, "verify-email");
  if (!check.ok) return null;
  db().update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, check.userId)).run();
  return check.userId;
}

export const RESET_MAIL_INTERVAL_MS = 60 * 1000;

/** Mails a reset link when the address is known; the caller answers the same way either way. */
export async function requestPasswordReset(email: string, now = new Date()) {
  const user = findUserByEmail(email);
  if (!user) return;
  // One reset mail a minute per person: the form cannot be used to flood an inbox.
  const recent = db()
    .select({ id: userTokens.id })
    .from(userTokens)
    .where(
      and(
        eq(userTokens.userId, user.id),
        eq(userTokens.purpose, "reset-password"),
        gt(userTokens.createdAt, new Date(now.getTime() - RESET_MAIL_INTERVAL_MS)),
      ),
    )
    .get();
  if (recent) return;
  const token = issueUserToken(user.id, "reset-password");
  await sendMail(resetPasswordMail(user.email, user.name, token));
}

/** Sets a new password and ends every session of that person except `keepSessionId`. */
export async function setPassword(userId: string, password: string, keepSessionId?: string) {
  const passwordHash = await hashPassword(password);
  db().transaction((tx) => {
    tx.update(users).set({ passwordHash }).where(eq(users.id, userId)).run();
    tx.delete(sessions)
      .where(keepSessionId ? and(eq(sessions.userId, userId), ne(sessions.id, keepSessionId)) : eq(sessions.userId, userId))
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
export async function changeEmail(userId: string, email: string): Promise<"taken" | "changed"> {
  const normalised = normaliseEmail(email);
  const other = findUserByEmail(normalised);
  if (other && other.id !== userId) return "taken";
  const user = db()
    .update(users)
    .set({ email: normalised, emailVerifiedAt: null })
    .where(eq(users.id, userId))
    .returning()
    .get();
  await sendVerificationMail(user);
  return "changed";
}
