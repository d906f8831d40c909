// The app as the end-to-end suite sees it: a fresh storage folder, the demo studio,
// the mail catcher, and the built server on 127.0.0.1.
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { closeDatabase, db } from "~/db/client.server";
import { startMailCatcher } from "~/mail/mailCatcher.server";
import { seedDemoStudio } from "~/models/demoStudio.server";
import { loadEnvOrExit, serveBuiltApp } from "./lib/runApp";
import { seedDemoTakes } from "./lib/seedTakes";

const storageDir = process.env.E2E_STORAGE_DIR ?? mkdtempSync(path.join(tmpdir(), "nearnote-e2e-"));
process.env.STORAGE_DIR = storageDir;
process.env.DATABASE_PATH = path.join(storageDir, "e2e.db");
process.env.HOST = "127.0.0.1";
process.env.PORT ??= "3210";
process.env.APP_URL = `http://127.0.0.1:${process.env.PORT}`;
process.env.STORAGE_CREATE ??= "1";
const config = loadEnvOrExit();

const { studioId } = await seedDemoStudio(db());
await seedDemoTakes(db(), studioId);
closeDatabase();

const extraEnv: Record<string, string> = { HOST: config.host, PORT: String(config.port), NODE_ENV: "production" };
const mailDir = path.join(storageDir, "mail");
const catcher = await startMailCatcher({ dir: mailDir });
extraEnv.SMTP_URL = catcher.url;
extraEnv.MAIL_CATCHER_DIR = mailDir;
console.log(`e2e storage: ${storageDir}`);
serveBuiltApp(extraEnv);
