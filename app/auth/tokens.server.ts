import { createHash, randomBytes } from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "~/db/client.server";
import { userTokens, type UserTokenPurpose } from "~/db/schema";

export const HOUR_MS = 60 * 60 * 1000;
export const DAY_MS = 24 * HOUR_MS;

/** How long each kind of link stays usable. */
export const TOKEN_TTL_MS: Record<UserTokenPurpose, number> = {
  "verify-email": 7 * DAY_MS,
  "reset-password": HOUR_MS,
};

/** 32 random bytes, URL-safe: the secret part of every link Nearnote mails. */
export function newToken(): string {
  return randomBytes(32).toString("base64url");
}

/** Only this hash is stored, so the database alone never yields a working link. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** Issues a single-use token for a person; earlier unused ones of the same purpose stop working. */
export function issueUserToken(userId: string, purpose: UserTokenPurpose, now = new Date()): string {
  const token = newToken();
  db().transaction((tx) => {
    tx.delete(userTokens)
      .where(and(eq(userTokens.userId, userId), eq(userTokens.purpose, purpose), isNull(userTokens.usedAt)))
      .run();
    tx.insert(userTokens)
      .values({
        userId,
        purpose,
        tokenHash: hashToken(token),
        expiresAt: new Date(now.getTime() + TOKEN_TTL_MS[purpose]),
        createdAt: now,
      })
      .run();
  });
  return token;
}

export type TokenCheck =
  { ok: true; userId: string; tokenId: string } | { ok: false; reason: "unknown" | "used" | "expired" };

/** Looks a token up without using it (to decide whether to show a form). */
export function checkUserToken(token: string, purpose: UserTokenPurpose, now = new Date()): TokenCheck {
  const row = db()
    .select()
    .from(userTokens)
    .where(and(eq(userTokens.tokenHash, hashToken(token)), eq(userTokens.purpose, purpose)))
    .get();
  if (!row) return { ok: false, reason: "unknown" };
  if (row.usedAt) return { ok: false, reason: "used" };
  if (row.expiresAt.getTime() <= now.getTime()) return { ok: false, reason: "expired" };
  return { ok: true, userId: row.userId, tokenId: row.id };
}

/** Uses a token once: the update only succeeds for the first caller. */
export function consumeUserToken(token: string, purpose: UserTokenPurpose, now = new Date()): TokenCheck {
  const check = checkUserToken(token, purpose, now);
  if (!check.ok) return check;
  const result = db()
    .update(userTokens)
    .set({ usedAt: now })
    .where(and(eq(userTokens.id, check.tokenId), isNull(userTokens.usedAt)))
    .run();
  return result.changes === 1 ? check : { ok: false, reason: "used" };
}
