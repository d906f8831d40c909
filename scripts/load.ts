// npm run load: requests per second and p99 latency of the built app on 127.0.0.1 only,
// with autocannon, bounded in time; a bare hello page under react-router-serve is the ceiling.
// Also the cold start of the built server and what a phone downloads on a first visit,
// each beside the same figure for the hello ceiling.
import autocannon from "autocannon";
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import http from "node:http";
import { cpus, loadavg, tmpdir, totalmem } from "node:os";
import path from "node:path";
import { bundleRows, builtGzipSize, formatBundleReport, readBuiltManifest } from "./lib/bundleReport";
import { measureColdStart } from "./lib/coldStart";
import { firstLoad, type FirstLoad } from "./lib/pageWeight";
import { BUILD_DIR, buildIfNeeded, serveCommand } from "./lib/runApp";
import { generateLongTake } from "./lib/takeGenerator";

const SECONDS = Number(process.env.LOAD_SECONDS ?? 10);
const CONNECTIONS = 10;
const APP_PORT = 3301;
const HELLO_PORT = 3302;
const COLD_PORT = 3303;
const BASE = `http://127.0.0.1:${APP_PORT}`;
const HELLO = `http://127.0.0.1:${HELLO_PORT}`;
const COLD_RUNS = 3;

function start(cmd: string, args: string[], env: Record<string, string>, cwd?: string): ChildProcess {
  return spawn(cmd, args, { env: { ...process.env, ...env }, cwd, stdio: ["ignore", "ignore", "inherit"] });
}

// The hello app's build names its client folder relative to its own project folder.
const HELLO_DIR = path.resolve("scripts/load/hello");

async function waitFor(url: string) {
  for (let i = 0; i < 120; i++) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not answering yet
    }
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
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
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

/** Uploads a generated take of `minutes` minutes as the signed-in student; returns its id. */
async function uploadLongTake(cookie: string, minutes: number): Promise<string> {
  const form = new FormData();
  form.append(
    "file",
    new File([new Uint8Array(generateLongTake(minutes))], `long-${minutes}min.mid`, { type: "audio/midi" }),
  );
  // Encoded first and sent with its length, as a browser sends a form (the server refuses an upload
  // of unknown length); through node:http, as undici's fetch lost this connection on this server.
  const encoded = new Request(`${BASE}/api/takes`, { method: "POST", body: form });
  const body = Buffer.from(await encoded.arrayBuffer());
  const headers = {
    cookie,
    Origin: BASE,
    "content-type": encoded.headers.get("content-type")!,
    "content-length": String(body.length),
  };
  const { status, text } = await new Promise<{ status: number; text: string }>((resolve, reject) => {
    const req = http.request(`${BASE}/api/takes`, { method: "POST", headers }, (res) => {
      const parts: Buffer[] = [];
      res.on("data", (d: Buffer) => parts.push(d));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(parts).toString("utf8") }));
      res.on("error", reject);
    });
    req.on("error", reject);
    req.end(body);
  });
  const id = (JSON.parse(text) as { id?: string }).id;
  if (status !== 201 || !id)
    throw new Error(`upload of the ${minutes}-minute take answered ${status}: ${text.slice(0, 300)}`);
  return id;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Spawn to first answered request, `runs` times, each with a fresh storage folder (so migrations run every time). */
async function coldStarts(
  command: string,
  args: string[],
  env: Record<string, string>,
  url: string,
  runs: number,
  cwd?: string,
) {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const storage = mkdtempSync(path.join(tmpdir(), "nearnote-cold-"));
    const r = await measureColdStart(
      command,
      args,
      { ...process.env, STORAGE_DIR: storage, STORAGE_CREATE: "1", ...env },
      url,
      60_000,
      cwd,
    );
    if (r.status !== 200) throw new Error(`${command} ${args.join(" ")}: first answer ${r.status}`);
    times.push(r.ms);
  }
  return times;
}

const kB = (bytes: number) => `${(bytes / 1000).toFixed(1)} kB`;
const times = (x: number) => `${x.toFixed(1)} ×`;

