// The progress board's server time on a large studio: 40 students × 52 weeks ×
// 5 takes of about two minutes (10,400 takes). Take and take_metrics rows are
// written directly with plausible figures (running the engine 10,400 times would
// time the engine, not the board). The board never reads chord or change rows,
// so none are written; the whole-analysis JSON column holds a small stand-in.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { RouterContextProvider } from "react-router";
import type { TakeAnalysis } from "~/analysis/types";
import { seededRandom } from "../lib/takeGenerator";
import { median } from "./stats";

const STUDENTS = 40;
const WEEKS = 52;
const TAKES_PER_WEEK = 5;
const RUNS = 15;

async function timeAsync(fn: () => Promise<unknown>, runs = RUNS, warmup = 2) {
  for (let i = 0; i < warmup; i++) await fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    await fn();
    times.push(performance.now() - t);
  }
  return { median: median(times), max: Math.max(...times) };
}

export async function benchProgressBoard(): Promise<string[]> {
  const dir = mkdtempSync(path.join(tmpdir(), "nearnote-bench-board-"));
  process.env.STORAGE_DIR = dir;
  process.env.DATABASE_PATH = path.join(dir, "bench.db");
  process.env.SESSION_SECRET ??= "bench-secret-0123456789abcdef0123456789abcdef";
  process.env.APP_URL ??= "http://127.0.0.1:3000";
  // Imported here, after the environment points at the scratch database.
  const { db, closeDatabase } = await import("~/db/client.server");
  const { memberships, studios, takeMetrics, takes, users } = await import("~/db/schema");
  const { createUserSession } = await import("~/auth/session.server");
  const { weekKey } = await import("~/utils/weeks");
  const board = await import("~/routes/board");
  const csv = await import("~/routes/api.export.progress[.]csv");
  try {
    const timeZone = "America/New_York";
    const studio = db().insert(studios).values({ name: "Bench Harbour Studio", timeZone }).returning().get();
    const teacher = db()
      .insert(users)
      .values({ email: "teacher@bench.example", name: "Bench Teacher", passwordHash: "x", emailVerifiedAt: new Date() })
      .returning()
      .get();
    db().insert(memberships).values({ studioId: studio.id, userId: teacher.id, role: "owner" }).run();
    const stand_in = { chords: [], melodyNotes: [], changes: [], summary: {} } as unknown as TakeAnalysis;
    const now = Date.now();
    const seedStart = performance.now();
    db().transaction((tx) => {
      for (let s = 0; s < STUDENTS; s++) {
        const student = tx
          .insert(users)
          .values({
            email: `student${s}@bench.example`,
            name: `Bench Student ${String(s + 1).padStart(2, "0")}`,
            passwordHash: "x",
          })
          .returning()
          .get();
        tx.insert(memberships).values({ studioId: studio.id, userId: student.id, role: "student" }).run();
        const rand = seededRandom(s + 1);
        for (let w = 0; w < WEEKS; w++) {
          const skill = Math.min(0.95, 0.2 + (w / WEEKS) * 0.6 + (rand() - 0.5) * 0.1);
          for (let t = 0; t < TAKES_PER_WEEK; t++) {
            const recordedAt = new Date(now - (WEEKS - 1 - w) * 7 * 86_400_000 - Math.floor(rand() * 6 * 86_400_000));
            const durationSec = 100 + rand() * 40; // about two minutes
            const changes = Math.round(durationSec / 2.5);
            const totalMotion = Math.round(changes * (9 - 5 * skill + rand()));
            const bestTotalMotion = Math.round(changes * 3.2);
            const take = tx
              .insert(takes)
              .values({
                studentId: student.id,
                studioId: studio.id,
                fileKey: `bench-${s}-${w}-${t}`,
                originalName: "bench.mid",
                size: 9000,
                contentHash: `bench-${s}-${w}-${t}`,
                status: "analysed",
                recordedAt,
                weekKey: weekKey(recordedAt, timeZone),
                durationSec,
                analysisVersion: 1,
              })
              .returning({ id: takes.id })
              .get();
            tx.insert(takeMetrics)
              .values({
                takeId: take.id,
                chordCount: changes + 1,
                changeCount: changes,
                totalMotion,
                bestTotalMotion: Math.min(bestTotalMotion, totalMotion),
                smoothness: Math.min(1, bestTotalMotion / totalMotion),
                rootPositionLeaps: Math.round(changes * (1 - skill) * 0.2),
                score: Math.round(40 + 55 * skill),
                accuracy: 0.6 + 0.4 * skill,
                flags: { "root-position-leap": 2 },
                techniques: {
                  inversion: Math.round(changes * skill),
                  "open-voicing": Math.round(changes * skill * 0.5),
                  "smooth-top-line": skill > 0.5 ? 1 : 0,
                },
                topLine: [],
                analysis: stand_in,
              })
              .run();
          }
        }
      }
    });
    const seedMs = performance.now() - seedStart;
    const cookie = (await createUserSession(teacher.id, "/board")).headers.get("Set-Cookie")!.split(";")[0];
    /** One loader call as the server makes it, the body read to the end; returns the body text (if any). */
    const run = (handler: unknown, url: string) => async () => {
      const request = new Request(`http://127.0.0.1:3000${url}`, { headers: { Cookie: cookie } });
      const result = await (handler as (a: unknown) => Promise<unknown>)({
        request,
        params: {},
        context: new RouterContextProvider(),
      });
      return result instanceof Response ? await result.text() : JSON.stringify(result);
    };
    const today = new Date(now).toISOString().slice(0, 10);
    const yearAgo = new Date(now - (WEEKS - 1) * 7 * 86_400_000).toISOString().slice(0, 10);
    const csvUrl = `/api/export/progress.csv?from=${yearAgo}&to=${today}`;
    const rowsOut = (await run(csv.loader, csvUrl)()).trim().split("\r\n").length - 1;
    const boardTime = await timeAsync(run(board.loader, "/board"));
    const csvTime = await timeAsync(run(csv.loader, csvUrl));
    const total = STUDENTS * WEEKS * TAKES_PER_WEEK;
    return [
      "## Progress board",
      `studio: ${STUDENTS} students × ${WEEKS} weeks × ${TAKES_PER_WEEK} takes = ${total} takes with metric rows (written in ${(seedMs / 1000).toFixed(1)} s)`,
      `board loader (/board: auth, 8 weeks of sums, statuses, default chart), median of ${RUNS}: ${boardTime.median.toFixed(1)} ms, max ${boardTime.max.toFixed(1)} ms  (target < 200 ms: ${boardTime.median < 200 ? "met" : "NOT met"})`,
      `full-year CSV export (${rowsOut} rows), median of ${RUNS}: ${csvTime.median.toFixed(1)} ms, max ${csvTime.max.toFixed(1)} ms  (target < 1 s: ${csvTime.median < 1000 ? "met" : "NOT met"})`,
    ];
  } finally {
    closeDatabase();
    rmSync(dir, { recursive: true, force: true });
  }
}

// Run alone with `npx tsx scripts/bench/board.ts`.
if (import.meta.url === `file://${process.argv[1]}`) {
  for (const line of await benchProgressBoard()) console.log(line);
}
