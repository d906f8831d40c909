import { eq } from "drizzle-orm";
import type { TakeAnalysis } from "~/analysis/types";
import type { Db, Tx } from "~/db/client.server";
import { intendedFlags, takeMetrics } from "~/db/schema";
import { scoreWithIntended, type IntendedMark } from "~/takes/intendedScore";

export function intendedMarks(database: Db | Tx, takeId: string): IntendedMark[] {
  return database
    .select({ on: intendedFlags.on, idx: intendedFlags.idx, flag: intendedFlags.flag })
    .from(intendedFlags)
    .where(eq(intendedFlags.takeId, takeId))
    .all();
}

/**
 * Writes the take's score and flag counts with its intended flags left out. Called by every
 * path that writes analysis rows (upload, re-analysis, move) and whenever a mark changes;
 * the engine's own score stays in `take_metrics.analysis`.
 */
export function applyIntendedFlags(database: Db | Tx, takeId: string, analysis: TakeAnalysis) {
  const result = scoreWithIntended(analysis, intendedMarks(database, takeId));
  database
    .update(takeMetrics)
    .set({ score: result.score, flags: result.flags, rootPositionLeaps: result.rootPositionLeaps })
    .where(eq(takeMetrics.takeId, takeId))
    .run();
  return result;
}
