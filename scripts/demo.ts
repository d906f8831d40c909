// npm run demo: build if needed, migrate, seed the demo studio into an empty database,
// start the local mail catcher and serve on http://127.0.0.1:3000.
import { count } from "drizzle-orm";
import { existsSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { closeDatabaseForTests, db } from "~/db/client.server";
import { users } from "~/db/schema";
import { buildIfNeeded, loadEnvOrExit, serveBuiltApp } from "./lib/runApp";
import { printDemoSignIns, seed } from "./seed";

process.env.HOST ??= "127.0.0.1";
process.env.PORT ??= "3000";
const config = loadEnvOrExit();
buildIfNeeded();

const empty = db().select({ n: count() }).from(users).get()!.n === 0;
if (empty) await seed();
else console.log("Using the existing database (not seeding again).");
closeDatabaseForTests();

const extraEnv: Record<string, string> = { HOST: config.host, PORT: String(config.port) };
const catcher = await startCatcherIfAvailable(path.join(config.storageDir, "mail"));
if (catcher) {
  extraEnv.SMTP_URL = catcher.url;
  extraEnv.MAIL_CATCHER_DIR = path.join(config.storageDir, "mail");
}

serveBuiltApp(extraEnv);
console.log(`\nNearnote demo: http://${config.host}:${config.port}`);
if (catcher) console.log(`Caught e-mail: http://${config.host}:${config.port}/dev/mail`);
printDemoSignIns();

async function startCatcherIfAvailable(dir: string): Promise<{ url: string } | null> {
  const file = path.resolve("app/lib/mailCatcher.server.ts");
  if (!existsSync(file)) return null;
  const { startMailCatcher } = await import(pathToFileURL(file).href);
  return startMailCatcher({ dir });
}
