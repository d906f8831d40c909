// npm run load: requests per second and p99 latency of the built app on 127.0.0.1 only,
// with autocannon, bounded in time; a bare hello page under react-router-serve is the ceiling.
import autocannon from "autocannon";
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { cpus, loadavg, tmpdir, totalmem } from "node:os";
import path from "node:path";
import { buildIfNeeded } from "./lib/runApp";

const SECONDS = Number(process.env.LOAD_SECONDS ?? 10);
const CONNECTIONS = 10;
const APP_PORT = 3301;
const HELLO_PORT = 3302;
const BASE = `http://127.0.0.1:${APP_PORT}`;

function start(cmd: string, args: string[], env: Record<string, string>): ChildProcess {
  return spawn(cmd, args, { env: { ...process.env, ...env }, stdio: ["ignore", "ignore", "inherit"] });
}

async function waitFor(url: string) {
  for (let i = 0; i < 120; i++) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {}
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`${url} did not come up`);
}

async function signIn(email: string) {
  const res = await fetch(`${BASE}/login`, {
    method: "POST",
    body: new URLSearchParams({ email, password: "tidewater-keys" }),
    headers: { Origin: BASE },
    redirect: "manual",
  });
  if (res.status !== 302) throw new Error(`sign-in of ${email} answered ${res.status}`);
  return res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
}

async function measure(name: string, url: string, cookie?: string) {
  const result = await autocannon({
    url,
    connections: CONNECTIONS,
    duration: SECONDS,
    headers: cookie ? { cookie } : {},
  });
  if (result.non2xx > 0) throw new Error(`${name}: ${result.non2xx} answers were not 2xx`);
  return { name, rps: result.requests.average, p99: result.latency.p99 };
}

async function main() {
  buildIfNeeded();
  if (!existsSync("build-hello/server/index.js")) {
    spawnSync(path.resolve("node_modules/.bin/react-router"), ["build"], { cwd: "scripts/load/hello", stdio: "inherit" });
  }
  const storage = mkdtempSync(path.join(tmpdir(), "nearnote-load-"));
  const env = { STORAGE_DIR: storage, NEARNOTE_ACCESS_LOG: "off", HOST: "127.0.0.1", NODE_ENV: "production" };
  const seeded = spawnSync(path.resolve("node_modules/.bin/tsx"), ["scripts/seed.ts"], { env: { ...process.env, ...env }, encoding: "utf8" });
  if (seeded.status !== 0) throw new Error(seeded.stderr);
  const app = start(path.resolve("node_modules/.bin/tsx"), ["scripts/serve.ts"], { ...env, PORT: String(APP_PORT) });
  const hello = start(path.resolve("node_modules/.bin/react-router-serve"), [path.resolve("build-hello/server/index.js")], {
    PORT: String(HELLO_PORT),
    HOST: "127.0.0.1",
  });
  try {
    await waitFor(`${BASE}/healthz`);
    await waitFor(`http://127.0.0.1:${HELLO_PORT}/`);
    const student = await signIn("dara@tidewater.example");
    const teacher = await signIn("ines@tidewater.example");
    const list = (await (await fetch(`${BASE}/api/takes`, { headers: { cookie: student } })).json()) as { takes: { id: string }[] };
    const rows = [
      await measure("bare hello page (react-router-serve)", `http://127.0.0.1:${HELLO_PORT}/`),
      await measure("landing page", `${BASE}/`),
      await measure("take page (signed-in student)", `${BASE}/takes/${list.takes[0].id}`, student),
      await measure("progress board (signed-in teacher)", `${BASE}/board`, teacher),
    ];
    const ceiling = rows[0].rps;
    const load = loadavg()[0].toFixed(1);
    const machine = `${cpus().length} cores (${cpus()[0]?.model.trim()}), ${Math.round(totalmem() / 2 ** 30)} GiB, Node ${process.version}`;
    const table = [
      `Machine: ${machine}. autocannon, ${CONNECTIONS} connections, ${SECONDS} s each, client and server on the same machine (127.0.0.1), load average ${load} at the end. The app is the production build behind \`scripts/serve.ts\` (Express, compression, security headers); the ceiling is a one-route React Router app under \`react-router-serve\`.`,
      "",
      "| page | requests/s | p99 latency | share of the hello ceiling |",
      "|---|---|---|---|",
      ...rows.map((r) => `| ${r.name} | ${r.rps.toFixed(0)} | ${r.p99} ms | ${((r.rps / ceiling) * 100).toFixed(0)} % |`),
    ];
    console.log(table.join("\n"));
    writeSection("## Load (npm run load)", table);
  } finally {
    app.kill("SIGTERM");
    hello.kill("SIGTERM");
  }
}

/** Replaces (or appends) this section of BENCHMARKS.md. */
function writeSection(heading: string, lines: string[]) {
  const file = "BENCHMARKS.md";
  const text = existsSync(file) ? readFileSync(file, "utf8") : "# Benchmarks\n";
  const start = text.indexOf(heading);
  const body = `${heading}\n\n${lines.join("\n")}\n`;
  let next: string;
  if (start < 0) next = `${text.trimEnd()}\n\n${body}`;
  else {
    const end = text.indexOf("\n## ", start + heading.length);
    next = text.slice(0, start) + body + (end < 0 ? "" : text.slice(end + 1));
  }
  writeFileSync(file, next);
}

await main();
