// The studio's time zone decides which ISO week each take belongs to; changing
// it recomputes every stored week key of the studio in one transaction.
import { eq } from "drizzle-orm";
import { db } from "~/db/client.server";
import { studios, takes } from "~/db/schema";
import { isValidTimeZone, weekKey } from "~/utils/weeks";

/** Returns how many takes moved to another week. */
export function setStudioTimeZone(studioId: string, timeZone: string): number {
  if (!isValidTimeZone(timeZone)) throw new Error(`Unknown time zone: ${timeZone}`);
  return db().transaction((tx) => {
    tx.update(studios).set({ timeZone }).where(eq(studios.id, studioId)).run();
    const rows = tx
      .select({ id: takes.id, recordedAt: takes.recordedAt, weekKey: takes.weekKey })
      .from(takes)
      .where(eq(takes.studioId, studioId))
      .all();
    let moved = 0;
    for (const r of rows) {
      const key = weekKey(r.recordedAt, timeZone);
      if (key === r.weekKey) continue;
      tx.update(takes).set({ weekKey: key }).where(eq(takes.id, r.id)).run();
      moved++;
    }
    return moved;
  });
}

/** Zone names the runtime knows, for the settings select. */
export function timeZoneNames(): string[] {
  const names =
    (Intl as unknown as { supportedValuesOf?: (k: string) => string[] }).supportedValuesOf?.("timeZone") ?? [];
  return names.includes("UTC") ? names : ["UTC", ...names];
}
