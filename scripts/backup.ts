// npm run backup [FILE]: a consistent copy of the database (online backup, fine while the app runs)
// plus the stored takes, as one ZIP under storage/backups/ unless FILE is given.
import path from "node:path";
import { db } from "~/db/client.server";
import { writeBackup } from "~/server/backup.server";
import { loadEnvOrExit } from "./lib/runApp";

const config = loadEnvOrExit();
const stamp = new Date().toISOString().replace(/[-:]/g, "").replace(/\..*/, "").replace("T", "-");
const destination = path.resolve(process.argv[2] ?? path.join(config.storageDir, "backups", `nearnote-${stamp}.zip`));
const result = await writeBackup(db().$client, config.storageDir, destination);
const skipped = result.skipped.length ? `; ${result.skipped.length} takes deleted while it ran were skipped` : "";
console.log(`Backup written: ${result.destination} (database + ${result.takeFiles} take files${skipped})`);
