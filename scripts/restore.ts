// npm run restore FILE: brings back a backup made by `npm run backup`. Stop the app first.
import { readFileSync } from "node:fs";
import { restoreBackup } from "~/server/backup.server";
import { loadEnvOrExit } from "./lib/runApp";

const file = process.argv[2];
if (!file) {
  console.error("Usage: npm run restore -- FILE (a ZIP made by npm run backup). Stop the app first.");
  process.exit(1);
}
const config = loadEnvOrExit();
try {
  const result = restoreBackup(new Uint8Array(readFileSync(file)), config.databasePath, config.storageDir);
  console.log(`Restored ${config.databasePath} and ${result.takeFiles} take files from ${file}.`);
} catch (e) {
  console.error((e as Error).message);
  process.exit(1);
}
