// npm run demo: build if needed, migrate, seed the demo studio into an empty database,
// start the local mail catcher and serve on http://127.0.0.1:3000.
import { count } from "drizzle-orm";
import path from "node:path";
import { closeDatabase, db } from "~/db/client.server";
import { users } from "~/db/schema";
import { startMailCatcher } from "~/mail/mailCatcher.server";
import { buildIfNeeded, loadEnvOrExit, serveBuiltApp } from "./lib/runApp";
import { printDemoSignIns, seed } from "./seed";

process.env.HOST ??= "127.0.0.1";
process.env.PORT ??= "3000";
process.env.APP_URL ??= `http://${process.env.HOST}:${process.env.PORT}`;
// The demo is allowed to start from nothing: it creates its storage folder.
process.env.STORAGE_CREATE ??= "1";
const config = loadEnvOrExit();
buildIfNeeded();

const empty = db().select({ n: count() }).from(users).get()!.n === 0;
if (empty) await seed();
else console.log("Using the existing database (not seeding again).");
closeDatabase();

const extraEnv: Record<string, string> = { HOST: config.host, PORT: String(config.port) };
const mailDir = path.join(config.storageDir, "mail");
const catcher = await startMailCatcher({ dir: mailDir });
extraEnv.SMTP_URL = catcher.url;
extraEnv.MAIL_CATCHER_DIR = mailDir;

serveBuiltApp(extraEnv);
console.log(`\nNearnote demo: http://${config.host}:${config.port}`);
console.log(`Caught e-mail: http://${config.host}:${config.port}/dev/mail`);
printDemoSignIns();
