// What one analysis worker does with one take. Runs inside a worker thread
// (see entry.mjs), so it imports the engine by relative path only.
import type { MessagePort } from "node:worker_threads";
import { fitCandidates, type FitCandidate, type FitReport } from "../../analysis/exerciseFit";
import { analyseMidi, AnalysisError, ProgressionError, readMidi } from "../../analysis/index";
import type { TakeAnalysis } from "../../analysis/types";

export type AnalysisTask = {
  /** "analyse" (the default) grades a take; "notes" only reads a model take's notes to check it is playable. */
  kind?: "analyse" | "notes";
  bytes: Uint8Array;
  key?: string | null;
  target?: string;
  /** Exercises (each in each of its keys) the take is compared with, to tell which it sounds like. */
  candidates?: FitCandidate[];
  /** Told when the worker starts on this take, so queue time does not count against the time limit. */
  started?: MessagePort;
};

export type AnalysisOutcome =
  { ok: true; analysis: TakeAnalysis; fit?: FitReport } | { ok: false; error: string; code?: string };

/**
 * A file the engine refuses (truncated, no notes, too long…) becomes a failed
 * outcome with the engine's one-line reason; anything else is a bug and is rethrown.
 */
export function analyseTake(
  bytes: Uint8Array,
  options: { key?: string | null; target?: string; candidates?: FitCandidate[] },
): AnalysisOutcome {
  try {
    const analysis = analyseMidi(bytes, { key: options.key ?? undefined, target: options.target });
    if (!options.candidates?.length) return { ok: true, analysis };
    return { ok: true, analysis, fit: fitCandidates(readMidi(bytes).notes, analysis.chords, options.candidates) };
  } catch (e) {
    if (e instanceof AnalysisError) return { ok: false, error: e.message, code: e.code };
    if (e instanceof ProgressionError && options.target !== undefined) {
      // The exercise's target no longer parses: grade without it rather than lose the take.
      return analyseTake(bytes, { key: options.key, candidates: options.candidates });
    }
    throw e;
  }
}

export type NotesOutcome = { ok: true; noteCount: number } | { ok: false; error: string; code?: string };

/** Reads a model take: how many notes it has, or the engine's reason it cannot be read. */
export function readTakeNotes(bytes: Uint8Array): NotesOutcome {
  try {
    const { notes } = readMidi(bytes);
    if (notes.length === 0) throw new AnalysisError("no-notes");
    return { ok: true, noteCount: notes.length };
  } catch (e) {
    if (e instanceof AnalysisError) return { ok: false, error: e.message, code: e.code };
    throw e;
  }
}

export default function runTask(task: AnalysisTask): AnalysisOutcome | NotesOutcome {
  task.started?.postMessage("started");
  task.started?.close();
  return task.kind === "notes" ? readTakeNotes(task.bytes) : analyseTake(task.bytes, task);
}
