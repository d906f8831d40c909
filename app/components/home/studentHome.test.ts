import { describe, expect, it } from "vitest";
import { dueWords } from "./StudentHome";
import { weekLabel } from "./WeeklyChart";

describe("student home wording", () => {
  it("counts days to the due date in the studio's calendar", () => {
    expect(dueWords("2026-12-01", "2026-12-01")).toBe("due today");
    expect(dueWords("2026-12-02", "2026-12-01")).toBe("due tomorrow");
    expect(dueWords("2026-12-11", "2026-12-01")).toBe("due in 10 days");
    expect(dueWords("2026-11-30", "2026-12-01")).toBe("1 day overdue");
    expect(dueWords("2026-11-20", "2026-12-01")).toBe("11 days overdue");
    // Across a month end and a year end.
    expect(dueWords("2027-01-02", "2026-12-31")).toBe("due in 2 days");
  });

  it("labels ISO weeks by their Monday (ISO 8601: week 1 holds 4 January)", () => {
    expect(weekLabel("2026-W49")).toBe("Week of 30 Nov 2026");
    expect(weekLabel("2026-W01")).toBe("Week of 29 Dec 2025");
    expect(weekLabel("nonsense")).toBe("nonsense");
  });
});
