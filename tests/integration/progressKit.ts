// Hand-made takes for the progress tests: a take row saved through the real
// week-key rule, plus one take_metrics row with figures chosen by hand (no MIDI,
// no engine), so every expected weekly figure can be worked out on paper.
import type { TakeAnalysis } from "~/analysis/types";
import { db } from "~/db/client.server";
import { takeMetrics, takes } from "~/db/schema";
import { takeWeekKey } from "~/models/takes.server";

export type HandTake = {
  studentId: string;
  studioId: string;
  at: string; // ISO instant
  exerciseId?: string | null;
  failed?: boolean;
  durationSec?: number;
  changes?: number;
  motion?: number;
  best?: number;
  leaps?: number;
  score?: number;
  accuracy?: number | null;
  techniques?: Record<string, number>;
};

let seq = 0;

export function insertHandTake(t: HandTake) {
  const recordedAt = new Date(t.at);
  const key = `hand-${++seq}`;
  const take = db()
    .insert(takes)
    .values({
      studentId: t.studentId,
      studioId: t.studioId,
      exerciseId: t.exerciseId ?? null,
      fileKey: key,
      originalName: `${key}.mid`,
      size: 100,
      contentHash: key,
      status: t.failed ? "failed" : "analysed",
      error: t.failed ? "The file has no notes." : null,
      recordedAt,
      weekKey: takeWeekKey(t.studioId, recordedAt),
      durationSec: t.failed ? 0 : (t.durationSec ?? 60),
    })
    .returning()
    .get();
  if (!t.failed) {
    const changes = t.changes ?? 0;
    db()
      .insert(takeMetrics)
      .values({
        takeId: take.id,
        chordCount: changes + 1,
        changeCount: changes,
        totalMotion: t.motion ?? 0,
        bestTotalMotion: t.best ?? 0,
        smoothness: (t.motion ?? 0) === 0 ? 1 : (t.best ?? 0) / (t.motion ?? 1),
        rootPositionLeaps: t.leaps ?? 0,
        score: t.score ?? 50,
        accuracy: t.accuracy ?? null,
        flags: {},
        techniques: t.techniques ?? {},
        topLine: [],
        // The board never reads the whole analysis; a stand-in keeps the NOT NULL column honest.
        analysis: { chords: [], melodyNotes: [], changes: [], summary: {} } as unknown as TakeAnalysis,
      })
      .run();
  }
  return take;
}
