// Server render time of the take page for a 10-minute take: the built app's request
// handler (loader + React server render), called in-process, so no network is timed.
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { createRequestHandler, type ServerBuild } from "react-router";
import { BUILD_DIR, buildIfNeeded } from "../lib/runApp";
import { generateLongTake } from "../lib/takeGenerator";
import { median } from "./stats";

/** Points the app at a throwaway storage folder; call before any app module touches the database. */
export function useScratchStorage(label: string) {
  const dir = mkdtempSync(path.join(tmpdir(), `nearnote-bench-${label}-`));
  process.env.STORAGE_DIR = dir;
  process.env.DATABASE_PATH = path.join(dir, "bench.db");
  process.env.SESSION_SECRET ??= "bench-secret-0123456789abcdef0123456789abcdef";
  process.env.NEARNOTE_BACKGROUND = "off";
  return dir;
}

export async function benchTakePage(): Promise<string[]> {
  useScratchStorage("take");
  buildIfNeeded();
  const { db, closeDatabase } = await import("~/db/client.server");
  const { resetEnvForTests } = await import("~/server/env.server");
  const { resetSessionCookieForTests } = await import("~/auth/session.server");
  // Another section may have pointed the app at its own scratch database first.
  closeDatabase();
  resetEnvForTests();
  resetSessionCookieForTests();
  const { memberships, sessions, studios, users } = await import("~/db/schema");
  const { sessionCookie } = await import("~/auth/session.server");
  const { createTakeRecord } = await import("~/models/takes.server");
  const { analyseTakeBytes } = await import("~/models/takeAnalysis.server");
  const { newFileKey, takeStorage } = await import("~/takes/takeFiles.server");

  const studio = db().insert(studios).values({ name: "Bench studio" }).returning().get();
  const student = db()
    .insert(users)
    .values({ email: "bench@student.example", name: "Bench Student", passwordHash: "x" })
    .returning()
    .get();
  db().insert(memberships).values({ userId: student.id, studioId: studio.id, role: "student" }).run();
  const bytes = generateLongTake(10);
  const fileKey = newFileKey();
  await takeStorage().put(fileKey, new File([new Uint8Array(bytes)], "long.mid"));
  const takeId = createTakeRecord({
    studentId: student.id,
    studioId: studio.id,
    exerciseId: null,
    key: null,
    note: "",
    fileKey,
    originalName: "long.mid",
    size: bytes.length,
    contentHash: "bench",
    recordedAt: new Date(),
    outcome: analyseTakeBytes(bytes, {}),
  });
  const session = db()
    .insert(sessions)
    .values({ userId: student.id, expiresAt: new Date(Date.now() + 86_400_000) })
    .returning()
    .get();
  const cookie = (await sessionCookie().serialize(session.id)).split(";")[0];

  const build = (await import(pathToFileURL(path.join(BUILD_DIR, "server/index.js")).href)) as ServerBuild;
  const handler = createRequestHandler(build, "production");
  const render = async () => {
    const t = performance.now();
    const res = await handler(new Request(`http://127.0.0.1:3000/takes/${takeId}`, { headers: { Cookie: cookie } }));
    const html = await res.text();
    if (res.status !== 200) throw new Error(`take page answered ${res.status}`);
    return { ms: performance.now() - t, bytes: html.length };
  };
  const first = await render();
  const runs: number[] = [];
  for (let i = 0; i < 15; i++) runs.push((await render()).ms);
  const m = median(runs);
  return [
    "## Take page (server render)",
    `take: generated 10-minute take, ${first.bytes.toLocaleString("en")} bytes of HTML`,
    `server render (loader + React SSR), median of 15: ${m.toFixed(1)} ms  (target < 300 ms: ${m < 300 ? "met" : "NOT met"})`,
    `first render in a fresh process: ${first.ms.toFixed(1)} ms`,
  ];
}
