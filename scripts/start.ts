// npm start: serves the built app for real use. Migrates, never seeds, binds HOST (default 127.0.0.1).
// `npm run build` bundles this file to build/server/start.js, which `npm start` runs with plain node.
import "./lib/production";
import path from "node:path";
import { closeDatabase, db } from "~/db/client.server";
import { loadEnvOrExit } from "./lib/runApp";

// A first start may create the storage folder when asked to; otherwise a missing one stops start-up.
if (process.argv.includes("--create-storage")) process.env.STORAGE_CREATE = "1";
const config = loadEnvOrExit();
db(); // applies pending migrations before the first request
closeDatabase(); // the server build opens its own connection
console.log(`Nearnote on http://${config.host}:${config.port}`);
const { serveBuild } = await import("./lib/server");
await serveBuild(path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build"), config.host, config.port);
