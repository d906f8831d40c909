import { count } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { takeMetrics, takes } from "~/db/schema";
import { boardRows } from "~/models/board.server";
import { EXERCISES, generateTake } from "../../scripts/lib/takeGenerator";
import { useHttpApp } from "../support/httpApp";
import { storedTakeFiles, useFreshApp } from "../support/setup";
import { join, makeStudio, makeUser, PASSWORD } from "./accountsKit";

const app = useFreshApp();
const server = useHttpApp();
let studioId = "";
let students: { id: string; email: string; cookie: string }[] = [];

beforeEach(async () => {
  const studio = makeStudio("Harbour Lane");
  studioId = studio.id;
  students = [];
  for (const name of ["ada", "bo", "cy", "dee"]) {
    const u = makeUser(`${name}@harbour.example`);
    join(studio.id, u.id, "student");
    students.push({ id: u.id, email: u.email, cookie: await server.signIn(u.email, PASSWORD) });
  }
});

describe("twenty uploads at once", () => {
  it("all land, files and rows, and the board adds them up right", async () => {
    // 4 students × 5 different takes each, all sent at the same moment.
    const jobs = students.flatMap((s, si) =>
      Array.from({ length: 5 }, (_, k) => {
        const bytes = generateTake({
          exercise: EXERCISES[k % EXERCISES.length],
          skill: 0.2 * k,
          seed: si * 100 + k,
          loops: 2,
        });
        const form = new FormData();
        form.append("file", new File([new Uint8Array(bytes)], `take-${si}-${k}.mid`));
        return {
          student: s,
          request: () =>
            fetch(`${server.base}/api/takes`, {
              method: "POST",
              body: form,
              headers: { Cookie: s.cookie, Origin: server.base },
            }),
        };
      }),
    );
    const responses = await Promise.all(jobs.map((j) => j.request()));
    const bodies = await Promise.all(responses.map((r) => r.json()));
    expect(responses.map((r) => r.status)).toEqual(Array(20).fill(201));

    expect(db().select({ n: count() }).from(takes).get()!.n).toBe(20);
    expect(db().select({ n: count() }).from(takeMetrics).get()!.n).toBe(20);
    expect(storedTakeFiles(app.storageDir)).toHaveLength(20);

    // The board's figures equal the sums of what each upload answered (smoothness is a ratio of sums).
    const { rows } = boardRows(studioId);
    for (const s of students) {
      const mine = bodies.filter((_, i) => jobs[i].student.id === s.id) as {
        analysis: { summary: { bestTotalMotion: number; totalMotion: number; gradedChangeCount: number } };
      }[];
      const best = mine.reduce((a, b) => a + b.analysis.summary.bestTotalMotion, 0);
      const total = mine.reduce((a, b) => a + b.analysis.summary.totalMotion, 0);
      const changes = mine.reduce((a, b) => a + b.analysis.summary.gradedChangeCount, 0);
      const row = rows.find((r) => r.studentId === s.id)!;
      expect(row.thisWeek.takes).toBe(5);
      expect(row.thisWeek.changes).toBe(changes);
      expect(row.thisWeek.smoothness).toBeCloseTo(total === 0 ? 1 : best / total, 6);
    }
  }, 120_000);
});
