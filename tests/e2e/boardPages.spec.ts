import AxeBuilder from "@axe-core/playwright";
import { expect, signIn, test } from "./fixtures";

// axe-core (Deque's accessibility rules engine, WCAG 2.x A/AA tags): the board's other teacher
// pages have no serious or critical violation.
async function seriousViolations(page: import("@playwright/test").Page) {
  const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  return results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help}`);
}

test("a student's progress page and the studio time zone are readable and reachable", async ({ page }) => {
  await signIn(page, "ines@tidewater.example");
  await page.goto("/students");
  await page.getByRole("table", { name: "Students of the studio" }).getByRole("link", { name: "Felix Brandt" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Felix Brandt" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Week by week" })).toBeVisible();
  await expect(page.locator("svg.recharts-surface").first()).toBeVisible();
  // Twelve weeks by default, one row each, plus the whole-period row.
  await expect(page.getByRole("table", { name: /figures per week/ }).locator("tbody tr")).toHaveCount(12);
  expect(await seriousViolations(page)).toEqual([]);

  await page.goto("/board");
  await page.getByRole("link", { name: "Studio time zone" }).click();
  await expect(page.getByLabel("Studio time zone")).toHaveValue("America/New_York");
  expect(await seriousViolations(page)).toEqual([]);
});
