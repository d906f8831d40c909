import { describe, expect, it } from "vitest";
import { navItems } from "~/components/SiteNav";
import {
  combineSums,
  EMPTY_SUMS,
  figuresFrom,
  formatMetric,
  shiftWeek,
  weekEnd,
  weekOfDate,
  weeksBetween,
  type WeekSums,
} from "~/utils/progressFigures";

const sums = (over: Partial<WeekSums>): WeekSums => ({ ...EMPTY_SUMS, techniques: {}, ...over });

describe("weekly figures from sums", () => {
  it("keeps smoothness a ratio of sums when weeks combine, never a mean of ratios", () => {
    // Week A: 9 / 10 = 0.9; week B: 10 / 40 = 0.25. Combined: 19 / 50 = 0.38 (the mean of ratios would be 0.575).
    const a = sums({ takes: 1, analysed: 1, totalMotion: 10, bestTotalMotion: 9, changes: 5 });
    const b = sums({ takes: 1, analysed: 1, totalMotion: 40, bestTotalMotion: 10, changes: 20 });
    expect(figuresFrom(combineSums([a, b])).smoothness).toBeCloseTo(0.38, 12);
  });

  it("reads 1.0 when analysed takes did not move, and nothing at all for a week without analysed takes", () => {
    expect(figuresFrom(sums({ takes: 1, analysed: 1, changes: 3 })).smoothness).toBe(1);
    const failedOnly = figuresFrom(sums({ takes: 2 }));
    expect(failedOnly).toMatchObject({
      takes: 2,
      smoothness: null,
      score: null,
      motionPerChange: null,
      leapsPer10: null,
      accuracy: null,
    });
  });

  it("counts leaps per 10 changes, minutes from seconds, accuracy over exercise takes only", () => {
    const f = figuresFrom(
      sums({
        takes: 3,
        analysed: 3,
        durationSec: 270,
        changes: 40,
        leaps: 6,
        scoreSum: 210,
        accuracySum: 1.5,
        accuracyTakes: 2,
        techniques: { inversion: 2 },
      }),
    );
    expect(f.leapsPer10).toBe(1.5); // 10 × 6 / 40
    expect(f.practiceMinutes).toBe(4.5);
    expect(f.accuracy).toBe(0.75); // 1.5 / 2, not / 3
    expect(f.score).toBe(70);
    expect(f.techniques).toMatchObject({ inversion: 2, "open-voicing": 0 });
  });

  it("formats missing values as a dash", () => {
    expect(formatMetric("smoothness", null)).toBe("–");
    expect(formatMetric("smoothness", 0.836)).toBe("84%");
  });
});

describe("ISO week arithmetic", () => {
  // ISO 8601: a year has 53 weeks when it starts on a Thursday; 1 January 2026 is a Thursday,
  // so 2026-W53 runs from Monday 28 December 2026 to Sunday 3 January 2027.
  it("walks through a 53-week year into the next", () => {
    expect(weekOfDate("2026-12-28")).toBe("2026-W53");
    expect(weekOfDate("2027-01-03")).toBe("2026-W53");
    expect(weekOfDate("2027-01-04")).toBe("2027-W01");
    expect(shiftWeek("2026-W52", 1)).toBe("2026-W53");
    expect(shiftWeek("2026-W53", 1)).toBe("2027-W01");
    expect(shiftWeek("2027-W01", -2)).toBe("2026-W52");
    expect(weeksBetween("2026-W52", "2027-W02")).toEqual(["2026-W52", "2026-W53", "2027-W01", "2027-W02"]);
    expect(weekEnd("2026-W53")).toBe("2027-01-03");
  });

  it("treats a year of 52 weeks too: 2025 ends with W52 (1 January 2025 is a Wednesday, not a leap year)", () => {
    expect(shiftWeek("2025-W52", 1)).toBe("2026-W01");
    expect(weekOfDate("2025-12-29")).toBe("2026-W01");
  });
});

describe("navigation", () => {
  it("gives teachers the board and students never", () => {
    expect(navItems({ name: "Ines", role: "owner", studioName: "Tidewater Keys" }).map((i) => i.to)).toContain(
      "/board",
    );
    expect(navItems({ name: "Marta", role: "teacher", studioName: "Tidewater Keys" }).map((i) => i.to)).toContain(
      "/board",
    );
    expect(navItems({ name: "Dara", role: "student", studioName: "Tidewater Keys" }).map((i) => i.to)).not.toContain(
      "/board",
    );
  });
});
