import { db } from "~/db/client.server";
import { sweepOrphanTakeFiles } from "~/models/orphanFiles.server";
import { reanalyseOutdated } from "~/models/takes.server";
import { env } from "./env.server";
import { startScheduler } from "./scheduler.server";

let started = false;

/**
 * Work the server process does on its own once it is up: take files no row
 * refers to are swept, and stored takes analysed
 * by an older engine are analysed again in the background, one at a time, so
 * weekly figures stay comparable.
 */
export function startBackgroundWork() {
  if (started || !env().background) return;
  started = true;
  db(); // migrate before the first request
  const timer = setTimeout(async () => {
    try {
      // Files no row refers to, left by an earlier process: anything this process writes is newer.
      const swept = await sweepOrphanTakeFiles(new Date(performance.timeOrigin));
      console.log(`[nearnote] orphan take files removed at start-up: ${swept}`);
    } catch (e) {
      console.error("[nearnote] orphan file sweep failed:", e);
    }
    try {
      const result = await reanalyseOutdated();
      if (result.total > 0) {
        console.log(
          `[nearnote] re-analysed ${result.total} stored takes with the current engine (${result.analysed} analysed, ${result.failed} failed, ${result.missing} missing files)`,
        );
      }
    } catch (e) {
      console.error("[nearnote] background re-analysis stopped:", e);
    }
  }, 500);
  timer.unref();
  // Daily digests and due-date reminders.
  startScheduler();
}
