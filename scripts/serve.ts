// Serves the built app (see scripts/lib/server.ts) on HOST:PORT; `npm run demo`,
// the end-to-end suite and `npm run load` start it, built to build/server/serve.js.
import "./lib/production";
import path from "node:path";
import { loadEnvOrExit } from "./lib/runApp";

// A malformed setting or a missing storage folder stops the server here, not at the first request.
const { host, port } = loadEnvOrExit();
// Loaded after NODE_ENV is set, so React and React Router load their production builds.
const { serveBuild } = await import("./lib/server");
await serveBuild(path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build"), host, port);
