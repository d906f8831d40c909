// npm start: serves the built app for real use. Migrates, never seeds, binds HOST (default 127.0.0.1).
import { db, closeDatabase } from "~/db/client.server";
import { loadEnvOrExit, serveBuiltApp } from "./lib/runApp";

// A first start may create the storage folder when asked to; otherwise a missing one stops start-up.
if (process.argv.includes("--create-storage")) process.env.STORAGE_CREATE = "1";
const config = loadEnvOrExit();
db(); // applies pending migrations before the first request
closeDatabase(); // the server opens its own connection
console.log(`Nearnote on http://${config.host}:${config.port}`);
serveBuiltApp({ HOST: config.host, PORT: String(config.port) });
