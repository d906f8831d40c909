// The board's status checked against the numbers of its own row for every
// student of the demo studio (twelve weeks of generated takes, analysed by the
// real engine): the two means are recomputed here from the week sums.
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { combineSums, EMPTY_SUMS, figuresFrom, shiftWeek } from "~/utils/progressFigures";
import { boardRows, STATUS_BAND } from "~/models/board.server";
import { seedDemoStudio } from "~/models/demoStudio.server";
import { weeklySums } from "~/models/progress.server";
import { seedDemoTakes } from "../../scripts/lib/seedTakes";
import { useFreshApp } from "../support/setup";

useFreshApp();

const NOW = new Date("2026-12-02T12:00:00Z");

describe("board status on the demo studio", () => {
  it("agrees with the numbers of its own row for every demo student", async () => {
    const { studioId } = await seedDemoStudio(db(), NOW);
    await seedDemoTakes(db(), studioId, NOW);
    const { week, rows } = boardRows(studioId, NOW);
    expect(rows.length).toBe(6);
    const sums = weeklySums(studioId, { fromWeek: shiftWeek(week, -5), toWeek: week });
    for (const r of rows) {
      // The two means recomputed here from the week sums (sum of scores over analysed takes), three weeks each.
      const weeks = sums.get(r.studentId) ?? new Map();
      const mean = (from: number) => {
        const score = figuresFrom(
          combineSums([0, 1, 2].map((i) => weeks.get(shiftWeek(week, -(from + i))) ?? EMPTY_SUMS)),
        ).score;
        return score === null ? null : Math.round(score);
      };
      expect(r.compare, r.name).toEqual({ recent: mean(0), before: mean(3) });
      if (r.thisWeek.takes === 0) {
        expect(["stopped", "new"], r.name).toContain(r.status);
        continue;
      }
      if (r.compare.before === null || r.compare.recent === null) {
        expect(r.status, r.name).toBe("early");
        continue;
      }
      const diff = r.compare.recent - r.compare.before;
      if (r.status === "improving") expect(diff, r.name).toBeGreaterThanOrEqual(STATUS_BAND);
      else if (r.status === "slipping") expect(diff, r.name).toBeLessThanOrEqual(-STATUS_BAND);
      else expect(r.status === "level" && Math.abs(diff) < STATUS_BAND, r.name).toBe(true);
    }
    // The demo stopped one student three weeks ago: no trend status for an empty week.
    expect(rows.find((r) => r.name === "Samir Haddad")?.status).toBe("stopped");
  });
});
