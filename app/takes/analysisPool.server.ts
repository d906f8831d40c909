import { availableParallelism } from "node:os";
import path from "node:path";
import { MessageChannel } from "node:worker_threads";
import { Piscina } from "piscina";
import { AnalysisError } from "~/analysis";
import type { FitCandidate } from "~/analysis/exerciseFit";
import { env } from "~/server/env.server";
import type { AnalysisOutcome, AnalysisTask, NotesOutcome } from "./analysisWorker/task";

// Analysis of uploaded files runs in a small pool of worker threads, so one dense
// take never holds up anyone else's request. One core stays free for the server.
// The entry is resolved from the project folder, like the migrations, so the
// built server, the scripts and the tests all find the same file.
export const ANALYSIS_WORKER_ENTRY = path.resolve(
  process.env.ANALYSIS_WORKER_ENTRY ?? "app/takes/analysisWorker/entry.mjs",
);

let pool: Piscina<AnalysisTask, AnalysisOutcome | NotesOutcome> | undefined;

export function analysisThreads() {
  return Math.max(1, availableParallelism() - 1);
}

function analysisPool() {
  pool ??= new Piscina<AnalysisTask, AnalysisOutcome | NotesOutcome>({
    filename: ANALYSIS_WORKER_ENTRY,
    minThreads: 0,
    maxThreads: analysisThreads(),
    idleTimeout: 60_000,
  });
  return pool;
}

const TOO_COMPLEX = () => {
  const e = new AnalysisError("too-complex");
  return { ok: false as const, error: e.message, code: e.code };
};

/**
 * Runs one task on a worker thread. The time limit counts from the moment a
 * worker starts on it (not while it waits in the queue); past it the take is
 * "too complex to grade" and that worker is ended and replaced.
 */
async function runLimited<T extends AnalysisOutcome | NotesOutcome>(
  task: AnalysisTask,
  timeLimitMs: number,
): Promise<T> {
  const abort = new AbortController();
  const { port1, port2 } = new MessageChannel();
  let timer: NodeJS.Timeout | undefined;
  let timedOut = false;
  port1.once("message", () => {
    timer = setTimeout(() => {
      timedOut = true;
      abort.abort();
    }, timeLimitMs);
  });
  try {
    return (await analysisPool().run(
      { ...task, started: port2 },
      { signal: abort.signal, transferList: [port2] },
    )) as T;
  } catch (e) {
    if (timedOut) return TOO_COMPLEX() as T;
    throw e;
  } finally {
    clearTimeout(timer);
    port1.close();
  }
}

/** Analyses a take's bytes on a worker thread, within the time limit. */
export function analyseInWorker(
  bytes: Uint8Array,
  options: { key?: string | null; target?: string; candidates?: FitCandidate[] },
  timeLimitMs = env().analysisTimeLimitMs,
): Promise<AnalysisOutcome> {
  return runLimited<AnalysisOutcome>(
    { kind: "analyse", bytes, key: options.key ?? null, target: options.target, candidates: options.candidates },
    timeLimitMs,
  );
}

/** Reads a model take's notes on a worker thread (to check it can be played), within the time limit. */
export function readNotesInWorker(bytes: Uint8Array, timeLimitMs = env().analysisTimeLimitMs): Promise<NotesOutcome> {
  return runLimited<NotesOutcome>({ kind: "notes", bytes }, timeLimitMs);
}

/** Lets a command-line script exit once its work is done. */
export async function closeAnalysisPool() {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
