import { availableParallelism } from "node:os";
import path from "node:path";
import { MessageChannel } from "node:worker_threads";
import { Piscina } from "piscina";
import { AnalysisError } from "~/analysis";
import { env } from "~/lib/env.server";
import type { AnalysisOutcome, AnalysisTask } from "./analysisWorker/task";

// Analysis of uploaded files runs in a small pool of worker threads, so one dense
// take never holds up anyone else's request. One core stays free for the server.
// The entry is resolved from the project folder, like the migrations, so the
// built server, the scripts and the tests all find the same file.
export const ANALYSIS_WORKER_ENTRY = path.resolve(process.env.ANALYSIS_WORKER_ENTRY ?? "app/lib/analysisWorker/entry.mjs");

let pool: Piscina<AnalysisTask, AnalysisOutcome> | undefined;

export function analysisThreads() {
  return Math.max(1, availableParallelism() - 1);
}

function analysisPool() {
  pool ??= new Piscina<AnalysisTask, AnalysisOutcome>({
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
 * Analyses a take's bytes on a worker thread. The time limit counts from the
 * moment a worker starts on the take (not while it waits in the queue); past it
 * the take is "too complex to grade" and that worker is ended and replaced.
 */
export async function analyseInWorker(
  bytes: Uint8Array,
  options: { key?: string | null; target?: string },
  timeLimitMs = env().analysisTimeLimitMs,
): Promise<AnalysisOutcome> {
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
    return await analysisPool().run(
      { bytes, key: options.key ?? null, target: options.target, started: port2 },
      { signal: abort.signal, transferList: [port2] },
    );
  } catch (e) {
    if (timedOut) return TOO_COMPLEX();
    throw e;
  } finally {
    clearTimeout(timer);
    port1.close();
  }
}

/** Lets a command-line script exit once its work is done. */
export async function closeAnalysisPool() {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
