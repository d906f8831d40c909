import { describe, expect, it } from "vitest";
import { studioClock, studioDateTime, studioShortDate, zoneName } from "./studioTime";

// Offsets from the IANA time zone database (tzdata): New York is UTC−5 in
// December (EST), Tokyo UTC+9 all year; 2 December 2026 is a Wednesday.
describe("studio time", () => {
  it("prints an instant in the studio's zone, across a date line", () => {
    expect(studioDateTime("2026-12-02T03:30:00Z", "America/New_York")).toBe("1 Dec 2026, 22:30");
    expect(studioDateTime("2026-12-02T03:30:00Z", "Asia/Tokyo")).toBe("2 Dec 2026, 12:30");
    expect(studioShortDate("2026-12-02T12:00:00Z", "UTC")).toBe("Wed 2 Dec");
    expect(studioClock("2026-12-02T00:05:00Z", "UTC")).toBe("00:05");
  });

  it("names the zone the way a person says it", () => {
    expect(zoneName("America/New_York")).toBe("New York");
    expect(zoneName("UTC")).toBe("UTC");
  });

  it("prints a dash for a date it cannot read", () => {
    expect(studioDateTime("not a date", "UTC")).toBe("–");
  });
});
