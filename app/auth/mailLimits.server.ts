import { and, desc, eq, gt, lt } from "drizzle-orm";
import { db } from "~/db/client.server";
import { accountMailSends, type AccountMailKind } from "~/db/schema";
import { DAY_MS } from "./tokens.server";

/** One account mail of a kind per minute for one account (or address)… */
export const ACCOUNT_MAIL_INTERVAL_MS = 60 * 1000;
/** …and at most this many in any 24 hours, so no form can be used to flood an inbox. */
export const ACCOUNT_MAILS_PER_DAY = 5;

export type MailClaim = { ok: true } | { ok: false; reason: "too-soon" | "daily-cap"; retryAt: Date };

export const accountKey = (userId: string) => `user:${userId}`;
export const addressKey = (email: string) => `email:${email}`;

/**
 * Claims the right to send one account mail: checked and written in one transaction
 * (IMMEDIATE, so parallel posts count each other). Call before sending; when it says
 * no, send nothing.
 */
export function claimAccountMail(kind: AccountMailKind, key: string, now = new Date()): MailClaim {
  return db().transaction(
    (tx) => {
      const recent = tx
        .select({ sentAt: accountMailSends.sentAt })
        .from(accountMailSends)
        .where(
          and(
            eq(accountMailSends.kind, kind),
            eq(accountMailSends.key, key),
            gt(accountMailSends.sentAt, new Date(now.getTime() - DAY_MS)),
          ),
        )
        .orderBy(desc(accountMailSends.sentAt))
        .all();
      if (recent.length >= ACCOUNT_MAILS_PER_DAY) {
        return {
          ok: false as const,
          reason: "daily-cap" as const,
          retryAt: new Date(recent[recent.length - 1].sentAt.getTime() + DAY_MS),
        };
      }
      const last = recent[0]?.sentAt;
      if (last && last.getTime() > now.getTime() - ACCOUNT_MAIL_INTERVAL_MS) {
        return {
          ok: false as const,
          reason: "too-soon" as const,
          retryAt: new Date(last.getTime() + ACCOUNT_MAIL_INTERVAL_MS),
        };
      }
      tx.insert(accountMailSends).values({ kind, key, sentAt: now }).run();
      // Rows older than the window count for nothing; trim them as we go.
      tx.delete(accountMailSends)
        .where(lt(accountMailSends.sentAt, new Date(now.getTime() - 2 * DAY_MS)))
        .run();
      return { ok: true as const };
    },
    { behavior: "immediate" },
  );
}

/** "You can ask again in 1 minute." / "…tomorrow after 14:05 UTC." */
export function mailRetryMessage(claim: Extract<MailClaim, { ok: false }>, now = new Date()): string {
  if (claim.reason === "daily-cap") {
    return `You have asked for ${ACCOUNT_MAILS_PER_DAY} of these mails today. You can ask again after ${claim.retryAt.toISOString().slice(11, 16)} UTC.`;
  }
  const seconds = Math.max(1, Math.ceil((claim.retryAt.getTime() - now.getTime()) / 1000));
  return `We sent one less than a minute ago: check your inbox (and spam folder). You can ask again in ${seconds} second${seconds === 1 ? "" : "s"}.`;
}
