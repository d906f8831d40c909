import { readFileSync } from "node:fs";
import { parse } from "csv-parse/sync";
import { expect, signIn, test } from "./fixtures";

test("the demo teacher sorts the board, switches the chart in place, downloads the CSV and opens a report", async ({
  page,
}) => {
  // Board, chart, CSV, student page and a saved report in one run: more than the default minute on a busy machine.
  test.setTimeout(120_000);
  await signIn(page, "ines@tidewater.example");
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Board" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Progress board" })).toBeVisible();
  const board = page.getByRole("table", { name: /this week's figures per student/i });
  await expect(board.getByRole("row")).toHaveCount(1 + 6); // header + the six demo students

  // Last week always has takes in the demo (this week may not have begun for anyone yet).
  await page.getByLabel("Week shown in the table").selectOption({ index: 1 }); // "Last week"
  await expect(page).toHaveURL(/week=\d{4}-W\d{2}/);
  await expect(page.getByRole("heading", { level: 1, name: "Progress board" })).toBeVisible();
  await expect(page.getByText(/^The week of/)).toBeVisible();

  // Sort by smoothness (on the server: the header is a link): numeric columns sort descending first;
  // students with no value that week go last.
  await board.getByRole("link", { name: /smooth/i }).click();
  await expect(page).toHaveURL(/sort=smoothness&dir=desc/);
  await expect(board.getByRole("columnheader", { name: /smooth/i })).toHaveAttribute("aria-sort", "descending");
  const smoothCells = await board.locator("tbody tr td:nth-child(6)").allInnerTexts();
  const values = smoothCells.map((t) => (/^(\d+)%/.exec(t.trim()) ? Number(/^(\d+)%/.exec(t.trim())![1]) : null));
  const present = values.filter((v): v is number => v !== null);
  expect(present.length).toBeGreaterThan(0);
  expect(present).toEqual([...present].sort((a, b) => b - a));
  expect(values.slice(present.length).every((v) => v === null)).toBe(true);

  // Filtering by name narrows the rows (a GET form: the address keeps the week and the order).
  await page.getByRole("searchbox").fill("Dara");
  await page.getByRole("button", { name: "Filter" }).click();
  await expect(board.locator("tbody tr")).toHaveCount(1);
  await expect(page).toHaveURL(/week=\d{4}-W\d{2}.*name=Dara|name=Dara.*week=\d{4}-W\d{2}/);
  await page.getByRole("searchbox").fill("");
  await page.getByRole("button", { name: "Filter" }).click();
  await expect(board.getByRole("row")).toHaveCount(1 + 6);

  // Switch the chart's metric: the choice goes into the address (replace, no scroll), the loader redraws, no page load.
  await page.evaluate(() => ((window as unknown as { boardMarker: string }).boardMarker = "still here"));
  const caption = page.getByTestId("chart-caption");
  await expect(caption).toContainText("Mean score per week");
  await expect(page.locator(".recharts-line").first()).toBeVisible();
  const apiCall = page.waitForResponse(
    (r) => r.url().includes("/board.data?") && r.url().includes("metric=smoothness") && r.status() === 200,
  );
  await page.getByLabel("Metric").selectOption("smoothness");
  await apiCall;
  await expect(caption).toContainText("Smoothness per week");
  await expect(page).toHaveURL(/metric=smoothness/);
  expect(await page.evaluate(() => (window as unknown as { boardMarker?: string }).boardMarker)).toBe("still here");
  // The screen-reader table follows the chart: percentages now, not scores.
  await page.getByText("Show the chart as a table").click();
  await expect(
    page
      .getByRole("table", { name: /smoothness per week/i })
      .getByRole("cell")
      .first(),
  ).toContainText(/%|–/);

  // Download the CSV for the current choice: one row per student per week of the range.
  const [download] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("link", { name: "Download CSV" }).click(),
  ]);
  expect(download.suggestedFilename()).toMatch(/^nearnote-progress-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.csv$/);
  const records: Record<string, string>[] = parse(readFileSync(await download.path()), { columns: true });
  const students = new Set(records.map((r) => r["Student ID"]));
  const weeks = new Set(records.map((r) => r["ISO week"]));
  expect(Object.keys(records[0])[0]).toBe("Student");
  expect(students.size).toBe(6);
  expect(weeks.size).toBe(12);
  expect(records.length).toBe(students.size * weeks.size);
  expect(records.some((r) => Number(r.Takes) > 0 && Number(r["Smoothness %"]) > 0)).toBe(true);

  // Open a student's printable report from their page.
  await board.getByRole("link", { name: "Dara Okafor", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Dara Okafor" })).toBeVisible();
  await page.getByRole("link", { name: "Printable report" }).click();
  await expect(page.getByRole("article", { name: "Dara Okafor" })).toBeVisible();
  await page
    .getByLabel(/a few sentences/i)
    .fill("Dara's changes got much smoother this term; next, open voicings in A♭.");
  await page.getByRole("button", { name: "Save report" }).click();
  await expect(page).toHaveURL(/report=/);
  await expect(page.getByRole("article")).toContainText("open voicings in A♭");
  // In print, the controls disappear and the sheet stays.
  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("button", { name: /save as a new version/i })).toBeHidden();
  await expect(page.getByRole("article")).toBeVisible();
});
