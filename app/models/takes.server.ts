import { and, desc, eq, isNull, lt, or, sql } from "drizzle-orm";
import type { FitWarning } from "~/analysis/exerciseFit";
import { ANALYSIS_VERSION, type NoteEvent, type PedalSpan, type TakeAnalysis } from "~/analysis";
import { db, preparedQuery } from "~/db/client.server";
import { exercises, takeMetrics, takes, users, type Take } from "~/db/schema";
import { analyseInWorker } from "~/takes/analysisPool.server";
import { readTakeFile, readTakeNotes, removeTakeFilesAfterRows } from "~/takes/takeFiles.server";
import { fitNotice, type FitNotice } from "~/takes/exerciseFitText";
import { weekKey } from "~/utils/weeks";
import { studioTimeZone } from "./progress.server";
import {
  clearAnalysisRows,
  exerciseTarget,
  storedAnalysis,
  writeAnalysisRows,
  type AnalysisOutcome,
} from "./takeAnalysis.server";

export type TakeView = {
  take: {
    id: string;
    studentId: string;
    studentName: string;
    studioId: string;
    exerciseId: string | null;
    exerciseTitle: string | null;
    key: string | null;
    note: string;
    originalName: string;
    size: number;
    status: Take["status"];
    error: string | null;
    recordedAt: string;
    createdAt: string;
    durationSec: number;
    analysisVersion: number | null;
  };
  analysis: TakeAnalysis | null;
  notes: NoteEvent[];
  pedal: PedalSpan[];
};

export function takeWeekKey(studioId: string, recordedAt: Date): string {
  return weekKey(recordedAt, studioTimeZone(studioId));
}

export type NewTake = {
  studentId: string;
  studioId: string;
  exerciseId: string | null;
  key: string | null;
  note: string;
  fileKey: string;
  originalName: string;
  size: number;
  contentHash: string;
  recordedAt: Date;
  /** Set when the take does not fit the exercise it was filed under. */
  exerciseFit?: FitWarning | null;
  outcome: AnalysisOutcome;
};

/** The take columns an analysis outcome sets (a new take and a replaced one alike). */
function outcomeColumns(outcome: AnalysisOutcome, studioId: string, recordedAt: Date) {
  return {
    status: outcome.ok ? ("analysed" as const) : ("failed" as const),
    error: outcome.ok ? null : outcome.error,
    weekKey: takeWeekKey(studioId, recordedAt),
    durationSec: outcome.ok ? outcome.analysis.summary.durationSec : 0,
    analysisVersion: ANALYSIS_VERSION,
  };
}

/** Writes a take with its metric row in one transaction; returns its id. */
export function createTakeRecord(t: NewTake): string {
  const { outcome, ...fields } = t;
  return db().transaction((tx) => {
    const take = tx
      .insert(takes)
      .values({
        ...fields,
        ...outcomeColumns(outcome, t.studioId, t.recordedAt),
      })
      .returning({ id: takes.id })
      .get();
    if (outcome.ok) writeAnalysisRows(tx, take.id, outcome.analysis);
    return take.id;
  });
}

const takeViewQuery = preparedQuery((database) =>
  database
    .select({ take: takes, studentName: users.name, exerciseTitle: exercises.title })
    .from(takes)
    .innerJoin(users, eq(users.id, takes.studentId))
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .where(eq(takes.id, sql.placeholder("takeId")))
    .prepare(),
);

/**
 * A take as its page shows it. The analysis and the notes are shared with other requests
 * (parsed once, see `storedAnalysis` and `readTakeNotes`): read them, never change them.
 */
export async function getTakeView(takeId: string): Promise<TakeView | null> {
  const row = takeViewQuery().get({ takeId });
  if (!row) return null;
  const t = row.take;
  const analysis = storedAnalysis(t.id);
  let notes: NoteEvent[] = [];
  let pedal: PedalSpan[] = [];
  if (t.status === "analysed") {
    const read = await readTakeNotes(t.fileKey);
    if (read) ({ notes, pedal } = read);
  }
  return {
    take: {
      id: t.id,
      studentId: t.studentId,
      studentName: row.studentName,
      studioId: t.studioId,
      exerciseId: t.exerciseId,
      exerciseTitle: row.exerciseTitle,
      key: t.key,
      note: t.note,
      originalName: t.originalName,
      size: t.size,
      status: t.status,
      error: t.error,
      recordedAt: t.recordedAt.toISOString(),
      createdAt: t.createdAt.toISOString(),
      durationSec: t.durationSec,
      analysisVersion: t.analysisVersion,
    },
    analysis,
    notes,
    pedal,
  };
}

