// npm run reanalyse: analyse again every stored take whose analysis is older than the engine.
import { ANALYSIS_VERSION } from "~/analysis";
import { db } from "~/db/client.server";
import { closeAnalysisPool } from "~/takes/analysisPool.server";
import { ORPHAN_GRACE_MS, sweepOrphanTakeFiles } from "~/models/orphanFiles.server";
import { reanalyseOutdated } from "~/models/takes.server";
import { loadEnvOrExit } from "./lib/runApp";

loadEnvOrExit();
db();
// The server may be running: files younger than the grace period may still be getting their rows.
const swept = await sweepOrphanTakeFiles(new Date(Date.now() - ORPHAN_GRACE_MS));
console.log(`Orphan take files removed: ${swept}.`);
const started = Date.now();
const result = await reanalyseOutdated((done, total) => {
  if (done === total || done % 25 === 0) process.stdout.write(`\r${done}/${total} takes`);
});
if (result.total > 0) process.stdout.write("\n");
console.log(
  `Engine version ${ANALYSIS_VERSION}: ${result.total} takes re-analysed in ${((Date.now() - started) / 1000).toFixed(1)} s ` +
    `(${result.analysed} analysed, ${result.failed} failed, ${result.missing} with a missing file).`,
);
await closeAnalysisPool();
