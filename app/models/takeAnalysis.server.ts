import type Database from "better-sqlite3";
import { eq, sql } from "drizzle-orm";
import { LRUCache } from "lru-cache";
import type { TakeAnalysis } from "~/analysis";
import { db, preparedQuery, type Db, type Tx } from "~/db/client.server";
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
  forgetStoredAnalysis(takeId);
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
  forgetStoredAnalysis(takeId);
}

/**
 * Stored analyses already parsed, by take (a page view, its windows and the feedback on it
 * then parse the JSON once, not on every request), bounded by the length of their JSON. They
 * are frozen, as every reader shares them. This process's writes go through the two functions
 * above, which drop the take's entry; a write by another connection (a script, a restore)
 * changes SQLite's `data_version`, and then the whole cache is dropped.
 */
const parsedAnalyses = new LRUCache<string, TakeAnalysis>({ maxSize: 64 * 1024 * 1024 });
let parsedFrom: { client: Database.Database; dataVersion: unknown } | null = null;

function forgetStoredAnalysis(takeId: string) {
  parsedAnalyses.delete(takeId);
}

const dataVersionQuery = preparedQuery((database) => database.$client.prepare("PRAGMA data_version").pluck());

const analysisTextQuery = preparedQuery((database) =>
  database
    .select({ text: sql<string>`${takeMetrics.analysis}` })
    .from(takeMetrics)
    .where(eq(takeMetrics.takeId, sql.placeholder("takeId")))
    .prepare(),
);

function deepFreeze<T>(value: T): T {
  if (value && typeof value === "object" && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

/** The take's stored analysis (null: none stored), parsed once and shared: never change it. */
export function storedAnalysis(takeId: string): TakeAnalysis | null {
  const client = db().$client;
  // Inside a transaction the row may yet be rolled back: read it without keeping it.
  const keep = !client.inTransaction;
  if (keep) {
    const dataVersion = dataVersionQuery().get();
    if (parsedFrom?.client !== client || parsedFrom.dataVersion !== dataVersion) {
      parsedAnalyses.clear();
      parsedFrom = { client, dataVersion };
    }
    const known = parsedAnalyses.get(takeId);
    if (known) return known;
  }
  const text = analysisTextQuery().get({ takeId })?.text;
  if (text === undefined || text === null) return null;
  const analysis = deepFreeze(JSON.parse(text) as TakeAnalysis);
  if (keep && text.length <= parsedAnalyses.maxSize) parsedAnalyses.set(takeId, analysis, { size: text.length || 1 });
  return analysis;
}