export type TakeListRow = {
  id: string;
  recordedAt: string;
  exerciseId: string | null;
  exerciseTitle: string | null;
  key: string | null;
  status: string;
  error: string | null;
  originalName: string;
  chordCount: number | null;
  smoothness: number | null;
  rootPositionLeaps: number | null;
  score: number | null;
  accuracy: number | null;
};

export function listTakesForStudent(
  studentId: string,
  opts: { studioId?: string; limit?: number } = {},
): TakeListRow[] {
  const rows = db()
    .select({
      id: takes.id,
      recordedAt: takes.recordedAt,
      exerciseId: takes.exerciseId,
      exerciseTitle: exercises.title,
      key: takes.key,
      status: takes.status,
      error: takes.error,
      originalName: takes.originalName,
      chordCount: takeMetrics.chordCount,
      smoothness: takeMetrics.smoothness,
      rootPositionLeaps: takeMetrics.rootPositionLeaps,
      score: takeMetrics.score,
      accuracy: takeMetrics.accuracy,
    })
    .from(takes)
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .leftJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
    .where(and(eq(takes.studentId, studentId), opts.studioId ? eq(takes.studioId, opts.studioId) : undefined))
    .orderBy(desc(takes.recordedAt))
    .limit(opts.limit ?? 200)
    .all();
  return rows.map((r) => ({ ...r, recordedAt: r.recordedAt.toISOString() }));
}

/** Smoothness (a ratio of sums) and mean score per ISO week, from metric rows only. */
export function weeklyFiguresForStudent(studentId: string, studioId: string) {
  return db()
    .select({
      week: takes.weekKey,
      takes: sql<number>`count(*)`,
      totalMotion: sql<number>`coalesce(sum(${takeMetrics.totalMotion}), 0)`,
      bestTotalMotion: sql<number>`coalesce(sum(${takeMetrics.bestTotalMotion}), 0)`,
      score: sql<number | null>`avg(${takeMetrics.score})`,
    })
    .from(takes)
    .innerJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
    .where(and(eq(takes.studentId, studentId), eq(takes.studioId, studioId)))
    .groupBy(takes.weekKey)
    .orderBy(takes.weekKey)
    .all()
    .map((w) => ({
      week: w.week,
      takes: w.takes,
      smoothness: w.totalMotion === 0 ? 1 : w.bestTotalMotion / w.totalMotion,
      score: w.score === null ? null : Math.round(w.score * 10) / 10,
    }));
}

/** Removes the take and its rows (by cascade) first, then its file. */
export async function deleteTake(takeId: string) {
  const take = db().select().from(takes).where(eq(takes.id, takeId)).get();
  if (!take) return;
  db().delete(takes).where(eq(takes.id, takeId)).run();
  await removeTakeFilesAfterRows([take.fileKey]);
}

/**
 * Writes an analysis outcome onto a take, provided the take still has the file that
 * was analysed (it may have been replaced or deleted while a worker was busy).
 */
function writeOutcome(take: Pick<Take, "id" | "fileKey">, outcome: AnalysisOutcome): boolean {
  return db().transaction((tx) => {
    const set = outcome.ok
      ? {
          status: "analysed" as const,
          error: null,
          durationSec: outcome.analysis.summary.durationSec,
          analysisVersion: ANALYSIS_VERSION,
        }
      : { status: "failed" as const, error: outcome.error, analysisVersion: ANALYSIS_VERSION };
    const updated = tx
      .update(takes)
      .set(set)
      .where(and(eq(takes.id, take.id), eq(takes.fileKey, take.fileKey)))
      .run();
    if (updated.changes !== 1) return false;
    if (outcome.ok) writeAnalysisRows(tx, take.id, outcome.analysis);
    else clearAnalysisRows(tx, take.id);
    return true;
  });
}

