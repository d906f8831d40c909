import { createHmac, timingSafeEqual } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { db } from "~/db/client.server";
import { sentMails } from "~/db/schema";
import { env } from "~/server/env.server";
import { sendMail, type OutgoingMail } from "./mail.server";
import { link } from "./mailTemplates.server";

// Automatic mail (feedback notices, the teacher's daily digest, due-date reminders): the
// signed unsubscribe link every such mail carries, and sending each mail at most once.

export type MailPreference = "feedback" | "digest";
export type SentKind = "digest" | "due-reminder" | "feedback";

function sign(payload: string): string {
  return createHmac("sha256", env().sessionSecret).update(`unsubscribe:${payload}`).digest("base64url");
}

/** A token naming the person and the kind of mail; signed with the session secret, so it needs no sign-in. */
export function unsubscribeToken(userId: string, pref: MailPreference): string {
  const payload = Buffer.from(`${userId}:${pref}`).toString("base64url");
  return `${payload}.${sign(payload)}`;
}

export function readUnsubscribeToken(token: string): { userId: string; pref: MailPreference } | null {
  const [payload, mac] = token.split(".");
  if (!payload || !mac) return null;
  const want = Buffer.from(sign(payload));
  const got = Buffer.from(mac);
  if (want.length !== got.length || !timingSafeEqual(want, got)) return null;
  const [userId, pref] = Buffer.from(payload, "base64url").toString("utf8").split(":");
  if (!userId || (pref !== "feedback" && pref !== "digest")) return null;
  return { userId, pref };
}

export function unsubscribeLink(userId: string, pref: MailPreference) {
  return link(`/unsubscribe?token=${unsubscribeToken(userId, pref)}`);
}

/** The footer every automatic mail ends with. */
export function mailFooter(userId: string, pref: MailPreference): string[] {
  const what = pref === "feedback" ? "mail when your teacher comments" : "daily digests and due-date reminders";
  return [
    "",
    "--",
    `To stop ${what}, open this link (no sign-in needed):`,
    unsubscribeLink(userId, pref),
    "You can turn it back on in Settings.",
  ];
}

/**
 * Claims `key` for this person in the sent-mail log, then sends. The unique index makes the
 * claim atomic, so two runs (or a run after a restart) never send the same mail twice; a
 * failed send gives the claim back so the next run tries again.
 */
export async function sendOnce(
  kind: SentKind,
  userId: string,
  key: string,
  mail: OutgoingMail,
  now = new Date(),
): Promise<boolean> {
  const claimed = db()
    .insert(sentMails)
    .values({ kind, userId, key, sentAt: now })
    .onConflictDoNothing()
    .returning({ id: sentMails.id })
    .get();
  if (!claimed) return false;
  try {
    await sendMail(mail);
    return true;
  } catch (e) {
    db()
      .delete(sentMails)
      .where(and(eq(sentMails.id, claimed.id)))
      .run();
    throw e;
  }
}
