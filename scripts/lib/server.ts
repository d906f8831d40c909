// The production server: Express serving the build's static files (with the same
// security headers as every page) and handing everything else to React Router.
// `npm start` (scripts/start.ts), scripts/serve.ts and the HTTP tests all use it.
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express from "express";
import morgan from "morgan";
import { existsSync, readdirSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import type { ServerBuild } from "react-router";
import { env } from "~/server/env.server";
import { BASE_HEADERS, contentSecurityPolicy } from "~/server/securityHeaders.server";

/** The analysis worker `npm run build` bundles beside the server build (plain JavaScript). */
export function builtWorkerEntry(buildDir: string) {
  return path.join(buildDir, "server/analysis-worker.js");
}

/**
 * Points the analysis pool at the built worker when the build has one, so the
 * server's worker threads run plain JavaScript instead of loading the engine
 * through tsx. Must run before the server build is imported.
 */
export function useBuiltWorker(buildDir: string) {
  const entry = builtWorkerEntry(buildDir);
  if (existsSync(entry)) process.env.ANALYSIS_WORKER_ENTRY ??= entry;
}

/**
 * The build's other client files (the icon, the piano samples) behind `serve`, asked only for
 * paths whose first segment names one of them: a page address such as /takes/… then costs no
 * file-system lookup. A first segment that is not a plain name (dots, escapes) still goes to
 * `serve`, which normalises and decodes it, so what is served is the same as before.
 */
export function clientFiles(clientDir: string, serve: express.RequestHandler): express.RequestHandler {
  const names = new Set((existsSync(clientDir) ? readdirSync(clientDir) : []).map((n) => n.toLowerCase()));
  if (existsSync(path.join(clientDir, "index.html"))) names.add("");
  return (req, res, next) => {
    const first = req.path.split("/", 2)[1] ?? "";
    if (/^[A-Za-z0-9_-]*$/.test(first) && !names.has(first.toLowerCase())) return next();
    return serve(req, res, next);
  };
}

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
  app.use(
    "/assets",
    express.static(path.join(buildDir, "client/assets"), { immutable: true, maxAge: "1y", setHeaders: staticHeaders }),
  );
  app.use(
    clientFiles(
      path.join(buildDir, "client"),
      express.static(path.join(buildDir, "client"), { maxAge: "1h", setHeaders: staticHeaders }),
    ),
  );
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

/** Serves a build on host:port until SIGTERM or SIGINT. */
export async function serveBuild(buildDir: string, host: string, port: number) {
  useBuiltWorker(buildDir);
  const app = await createApp(buildDir);
  const server = app.listen(port, host, () => console.log(`[nearnote] listening on http://${host}:${port}`));
  const stop = () => server.close(() => process.exit(0));
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
  return server;
}
