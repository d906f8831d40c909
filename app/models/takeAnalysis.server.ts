import { eq } from "drizzle-orm";
import type { TakeAnalysis } from "~/analysis";
import type { Db } from "~/db/client.server";
import { changeResults, chordEvents, exercises, takeMetrics } from "~/db/schema";
import { analyseTake, type AnalysisOutcome } from "~/lib/analysisWorker/task";
import { targetTextForKey } from "~/lib/exerciseProgression";
import { applyIntendedFlags } from "./intendedFlags.server";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

export type { AnalysisOutcome };

/** What the engine needs to know about the exercise a take belongs to: its target in the take's key. */
export function exerciseTarget(database: Db | Tx, exerciseId: string | null, key: string | null = null): string | undefined {
  if (!exerciseId) return undefined;
  const row = database.select({ p: exercises.progression, keys: exercises.keys }).from(exercises).where(eq(exercises.id, exerciseId)).get();
  return row && targetTextForKey(row.p, row.keys, key);
}

/**
 * Runs the engine on a take's bytes on this thread. Only for the command line
 * (seeding, benchmarks): the server analyses uploads with `analyseInWorker`.
 */
export function analyseTakeBytes(bytes: Uint8Array, options: { key?: string | null; target?: string }): AnalysisOutcome {
  return analyseTake(bytes, options);
}

/** Replaces a take's metric, chord and change rows with those of `analysis` (inside the caller's transaction). */
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
  // SQLite allows at most 32,766 bound values per statement: insert in slices.
  const chordRows = analysis.chords.map((c, idx) => ({
    takeId,
    idx,
    startSec: c.startSec,
    endSec: c.endSec,
    notes: c.notes,
    graceNotes: c.graceNotes.map((g) => g.note),
    root: c.root,
    bass: c.bass,
    symbol: c.symbol,
    roman: c.roman,
    quality: c.quality,
    inversion: c.inversion,
    upperInversion: c.upperInversion,
    voicing: c.voicing,
    topNote: c.topNote,
    flags: c.flags,
    techniques: c.techniques,
  }));
  for (let i = 0; i < chordRows.length; i += 500) tx.insert(chordEvents).values(chordRows.slice(i, i + 500)).run();
  const changeRows = analysis.changes.map((c, idx) => ({
    takeId,
    idx,
    fromIdx: c.from,
    toIdx: c.to,
    motion: c.motion,
    bestMotion: c.bestMotion,
    bestVoicing: c.bestVoicing,
    suggestions: c.suggestions,
    flags: c.flags,
    bassMotion: c.bassMotion,
    topInterval: c.topVoiceInterval,
    commonTones: c.commonTones,
    largestMove: c.largestVoiceMove,
  }));
  for (let i = 0; i < changeRows.length; i += 500) tx.insert(changeResults).values(changeRows.slice(i, i + 500)).run();
  // Flags the teacher marked as intended stay out of the score after every re-analysis.
  applyIntendedFlags(tx, takeId, analysis);
}

export function clearAnalysisRows(tx: Tx, takeId: string) {
  tx.delete(takeMetrics).where(eq(takeMetrics.takeId, takeId)).run();
  tx.delete(chordEvents).where(eq(chordEvents.takeId, takeId)).run();
  tx.delete(changeResults).where(eq(changeResults.takeId, takeId)).run();
}
