import { describe, expect, it } from "vitest";
import { navItems } from "~/components/SiteNav";

const labels = (user: Parameters<typeof navItems>[0]) => navItems(user).map((i) => i.to);

describe("navigation by role (accounts)", () => {
  it("gives teachers and owners the roster and settings", () => {
    for (const role of ["owner", "teacher"] as const) {
      expect(labels({ name: "Ines", role, studioName: "Tidewater Keys" })).toEqual(
        expect.arrayContaining(["/students", "/settings"]),
      );
    }
  });

  it("gives students settings but never the roster", () => {
    const items = labels({ name: "Dara", role: "student", studioName: "Tidewater Keys" });
    expect(items).toContain("/settings");
    expect(items).not.toContain("/students");
  });

  it("gives someone without a studio settings (to export or delete) and visitors neither", () => {
    expect(labels({ name: "Dara", role: null, studioName: null })).toContain("/settings");
    expect(labels(null)).not.toContain("/settings");
    expect(labels(null)).not.toContain("/students");
  });
});
