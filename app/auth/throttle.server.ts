import { and, count, eq, gt, lt, min } from "drizzle-orm";
import { db } from "~/db/client.server";
import { signInFailures } from "~/db/schema";

export const MAX_FAILURES = 5;
export const FAILURE_WINDOW_MS = 15 * 60 * 1000;

/**
 * The client address for throttling. Behind a proxy the first X-Forwarded-For
 * entry is the visitor; a direct connection carries none, so all direct
 * visitors share one bucket per e-mail (stricter, never looser).
 */
export function clientAddress(request: Request): string {
  const forwarded = request.headers.get("x-forwarded-for")?.split(",")[0]?.trim();
  return forwarded || request.headers.get("x-real-ip")?.trim() || "direct";
}

export type ThrottleState = { blocked: false } | { blocked: true; retryAt: Date };

/**
 * Spread over many addresses (or a forged X-Forwarded-For), guessing at one
 * account is still capped: this many failures for one e-mail from anywhere.
 */
export const MAX_FAILURES_PER_EMAIL = 20;

function failuresSince(email: string, address: string | null, since: Date) {
  const where = address
    ? and(eq(signInFailures.email, email), eq(signInFailures.address, address), gt(signInFailures.createdAt, since))
    : and(eq(signInFailures.email, email), gt(signInFailures.createdAt, since));
  const row = db()
    .select({ n: count(), oldest: min(signInFailures.createdAt) })
    .from(signInFailures)
    .where(where)
    .get();
  const oldest = row?.oldest ? (row.oldest instanceof Date ? row.oldest : new Date(Number(row.oldest))) : null;
  return { n: row?.n ?? 0, oldest };
}

/** Blocked once MAX_FAILURES failures for this e-mail and address (or the per-e-mail cap) fall within the window. */
export function signInThrottle(email: string, address: string, now = new Date()): ThrottleState {
  const since = new Date(now.getTime() - FAILURE_WINDOW_MS);
  for (const [key, limit] of [
    [address, MAX_FAILURES],
    [null, MAX_FAILURES_PER_EMAIL],
  ] as const) {
    const { n, oldest } = failuresSince(email, key, since);
    // When the oldest failure in the window ages out, a try is allowed again.
    if (n >= limit && oldest) return { blocked: true, retryAt: new Date(oldest.getTime() + FAILURE_WINDOW_MS) };
  }
  return { blocked: false };
}

/**
 * Checks the throttle and, when not blocked, records this attempt as a failure in the
 * same transaction, before the slow password comparison. Parallel guesses therefore
 * each see the ones before them: only MAX_FAILURES get as far as bcrypt, the rest are
 * blocked. A correct password clears the record again (`clearSignInFailures`); for an
 * attempt that ends in an unexpected error, `forgetSignInAttempt` takes it back.
 */
export function claimSignInAttempt(
  email: string,
  address: string,
  now = new Date(),
): { blocked: true; retryAt: Date } | { blocked: false; attemptId: string } {
  return db().transaction(
    (tx) => {
      const state = signInThrottle(email, address, now);
      if (state.blocked) return state;
      const row = tx
        .insert(signInFailures)
        .values({ email, address, createdAt: now })
        .returning({ id: signInFailures.id })
        .get();
      trimOldFailures(now);
      return { blocked: false as const, attemptId: row.id };
    },
    // IMMEDIATE takes the write lock before the count, so a second server process on the
    // same database cannot count in between either.
    { behavior: "immediate" },
  );
}

export function forgetSignInAttempt(attemptId: string) {
  db().delete(signInFailures).where(eq(signInFailures.id, attemptId)).run();
}

function trimOldFailures(now: Date) {
  // Old rows are worthless; trim them as we go rather than with a scheduled job.
  db()
    .delete(signInFailures)
    .where(lt(signInFailures.createdAt, new Date(now.getTime() - 2 * FAILURE_WINDOW_MS)))
    .run();
}

/** A successful sign-in clears this e-mail and address's record, its own claimed attempt included. */
export function clearSignInFailures(email: string, address: string) {
  db()
    .delete(signInFailures)
    .where(and(eq(signInFailures.email, email), eq(signInFailures.address, address)))
    .run();
}

/** "Try again at 14:05 (in 12 minutes)." */
export function retryMessage(retryAt: Date, now = new Date()): string {
  const minutes = Math.max(1, Math.ceil((retryAt.getTime() - now.getTime()) / 60000));
  const clock = retryAt.toISOString().slice(11, 16);
  return `Too many failed sign-ins for this e-mail. Try again in ${minutes} minute${minutes === 1 ? "" : "s"} (after ${clock} UTC), or reset your password.`;
}
