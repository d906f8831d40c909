import { describe, expect, it } from "vitest";
import { isoWeekOfDate, isValidTimeZone, weekKey, weekStart } from "~/utils/weeks";

describe("ISO weeks", () => {
  // ISO 8601 week-numbering examples (the standard's rule: week 1 contains the year's first Thursday);
  // the dates are the well-known year-boundary cases also listed in the Wikipedia "ISO week date" article.
  it.each([
    [2005, 1, 1, "2004-W53"],
    [2005, 1, 2, "2004-W53"],
    [2005, 12, 31, "2005-W52"],
    [2007, 1, 1, "2007-W01"],
    [2007, 12, 30, "2007-W52"],
    [2007, 12, 31, "2008-W01"],
    [2008, 12, 29, "2009-W01"],
    [2009, 12, 31, "2009-W53"],
    [2010, 1, 3, "2009-W53"],
    [2010, 1, 4, "2010-W01"],
  ])("%i-%i-%i is %s", (y, m, d, expected) => {
    const w = isoWeekOfDate(y, m, d);
    expect(`${w.year}-W${String(w.week).padStart(2, "0")}`).toBe(expected);
  });

  it("uses the studio's own time zone", () => {
    // Monday 2026-11-30 01:30 UTC is still Sunday evening in New York.
    const instant = new Date("2026-11-30T01:30:00Z");
    expect(weekKey(instant, "UTC")).toBe("2026-W49");
    expect(weekKey(instant, "America/New_York")).toBe("2026-W48");
    expect(weekKey(instant, "Asia/Tokyo")).toBe("2026-W49");
  });

  it("gives the Monday a week starts on", () => {
    expect(weekStart("2026-W49")).toBe("2026-11-30");
    expect(weekStart("2009-W53")).toBe("2009-12-28");
    expect(weekStart("2008-W01")).toBe("2007-12-31");
  });

  it("checks time-zone names", () => {
    expect(isValidTimeZone("Europe/Lisbon")).toBe(true);
    expect(isValidTimeZone("Mars/Olympus")).toBe(false);
  });
});
