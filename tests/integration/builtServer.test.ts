import Database from "better-sqlite3";
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { denseChordTake } from "../../scripts/lib/denseTake";

// `npm run build` leaves plain JavaScript entry points beside the framework's server
// build; `npm start` runs them with node alone, without tsx or any loader.
const build = path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build");
const server = path.join(build, "server");
const HANG_GUARD_MS = 60_000; // far beyond any start-up; only stops a hung test

function builtFiles(): string[] {
  const chunks = existsSync(path.join(server, "node-chunks")) ? readdirSync(path.join(server, "node-chunks")) : [];
  return [
    ...["start.js", "serve.js", "analysis-worker.js"].map((f) => path.join(server, f)),
    ...chunks.filter((f) => f.endsWith(".js")).map((f) => path.join(server, "node-chunks", f)),
  ];
}

let child: ChildProcess | undefined;
afterEach(() => {
  child?.kill("SIGTERM");
  child = undefined;
});

describe("the built server", () => {
  it("is plain JavaScript that loads no TypeScript loader", () => {
    if (!existsSync(path.join(server, "start.js"))) throw new Error(`Build the app first (npm run build): ${build}`);
    for (const file of builtFiles()) {
      const text = readFileSync(file, "utf8");
      expect(text, file).not.toMatch(/from\s*["']tsx|import\(["']tsx|require\(["']tsx/);
      expect(text, file).not.toMatch(/(?:import|require)\(\s*["'][^"']*(?<!\.d)\.ts["']\s*\)/); // no import of a .ts file (a type in a comment, .d.ts, is no import)
    }
  });

  it(
    "starts with plain node, migrates a new database, sweeps orphan files and answers pages",
    async () => {
      const storage = mkdtempSync(path.join(tmpdir(), "nearnote-built-"));
      const port = 3900 + Math.floor(Math.random() * 90);
      let out = "";
      child = spawn(process.execPath, [path.join(server, "start.js"), "--create-storage"], {
        env: {
          PATH: process.env.PATH,
          STORAGE_DIR: storage,
          PORT: String(port),
          HOST: "127.0.0.1",
          NEARNOTE_ACCESS_LOG: "off",
          NEARNOTE_BUILD_DIR: build,
        },
        stdio: ["ignore", "pipe", "pipe"],
      });
      child.stdout!.on("data", (d) => (out += String(d)));
      child.stderr!.on("data", (d) => (out += String(d)));
      const until = Date.now() + HANG_GUARD_MS;
      let health: Response | undefined;
      while (!health && Date.now() < until) {
        if (child.exitCode !== null) throw new Error(`the server exited:\n${out}`);
        health = await fetch(`http://127.0.0.1:${port}/healthz`).catch(() => undefined);
        if (!health) await new Promise((r) => setTimeout(r, 100));
      }
      expect(health?.status, out).toBe(200);

      const landing = await fetch(`http://127.0.0.1:${port}/`);
      expect(landing.status).toBe(200);
      expect(landing.headers.get("content-type")).toMatch(/text\/html/);
      expect(await landing.text()).toContain("Nearnote");

      // Every migration in drizzle/ was applied before the first request.
      const migrations = readdirSync("drizzle").filter((f) => f.endsWith(".sql")).length;
      const db = new Database(path.join(storage, "nearnote.db"), { readonly: true });
      try {
        const applied = db.prepare("select count(*) as n from __drizzle_migrations").get() as { n: number };
        expect(applied.n).toBe(migrations);
      } finally {
        db.close();
      }
      // The start-up work runs in the built server too (the sweep of take files without a row).
      while (!/orphan take files removed at start-up: 0/.test(out) && Date.now() < until)
        await new Promise((r) => setTimeout(r, 100));
      expect(out).toMatch(/orphan take files removed at start-up: 0/);
    },
    HANG_GUARD_MS + 10_000,
  );

  it(
    "runs the bundled analysis worker under plain node",
    () => {
      const dir = mkdtempSync(path.join(tmpdir(), "nearnote-worker-"));
      const take = path.join(dir, "take.mid");
      writeFileSync(take, denseChordTake(8));
      const script = `
      import { readFileSync } from "node:fs";
      const { default: run } = await import(${JSON.stringify(path.join(server, "analysis-worker.js"))});
      const bytes = new Uint8Array(readFileSync(${JSON.stringify(take)}));
      const notes = run({ kind: "notes", bytes });
      const analysed = run({ bytes });
      console.log(JSON.stringify({ notes, ok: analysed.ok, chords: analysed.ok ? analysed.analysis.chords.length : 0 }));`;
      const r = spawnSync(process.execPath, ["--input-type=module", "-e", script], {
        encoding: "utf8",
        timeout: HANG_GUARD_MS,
      });
      expect(r.status, r.stderr).toBe(0);
      const result = JSON.parse(r.stdout) as { notes: { ok: boolean; noteCount: number }; ok: boolean; chords: number };
      expect(result.notes).toEqual({ ok: true, noteCount: 8 * 8 }); // eight chords of eight keys each (denseChordTake)
      expect(result.ok).toBe(true);
      expect(result.chords).toBeGreaterThan(0);
    },
    HANG_GUARD_MS + 10_000,
  );
});
