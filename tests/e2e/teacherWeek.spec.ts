import AxeBuilder from "@axe-core/playwright";
import type { Page } from "@playwright/test";
import { expect, signIn, test } from "./fixtures";

// The teacher's pages at a laptop size and a phone size: nothing scrolls
// sideways, no console error (the fixture), axe-core (Deque's rules engine,
// WCAG 2.x A/AA tags) finds nothing serious or critical, and a screenshot of
// each is kept under test-results/screens/ for a person to look at.
const SIZES = [
  { name: "desktop", width: 1366, height: 900 },
  { name: "phone", width: 390, height: 844 },
] as const;

const PAGES = [
  { name: "home", path: "/home", ready: (page: Page) => page.getByTestId("new-takes") },
  { name: "review", path: "/review", ready: (page: Page) => page.getByTestId("review-queue") },
  { name: "board", path: "/board", ready: (page: Page) => page.locator("svg.recharts-surface").first() },
  {
    name: "roster",
    path: "/students",
    ready: (page: Page) => page.getByRole("table", { name: "Students of the studio" }),
  },
] as const;

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

async function expectNoSidewaysScroll(page: Page, label: string) {
  const { scrollWidth, innerWidth } = await page.evaluate(() => ({
    scrollWidth: document.documentElement.scrollWidth,
    innerWidth: window.innerWidth,
  }));
  expect(scrollWidth, `${label}: page width`).toBe(innerWidth);
}

for (const size of SIZES) {
  test(`teacher pages at ${size.width}×${size.height}: no sideways scroll, no serious axe finding`, async ({
    page,
  }) => {
    // Four pages, each with axe and two screenshots, on a shared two-core machine.
    test.setTimeout(180_000);
    await page.setViewportSize({ width: size.width, height: size.height });
    await signIn(page, "ines@tidewater.example");
    for (const p of PAGES) {
      await page.goto(p.path);
      await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
      await expect(p.ready(page)).toBeVisible();
      await expectNoSidewaysScroll(page, `${p.name} ${size.name}`);
      await expectNoSeriousViolations(page, `${p.name} ${size.name}`);
      await page.screenshot({ path: `test-results/screens/${p.name}-${size.name}.png`, fullPage: true });
      // The first screenful too, as a person sees it on opening the page.
      await page.screenshot({ path: `test-results/screens/${p.name}-${size.name}-first-screen.png` });
    }
  });
}

test("the board's table keeps every column inside 1366 px, and its statuses name what they compare", async ({
  page,
}) => {
  await page.setViewportSize({ width: 1366, height: 900 });
  await signIn(page, "ines@tidewater.example");
  await page.goto("/board");
  const table = page.getByRole("table", { name: /this week's figures per student/i });
  await expect(table).toBeVisible();
  const box = await table.boundingBox();
  const frame = await table.locator("xpath=..").boundingBox();
  expect(box!.x + box!.width).toBeLessThanOrEqual(frame!.x + frame!.width + 1);
  // No column is cut: every header's right edge is inside the table's frame.
  for (const header of await table.locator("thead th").all()) {
    const b = await header.boundingBox();
    expect(b!.x + b!.width).toBeLessThanOrEqual(frame!.x + frame!.width + 1);
  }
  // A trend status prints the two means it compares; a student with no take this week has none.
  for (const row of await table.getByTestId("board-row").all()) {
    const status = (await row.locator('[data-column="status"]').innerText()).trim();
    const takes = (await row.locator('[data-column="takes"]').innerText()).trim();
    if (/^(Improving|Holding level|Slipping)/.test(status)) {
      expect(status).toMatch(/last 3 weeks \d+ → \d+/);
      expect(takes).not.toMatch(/^0\b/);
      const [, before, recent] = /(\d+) → (\d+)/.exec(status)!.map(Number);
      if (status.startsWith("Improving")) expect(recent - before).toBeGreaterThanOrEqual(3);
      if (status.startsWith("Slipping")) expect(before - recent).toBeGreaterThanOrEqual(3);
      if (status.startsWith("Holding level")) expect(Math.abs(recent - before)).toBeLessThan(3);
    }
    if (/^0\b/.test(takes)) expect(status).toMatch(/^(No takes this week|No takes yet)/);
  }
});

test("the list of takes to listen to: newest first, filters in the address, several marked at once", async ({
  page,
}) => {
  await signIn(page, "ines@tidewater.example");
  await page.goto("/review");
  const list = page.getByTestId("review-queue");
  await expect(list).toBeVisible();
  const times = async () =>
    list.locator("tbody time").evaluateAll((els) => els.map((e) => e.getAttribute("datetime") ?? ""));
  const newest = await times();
  expect(newest.length).toBeGreaterThan(1);
  expect(newest).toEqual([...newest].sort().reverse());
  const count = async () => Number(/^(\d+)/.exec((await page.getByTestId("listening-count").innerText()).trim())![1]);
  const everyone = await count();

  // Oldest first reverses the order.
  await page.getByLabel("Order").selectOption("oldest");
  await expect(page).toHaveURL(/sort=oldest/);
  await expect.poll(async () => (await times())[0]).not.toBe(newest[0]);
  const oldest = await times();
  expect(oldest).toEqual([...oldest].sort());

  // One student only: every row is theirs and the address says so.
  await page.getByLabel("Order").selectOption("newest");
  await page.getByLabel("Student").selectOption({ label: "Dara Okafor" });
  await expect(page).toHaveURL(/student=/);
  await expect.poll(count).toBeLessThan(everyone);
  const students = await list.locator("tbody td[data-label='Student']").allInnerTexts();
  expect(new Set(students.map((t) => t.trim()))).toEqual(new Set(["Dara Okafor"]));
  const daras = await count();

  // Tick two and mark them in one action; the filter stays and the count drops by two.
  const boxes = list.getByRole("checkbox", { name: /^Tick Dara/ });
  await boxes.nth(0).check();
  await boxes.nth(1).check();
  await page.getByRole("button", { name: "Mark 2 as heard" }).click();
  await expect(page.getByText("2 takes marked as heard.")).toBeVisible();
  await expect(page).toHaveURL(/student=/);
  expect(await count()).toBe(daras - 2);
  // And back, from the undo offer.
  await page.getByRole("button", { name: "Put them back on the list" }).click();
  await expect(page.getByText("2 takes back on the list to listen to.")).toBeVisible();
  expect(await count()).toBe(daras);
});
