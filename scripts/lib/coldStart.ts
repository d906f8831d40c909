// Time from spawning a server process to its first answered request.
import { spawn, type ChildProcess } from "node:child_process";
import { once } from "node:events";

export type ColdStart = { ms: number; status: number };

/**
 * Spawns `command args`, asks `url` every 10 ms until an answer comes, and
 * returns the time from spawn to that answer; the process is stopped afterwards.
 * Gives up after `giveUpMs` (a hang guard, not a target).
 */
export async function measureColdStart(
  command: string,
  args: string[],
  env: NodeJS.ProcessEnv,
  url: string,
  giveUpMs = 60_000,
  cwd?: string,
): Promise<ColdStart> {
  const started = performance.now();
  const child: ChildProcess = spawn(command, args, { env, cwd, stdio: ["ignore", "ignore", "pipe"] });
  let stderr = "";
  child.stderr!.on("data", (d) => (stderr += String(d)));
  let exited = false;
  child.once("exit", () => (exited = true));
  try {
    while (performance.now() - started < giveUpMs) {
      if (exited) throw new Error(`the server exited before answering:\n${stderr}`);
      try {
        const res = await fetch(url, { redirect: "manual" });
        await res.arrayBuffer();
        return { ms: performance.now() - started, status: res.status };
      } catch (e) {
        if (!(e instanceof TypeError)) throw e; // not yet listening
      }
      await new Promise((r) => setTimeout(r, 10));
    }
    throw new Error(`no answer from ${url} within ${giveUpMs} ms:\n${stderr}`);
  } finally {
    if (!exited) {
      child.kill("SIGTERM");
      await once(child, "exit");
    }
  }
}