/** Re-runs the engine on a stored take from its file (after a move, or a newer engine). */
export async function reanalyseTake(takeId: string): Promise<"analysed" | "failed" | null> {
  const take = db().select().from(takes).where(eq(takes.id, takeId)).get();
  if (!take) return null;
  const bytes = await readTakeFile(take.fileKey);
  if (!bytes) return null;
  const outcome = await analyseInWorker(bytes, {
    key: take.key,
    target: exerciseTarget(db(), take.exerciseId, take.key),
  });
  if (!writeOutcome(take, outcome)) return null;
  return outcome.ok ? "analysed" : "failed";
}

export type Replacement = Omit<NewTake, "studentId" | "studioId">;

/**
 * Puts a new recording into an existing take, in place: the take keeps its id,
 * studio, comments, review state and intended-flag marks (all point to the take).
 * The take is claimed by the file it had when the replacement began, so of
 * several replacements racing only one lands; returns the file key it replaced,
 * or null when the take was replaced or deleted meanwhile.
 */
export function replaceTakeRecord(takeId: string, expectedFileKey: string, r: Replacement): string | null {
  const { outcome, ...fields } = r;
  return db().transaction((tx) => {
    const take = tx
      .select({ studioId: takes.studioId })
      .from(takes)
      .where(and(eq(takes.id, takeId), eq(takes.fileKey, expectedFileKey)))
      .get();
    if (!take) return null;
    tx.update(takes)
      .set({
        ...fields,
        ...outcomeColumns(outcome, take.studioId, r.recordedAt),
      })
      .where(eq(takes.id, takeId))
      .run();
    if (outcome.ok) writeAnalysisRows(tx, takeId, outcome.analysis);
    else clearAnalysisRows(tx, takeId);
    return expectedFileKey;
  });
}

/**
 * The take's warning that it does not fit its exercise, with the titles of that exercise and of
 * the likely one (offered only while that exercise is open), or null when it fits.
 */
const fitQuery = preparedQuery((database) =>
  database
    .select({ fit: takes.exerciseFit, title: exercises.title })
    .from(takes)
    .innerJoin(exercises, eq(exercises.id, takes.exerciseId))
    .where(eq(takes.id, sql.placeholder("takeId")))
    .prepare(),
);

export function fitNoticeForTake(takeId: string): FitNotice | null {
  const row = fitQuery().get({ takeId });
  if (!row?.fit) return null;
  const likelyId = row.fit.likely?.exerciseId;
  const likely = likelyId
    ? db()
        .select({ title: exercises.title })
        .from(exercises)
        .where(and(eq(exercises.id, likelyId), isNull(exercises.archivedAt)))
        .get()
    : undefined;
  return fitNotice(row.fit, row.title, new Map(likely && likelyId ? [[likelyId, likely.title]] : [])) ?? null;
}

/** Attaches a take to another exercise (or none) and grades it again against that target. */
export async function moveTake(takeId: string, exerciseId: string | null, key: string | null) {
  db().update(takes).set({ exerciseId, key, exerciseFit: null }).where(eq(takes.id, takeId)).run();
  await reanalyseTake(takeId);
}

/** Takes analysed by an older engine (or never): what `npm run reanalyse` and the start-up pass work through. */
export function outdatedTakeIds(limit = 1000): string[] {
  return db()
    .select({ id: takes.id })
    .from(takes)
    .where(or(isNull(takes.analysisVersion), lt(takes.analysisVersion, ANALYSIS_VERSION)))
    .limit(limit)
    .all()
    .map((r) => r.id);
}

export async function reanalyseOutdated(onProgress?: (done: number, total: number) => void) {
  const ids = outdatedTakeIds(1_000_000);
  let done = 0;
  const counts = { analysed: 0, failed: 0, missing: 0 };
  for (const id of ids) {
    const status = await reanalyseTake(id);
    counts[status ?? "missing"]++;
    onProgress?.(++done, ids.length);
    // Yield between takes so a background pass never blocks requests for long.
    await new Promise((r) => setImmediate(r));
  }
  return { total: ids.length, ...counts };
}
