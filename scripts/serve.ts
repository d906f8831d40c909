// The production server: Express serving the build's static files (with the same
// security headers as every page) and handing everything else to React Router.
// `npm start`, `npm run demo` and the end-to-end suite all run this file.
import "./lib/production";
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express from "express";
import morgan from "morgan";
import path from "node:path";
import { pathToFileURL } from "node:url";
import type { ServerBuild } from "react-router";
import { env } from "~/lib/env.server";
import { BASE_HEADERS, contentSecurityPolicy } from "~/lib/securityHeaders.server";
import { loadEnvOrExit } from "./lib/runApp";

/** The Express app over a build; its settings come from the checked configuration (`env()`). */
export async function createApp(buildDir: string) {
  const config = env();
  const build = (await import(pathToFileURL(path.join(buildDir, "server/index.js")).href)) as ServerBuild;
  const app = express();
  app.disable("x-powered-by");
  app.use(compression());
  const staticHeaders = (res: express.Response) => {
    for (const [k, v] of Object.entries(BASE_HEADERS)) res.setHeader(k, v);
    res.setHeader("Content-Security-Policy", contentSecurityPolicy(null));
  };
  app.use("/assets", express.static(path.join(buildDir, "client/assets"), { immutable: true, maxAge: "1y", setHeaders: staticHeaders }));
  app.use(express.static(path.join(buildDir, "client"), { maxAge: "1h", setHeaders: staticHeaders }));
  if (config.accessLog) app.use(morgan("tiny"));
  // Sign-in throttling keys on the client address. Unless a trusted proxy sets it
  // (TRUST_PROXY=1), the address is the socket's own, so a client cannot forge it.
  if (!config.trustProxy) {
    app.use((req, _res, next) => {
      req.headers["x-forwarded-for"] = req.socket.remoteAddress ?? "unknown";
      next();
    });
  }
  app.all("*", createRequestHandler({ build, mode: process.env.NODE_ENV }));
  return app;
}

if (import.meta.url === pathToFileURL(process.argv[1]).href) {
  // A malformed setting or a missing storage folder stops the server here, not at the first request.
  const { host, port } = loadEnvOrExit();
  const buildDir = path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build");
  const app = await createApp(buildDir);
  const server = app.listen(port, host, () => console.log(`[nearnote] listening on http://${host}:${port}`));
  const stop = () => server.close(() => process.exit(0));
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}
