import { spawn, spawnSync } from "node:child_process";
import { existsSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { ConfigError, env } from "~/server/env.server";

/** Newest modification time under a folder (to tell whether the build is stale). */
function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : statSync(p).mtimeMs);
  }
  return newest;
}

export const BUILD_DIR = path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build");

/** The bundled production server (`npm run build` writes it after the framework's build). */
export const BUILT_SERVE = path.join(BUILD_DIR, "server/serve.js");

export function buildIfNeeded() {
  const server = path.join(BUILD_DIR, "server/index.js");
  const stale =
    !existsSync(server) || !existsSync(BUILT_SERVE) || newestMtime(path.resolve("app")) > statSync(server).mtimeMs;
  if (!stale) return;
  console.log("Building Nearnote (first run or changed sources)…");
  const r = spawnSync("npm", ["run", "build"], { stdio: "inherit" });
  if (r.status !== 0) throw new Error("The build failed; see the messages above.");
}

/** Parses the environment once; on a malformed value prints the reason and exits. */
export function loadEnvOrExit() {
  try {
    return env();
  } catch (e) {
    if (e instanceof ConfigError) {
      console.error(e.message);
      process.exit(1);
    }
    throw e;
  }
}

/**
 * The command that serves the built app: plain node on the bundled server, or,
 * when only the framework's build is there, scripts/serve.ts through tsx.
 */
export function serveCommand(): [string, string[]] {
  if (existsSync(BUILT_SERVE)) return [process.execPath, [BUILT_SERVE]];
  return [path.resolve("node_modules/.bin/tsx"), [path.resolve("scripts/serve.ts")]];
}

/** Serves the built app as a child process, so that stopping this script stops the server. */
export function serveBuiltApp(extraEnv: Record<string, string>) {
  const [command, args] = serveCommand();
  const child = spawn(command, args, {
    stdio: "inherit",
    env: { NODE_ENV: "production", ...process.env, ...extraEnv, NEARNOTE_BUILD_DIR: BUILD_DIR },
  });
  const stop = () => child.kill("SIGTERM");
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
  child.on("exit", (code) => process.exit(code ?? 0));
  return child;
}
