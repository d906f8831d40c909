import AxeBuilder from "@axe-core/playwright";
import type { Page } from "@playwright/test";
import { expect, signIn, test } from "./fixtures";

// axe-core (Deque's accessibility rules engine, WCAG 2.x A/AA tags) on the main pages;
// serious and critical violations fail the test.
async function expectNoSeriousViolations(page: Page, label: string) {
  const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const serious = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(
    serious.map(
      (v) =>
        `${label}: ${v.id} (${v.impact}) ${v.help} → ${v.nodes
          .map((n) => n.target.join(" "))
          .slice(0, 3)
          .join(", ")}`,
    ),
  ).toEqual([]);
}

test("visitor pages: landing and sign-in", async ({ page }) => {
  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await expectNoSeriousViolations(page, "landing");
  await page.goto("/login");
  await expect(page.getByLabel("E-mail")).toBeVisible();
  await expectNoSeriousViolations(page, "sign-in");
});

test("student pages: upload, a take, an exercise", async ({ page }) => {
  await signIn(page, "dara@tidewater.example");
  await page.goto("/takes/new");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await expectNoSeriousViolations(page, "upload");

  const { takes } = (await (await page.request.get("/api/takes")).json()) as { takes: { id: string }[] };
  await page.goto(`/takes/${takes[0].id}`);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await expectNoSeriousViolations(page, "take");

  await page.goto("/exercises");
  await page.getByRole("link", { name: "Three-chord smoothing in D" }).first().click();
  await expect(page.getByRole("heading", { level: 1, name: /Three-chord smoothing/ })).toBeVisible();
  await expectNoSeriousViolations(page, "exercise");
});

test("teacher pages: board and a printable report", async ({ page }) => {
  await signIn(page, "ines@tidewater.example");
  await page.goto("/board");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  // Charts draw after hydration; wait for the chart's table alternative to be there.
  await expect(page.locator("svg.recharts-surface").first()).toBeVisible();
  await expectNoSeriousViolations(page, "board");

  const report = page.getByRole("link", { name: /report/i }).first();
  await report.click();
  await expect(page).toHaveURL(/\/reports\//);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await expectNoSeriousViolations(page, "report");
});

test("the take page works from the keyboard alone", async ({ page }) => {
  await signIn(page, "yuki@tidewater.example");
  const { takes } = (await (await page.request.get("/api/takes")).json()) as {
    takes: { id: string; rootPositionLeaps: number | null }[];
  };
  const flagged = takes.find((t) => (t.rootPositionLeaps ?? 0) > 0) ?? takes[0];
  await page.goto(`/takes/${flagged.id}`);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  // Tab to the play button and press it, without the mouse.
  const play = page.getByRole("button", { name: /play take/i });
  for (let i = 0; i < 40 && !(await play.evaluate((el) => el === document.activeElement)); i++)
    await page.keyboard.press("Tab");
  await expect(play).toBeFocused();
  await page.keyboard.press("Enter");
  await expect(page.getByRole("button", { name: /stop/i }).first()).toBeEnabled();
});