async function main() {
  buildIfNeeded();
  if (!existsSync("build-hello/server/index.js")) {
    spawnSync(path.resolve("node_modules/.bin/react-router"), ["build"], {
      cwd: "scripts/load/hello",
      stdio: "inherit",
    });
  }
  const startedLoad = loadavg()[0].toFixed(1);
  // Cold starts first, while nothing else of ours runs: the built server as `npm start` runs it,
  // then the same entry point through tsx (as `npm start` did before the server was bundled),
  // then the hello ceiling under react-router-serve.
  const coldEnv = {
    NEARNOTE_ACCESS_LOG: "off",
    HOST: "127.0.0.1",
    PORT: String(COLD_PORT),
    NEARNOTE_BUILD_DIR: BUILD_DIR,
  };
  const coldUrl = `http://127.0.0.1:${COLD_PORT}/`;
  const builtCold = await coldStarts(
    process.execPath,
    [path.join(BUILD_DIR, "server/start.js")],
    coldEnv,
    coldUrl,
    COLD_RUNS,
  );
  const tsxCold = await coldStarts(path.resolve("node_modules/.bin/tsx"), ["scripts/start.ts"], coldEnv, coldUrl, 1);
  const helloCold = await coldStarts(
    path.resolve("node_modules/.bin/react-router-serve"),
    [path.resolve("build-hello/server/index.js")],
    { PORT: String(COLD_PORT), HOST: "127.0.0.1", NODE_ENV: "production" },
    coldUrl,
    COLD_RUNS,
    HELLO_DIR,
  );

  const storage = mkdtempSync(path.join(tmpdir(), "nearnote-load-"));
  const env = { STORAGE_DIR: storage, NEARNOTE_ACCESS_LOG: "off", HOST: "127.0.0.1", NODE_ENV: "production" };
  const seeded = spawnSync(path.resolve("node_modules/.bin/tsx"), ["scripts/seed.ts"], {
    env: { ...process.env, ...env },
    encoding: "utf8",
  });
  if (seeded.status !== 0) throw new Error(seeded.stderr);
  const [serve, serveArgs] = serveCommand();
  const app = start(serve, serveArgs, { ...env, PORT: String(APP_PORT), NEARNOTE_BUILD_DIR: BUILD_DIR });
  const hello = start(
    path.resolve("node_modules/.bin/react-router-serve"),
    [path.resolve("build-hello/server/index.js")],
    { PORT: String(HELLO_PORT), HOST: "127.0.0.1", NODE_ENV: "production" },
    HELLO_DIR,
  );
  try {
    await waitFor(`${BASE}/healthz`);
    await waitFor(`${HELLO}/`);
    const student = await signIn("dara@tidewater.example");
    const teacher = await signIn("ines@tidewater.example");
    const list = (await (await fetch(`${BASE}/api/takes`, { headers: { cookie: student } })).json()) as {
      takes: { id: string }[];
    };
    const longTake = await uploadLongTake(student, 10);

    // What a phone fetches on a first visit, next to the hello page's first load.
    const pages: [string, string, string | undefined][] = [
      ["landing page", `${BASE}/`, undefined],
      ["sign-in", `${BASE}/login`, undefined],
      ["student's home", `${BASE}/home`, student],
      ["take page (typical take)", `${BASE}/takes/${list.takes[0].id}`, student],
      ["take page (10-minute take)", `${BASE}/takes/${longTake}`, student],
      ["progress board (teacher)", `${BASE}/board`, teacher],
    ];
    const helloLoad = await firstLoad(`${HELLO}/`);
    const loads: [string, FirstLoad][] = [["bare hello page", helloLoad]];
    for (const [name, url, cookie] of pages) loads.push([name, await firstLoad(url, cookie)]);

    const rows = [
      await measure("bare hello page (react-router-serve)", `${HELLO}/`),
      await measure("landing page", `${BASE}/`),
      await measure("take page (signed-in student)", `${BASE}/takes/${list.takes[0].id}`, student),
      await measure("take page, 10-minute take (signed-in student)", `${BASE}/takes/${longTake}`, student),
      await measure("progress board (signed-in teacher)", `${BASE}/board`, teacher),
    ];
    const ceiling = rows[0].rps;
    const load = loadavg()[0].toFixed(1);
    const machine = `${cpus().length} cores (${cpus()[0]?.model.trim()}), ${Math.round(totalmem() / 2 ** 30)} GiB, Node ${process.version}`;
    const table = [
      `Machine: ${machine}. autocannon, ${CONNECTIONS} connections, ${SECONDS} s each, client and server on the same machine (127.0.0.1), load average ${load} at the end. The app is the production build behind \`build/server/serve.js\` (Express, compression, security headers); the ceiling is a one-route React Router app under \`react-router-serve\`.`,
      "",
      "| page | requests/s | p99 latency | share of the hello ceiling |",
      "|---|---|---|---|",
      ...rows.map(
        (r) => `| ${r.name} | ${r.rps.toFixed(0)} | ${r.p99} ms | ${((r.rps / ceiling) * 100).toFixed(0)} % |`,
      ),
    ];
    console.log(table.join("\n"));
    writeSection("## Load (npm run load)", table);

    const coldMedian = median(builtCold);
    const helloMedian = median(helloCold);
    const weight = [
      `Measured by \`npm run load\` on ${machine}; load average ${startedLoad} at the start and ${load} at the end (the machine is shared with other work, so times are upper bounds).`,
      "",
      `Cold start, spawn to the first answered request for \`/\` (fresh storage folder each time, so every migration runs first; median of ${COLD_RUNS}):`,
      "",
      "| server | cold start | times the hello ceiling |",
      "|---|---|---|",
      `| hello ceiling (react-router-serve) | ${helloMedian.toFixed(0)} ms | 1.0 × |`,
      `| \`npm start\` = \`node build/server/start.js\` (bundled, no TypeScript at run time) | ${coldMedian.toFixed(0)} ms (runs: ${builtCold.map((t) => t.toFixed(0)).join(", ")}) | ${times(coldMedian / helloMedian)} |`,
      `| the same start through tsx (before the server was bundled) | ${tsxCold[0].toFixed(0)} ms | ${times(tsxCold[0] / helloMedian)} |`,
      "",
      "First load on a phone (empty cache): the page's HTML plus every script, module preload and stylesheet it links, as bytes on the wire with gzip; fonts not counted:",
      "",
      "| page | requests | bytes | of which HTML | of which scripts (and the icon) | times the hello page's bytes |",
      "|---|---|---|---|---|---|",
      ...loads.map(
        ([name, l]) =>
          `| ${name} | ${l.requests} | ${kB(l.bytes)} | ${kB(l.htmlBytes)} | ${kB(l.scriptBytes)} | ${times(l.bytes / helloLoad.bytes)} |`,
      ),
      "",
      "JavaScript each page needs before it responds, from the build's manifest against the budgets (as `npm run build` prints it; also in BUNDLES.md):",
      "",
      "```",
      formatBundleReport(
        bundleRows(readBuiltManifest(path.join(BUILD_DIR, "client")), builtGzipSize(path.join(BUILD_DIR, "client"))),
      ),
      "```",
    ];
    console.log(`\n${weight.join("\n")}`);
    writeSection("## Page weight and start-up (npm run load)", weight);
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
