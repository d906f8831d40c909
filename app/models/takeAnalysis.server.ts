import { eq } from "drizzle-orm";
import type { TakeAnalysis } from "~/analysis";
import type { Db, Tx } from "~/db/client.server";
import { exercises, takeMetrics } from "~/db/schema";
import { analyseTake, type AnalysisOutcome } from "~/takes/analysisWorker/task";
import { targetTextForKey } from "~/utils/exerciseProgression";
import { applyIntendedFlags } from "./intendedFlags.server";

export type { AnalysisOutcome };

/** What the engine needs to know about the exercise a take belongs to: its target in the take's key. */
export function exerciseTarget(
  database: Db | Tx,
  exerciseId: string | null,
  key: string | null = null,
): string | undefined {
  if (!exerciseId) return undefined;
  const row = database
    .select({ p: exercises.progression, keys: exercises.keys })
    .from(exercises)
    .where(eq(exercises.id, exerciseId))
    .get();
  return row && targetTextForKey(row.p, row.keys, key);
}

/**
 * Runs the engine on a take's bytes on this thread. Only for the command line
 * (seeding, benchmarks): the server analyses uploads with `analyseInWorker`.
 */
export function analyseTakeBytes(
  bytes: Uint8Array,
  options: { key?: string | null; target?: string },
): AnalysisOutcome {
  return analyseTake(bytes, options);
}

/** Replaces a take's metrics row (figures and the whole analysis) with those of `analysis` (inside the caller's transaction). */
export function writeAnalysisRows(tx: Tx, takeId: string, analysis: TakeAnalysis) {
  clearAnalysisRows(tx, takeId);
  const s = analysis.summary;
  tx.insert(takeMetrics)
    .values({
      takeId,
      chordCount: s.chordCount,
      changeCount: s.gradedChangeCount,
      melodyNoteCount: s.melodyNoteCount,
      totalMotion: s.totalMotion,
      bestTotalMotion: s.bestTotalMotion,
      smoothness: s.smoothness,
      rootPositionLeaps: s.rootPositionLeaps,
      score: s.score,
      accuracy: s.accuracy ?? null,
      estimatedKey: s.key,
      tempoSteadiness: s.tempo.steadiness,
      flags: s.flags,
      techniques: s.techniques,
      topLine: analysis.chords.map((c) => c.topNote),
      mismatches: s.mismatches ?? null,
      analysis,
    })
    .run();
  // Flags the teacher marked as intended stay out of the score after every re-analysis.
  applyIntendedFlags(tx, takeId, analysis);
}

export function clearAnalysisRows(tx: Tx, takeId: string) {
  tx.delete(takeMetrics).where(eq(takeMetrics.takeId, takeId)).run();
}
