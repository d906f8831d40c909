// Grading while the student plays: the same engine as the server (app/analysis), run in the
// browser on the notes so far. Pure, so what the panel shows is tested without a keyboard.
import { analyseNotes } from "~/analysis";
import { AnalysisError } from "~/analysis/errors";
import { BASS_MERGE, GRACE_MAX, GRACE_RELEASE, STRIKE_SPAN } from "~/analysis/strikes";
import { MIN_HARMONY_SEC } from "~/analysis/segment";
import type { ChangeReport, ChordReport, NoteList, TakeAnalysis } from "~/analysis/types";
import { clampBpm } from "./midiEncode";

export type LiveOptions = {
  /** the exercise's key; without one the engine estimates it from the notes so far */
  key?: string;
  /** the tempo the recording is written at (it sets the grace-note length, rule 2) */
  bpm?: number;
};

export type LiveGrade = {
  /** every chord so far: the settled ones first, then those still forming */
  chords: ChordReport[];
  /** how many of `chords` are settled (a prefix) */
  settled: number;
  /** every change so far; one is settled when its second chord is (`to < settled`) */
  changes: ChangeReport[];
  key: string | null;
  keySource: "given" | "estimated" | null;
  noteCount: number;
};

const EMPTY: LiveGrade = { chords: [], settled: 0, changes: [], key: null, keySource: null, noteCount: 0 };

/**
 * How long after a chord's start later notes can still change it. A lone bass up to 150 ms
 * early becomes the chord's start (rule 3); the strike then runs 300 ms (rule 1); a grace note
 * begun at its end may last 150 ms or a sixteenth (rule 2), its resolution may start 30 ms
 * after release, and only counts once it has been held longer than the grace note. Held notes
 * (rule 3) are decided 150 ms in, well inside that. After this the chord is final: the same
 * one the server reports for the finished take (tested). Until then the panel still shows it,
 * marked as forming, so the student sees the chord at once.
 */
export function settleSeconds(bpm?: number): number {
  const grace = Math.max(GRACE_MAX, 60 / clampBpm(bpm) / 4);
  return BASS_MERGE + STRIKE_SPAN + grace + GRACE_RELEASE + grace;
}

/**
 * How long after the next harmony begins a harmony is final: the strike windows, plus the
 * shortest a harmony may be (a beat at the recording's tempo, or 250 ms), plus a margin.
 */
export function harmonySettleSeconds(bpm?: number): number {
  return settleSeconds(bpm) + Math.max(MIN_HARMONY_SEC, 60 / clampBpm(bpm)) + 0.1;
}

/** The take exactly as the encoder writes it: one tempo from the start (see midiEncode.ts). */
export function asRecordedTake(list: NoteList, bpm?: number): NoteList {
  return { notes: list.notes, pedal: list.pedal ?? [], tempos: [{ time: 0, bpm: clampBpm(bpm) }] };
}

/** Analyses everything played up to `nowSec` (keys still down already end at now). */
export function gradeSoFar(list: NoteList, nowSec: number, options: LiveOptions = {}): LiveGrade {
  if (list.notes.length === 0) return EMPTY;
  let analysis: TakeAnalysis;
  try {
    analysis = analyseNotes(asRecordedTake(list, options.bpm), { key: options.key || undefined });
  } catch (e) {
    if (e instanceof AnalysisError) return { ...EMPTY, noteCount: list.notes.length };
    throw e;
  }
  // A harmony is final once the next one has begun and lasted long enough to be one (rule 15:
  // at least a beat in a take made to a metronome), beyond the strike windows; the last one
  // once every key is up that long.
  const lag = harmonySettleSeconds(options.bpm);
  const chords = analysis.chords;
  let lastEnd = 0;
  for (const n of list.notes) lastEnd = Math.max(lastEnd, Math.min(n.end, nowSec));
  const anyDown = list.notes.some((n) => n.end >= nowSec);
  let settled = 0;
  while (settled < chords.length) {
    const next = chords[settled + 1];
    const final = next ? next.startSec <= nowSec - lag : !anyDown && lastEnd <= nowSec - lag;
    if (!final) break;
    settled++;
  }
  return {
    chords: analysis.chords,
    settled,
    changes: analysis.changes,
    key: analysis.summary.key,
    keySource: analysis.summary.keySource,
    noteCount: list.notes.length,
  };
}

/**
 * When to grade again: never more often than `minMs`, and at least `factor` times the last
 * run's own duration apart, so a long take on a slow machine keeps the page responsive
 * instead of grading back to back.
 */
export class GradeThrottle {
  private lastStart = -Infinity;
  private lastCost = 0;

  constructor(
    private readonly minMs = 150,
    private readonly factor = 4,
  ) {}

  due(nowMs: number): boolean {
    return nowMs - this.lastStart >= Math.max(this.minMs, this.lastCost * this.factor);
  }

  /** Records a run that started at `startMs` and took `costMs`. */
  ran(startMs: number, costMs: number): void {
    this.lastStart = startMs;
    this.lastCost = costMs;
  }

  /** The gap this throttle now keeps between runs. */
  get gapMs(): number {
    return Math.max(this.minMs, this.lastCost * this.factor);
  }
}
