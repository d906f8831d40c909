// One worst-case upload against the built app on 127.0.0.1 (scripts/serve.ts as a child
// process, like `npm run load`): how long the densest take the engine accepts takes to
// come back, and how fast another client's /healthz answers meanwhile.
import { spawn, spawnSync } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import path from "node:path";
import { analyseTake } from "../../app/takes/analysisWorker/task";
import { denseChordTake } from "../lib/denseTake";
import { buildIfNeeded, serveCommand } from "../lib/runApp";
import { median } from "./stats";

const PORT = 3303;
const BASE = `http://127.0.0.1:${PORT}`;
const WORST_CHORDS = 12_400; // 99,200 notes: just under the engine's 100,000-note limit

async function timedHealth() {
  const t = performance.now();
  const res = await fetch(`${BASE}/healthz`);
  await res.arrayBuffer();
  if (!res.ok) throw new Error(`/healthz answered ${res.status}`);
  return performance.now() - t;
}

export async function benchWorkerPool(): Promise<string[]> {
  buildIfNeeded();
  const small = denseChordTake(40);
  const t0 = performance.now();
  const smallOutcome = analyseTake(small, {});
  const smallMs = performance.now() - t0;

  const storage = mkdtempSync(path.join(tmpdir(), "nearnote-bench-pool-"));
  const env = {
    ...process.env,
    STORAGE_DIR: storage,
    NEARNOTE_ACCESS_LOG: "off",
    HOST: "127.0.0.1",
    PORT: String(PORT),
    NODE_ENV: "production",
  };
  const tsx = path.resolve("node_modules/.bin/tsx");
  const seeded = spawnSync(tsx, ["scripts/seed.ts"], { env, encoding: "utf8" });
  if (seeded.status !== 0) throw new Error(seeded.stderr);
  const [serve, serveArgs] = serveCommand();
  const app = spawn(serve, serveArgs, { env, stdio: ["ignore", "ignore", "inherit"] });
  try {
    for (let i = 0; ; i++) {
      try {
        await timedHealth();
        break;
      } catch {
        if (i > 120) throw new Error("the app did not come up");
        await new Promise((r) => setTimeout(r, 500));
      }
    }
    const login = await fetch(`${BASE}/login`, {
      method: "POST",
      body: new URLSearchParams({ email: "dara@tidewater.example", password: "tidewater-keys" }),
      headers: { Origin: BASE },
      redirect: "manual",
    });
    const cookie = login.headers
      .getSetCookie()
      .map((c) => c.split(";")[0])
      .join("; ");
    // Let the start-up work (orphan sweep, re-analysis of outdated takes) finish first.
    await new Promise((r) => setTimeout(r, 3000));
    const idle: number[] = [];
    for (let i = 0; i < 20; i++) idle.push(await timedHealth());

    const bytes = denseChordTake(WORST_CHORDS);
    const form = new FormData();
    form.append("file", new File([new Uint8Array(bytes)], "dense.mid", { type: "audio/midi" }));
    const started = performance.now();
    let done = false;
    const upload = fetch(`${BASE}/api/takes`, {
      method: "POST",
      body: form,
      headers: { Cookie: cookie, Origin: BASE },
    }).then(async (r) => {
      done = true;
      const body = (await r.json()) as { error?: string };
      return { status: r.status, error: body.error, ms: performance.now() - started };
    });
    const during: number[] = [];
    while (!done) {
      const ms = await timedHealth();
      if (!done) during.push(ms);
      await new Promise((r) => setTimeout(r, 100));
    }
    const result = await upload;
    const fmt = (xs: number[]) =>
      `median ${median(xs).toFixed(0)} ms, max ${Math.max(...xs).toFixed(0)} ms (${xs.length} requests)`;
    return [
      "## Worst-case upload and the worker pool",
      `40 random eight-key chords (${small.length} bytes) analysed on one thread: ${smallMs.toFixed(0)} ms (${smallOutcome.ok ? "graded" : smallOutcome.error})`,
      `worst case: ${WORST_CHORDS} random eight-key chords, ${bytes.length} bytes, uploaded to the built app: answered ${result.status} after ${result.ms.toFixed(0)} ms${result.error ? ` (${result.error})` : ""}`,
      `/healthz before the upload: ${fmt(idle)}`,
      `/healthz while it was analysed: ${fmt(during)}`,
      `load average at the end: ${loadavg()[0].toFixed(1)}`,
    ];
  } finally {
    app.kill("SIGTERM");
    await new Promise((r) => app.once("exit", r));
    rmSync(storage, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const line of await benchWorkerPool()) console.log(line);
}
