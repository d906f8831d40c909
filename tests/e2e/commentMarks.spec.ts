import { mkdirSync } from "node:fs";
import type { Browser, Page } from "@playwright/test";
import { expect, signIn, test } from "./fixtures";

// A teacher's comment pinned to one change of a take carries a mark where the change sits: in
// the list of changes and on the time line under the piano roll, at the time the change lands.
// The teacher pins it; the student sees the marks and reads the comment at that change, on a
// laptop (1366×900) and on a phone (390×844). Screenshots go to test-results/screens/.

const SCREENS = "test-results/screens";
const SIZES = [
  { name: "desktop", width: 1366, height: 900 },
  { name: "phone", width: 390, height: 844 },
] as const;
type Analysis = { chords: unknown[]; changes: { from: number; to: number }[] };

async function newPage(browser: Browser, baseURL: string | undefined, email: string, width: number, height: number) {
  const context = await browser.newContext({ baseURL, viewport: { width, height } });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") errors.push(m.text());
  });
  page.on("pageerror", (e) => errors.push(e.message));
  await signIn(page, email);
  return { page, context, errors };
}

/** What a person sees of the marks: which change rows carry one, and where the time line's sit. */
async function expectMarksAt(page: Page, change: number, to: number) {
  const rows = page.getByTestId("change-row");
  await expect(rows.first()).toBeVisible();
  // The change list: exactly the commented change carries the mark, labelled in words.
  const marked = page.getByTestId("change-row").filter({ has: page.getByTestId("comment-mark") });
  await expect(marked).toHaveCount(1);
  await expect(marked.locator("button[data-change]")).toHaveAttribute("data-change", String(change));
  await expect(marked.getByTestId("comment-mark")).toHaveText("comment");
  // The time line: one comment mark, where the change lands (the start of the chord it moves to).
  const mark = page.getByTestId("mark-comment");
  await expect(mark).toHaveCount(1);
  await mark.scrollIntoViewIfNeeded();
  await expect(mark).toContainText("comment");
  const lane = page.locator(`[data-testid="chord-symbol"][data-chord-index="${to}"]`);
  if (await lane.count()) {
    const [m, c] = [await mark.boundingBox(), await lane.boundingBox()];
    // The mark is centred where the chord's cell starts; the chord's name starts 4 px into its cell.
    expect(Math.abs(m!.x + m!.width / 2 - (c!.x - 4))).toBeLessThan(8);
  }
}

for (const size of SIZES) {
  test(`comment marks on the change list and the time line (${size.name})`, async ({ browser, baseURL }) => {
    test.setTimeout(150_000);
    const student = await newPage(browser, baseURL, "samir@tidewater.example", size.width, size.height);
    const { takes } = (await (await student.page.request.get("/api/takes")).json()) as {
      takes: { id: string; status: string }[];
    };
    // A demo take with at least four changes, a different one at each size.
    const withChanges: { id: string; analysis: Analysis }[] = [];
    for (const t of takes.filter((t) => t.status === "analysed")) {
      const { analysis } = (await (await student.page.request.get(`/api/takes/${t.id}`)).json()) as {
        analysis: Analysis | null;
      };
      if (analysis && analysis.changes.length >= 4) withChanges.push({ id: t.id, analysis });
      if (withChanges.length === 2) break;
    }
    const chosen = withChanges[size.name === "desktop" ? 0 : 1];
    expect(chosen, "a demo take with four changes").toBeDefined();
    const change = 2; // the third change, shown as "Change 3"
    const to = chosen.analysis.changes[change].to;

    // The teacher opens the take at change 3 and pins a comment there.
    const teacher = await newPage(browser, baseURL, "ines@tidewater.example", size.width, size.height);
    await teacher.page.goto(`/takes/${chosen.id}?change=${change + 1}`);
    await expect(teacher.page.getByRole("heading", { name: /^Change 3: / })).toBeVisible();
    await expect(teacher.page.getByTestId("comment-mark")).toHaveCount(0);
    await expect(teacher.page.getByTestId("mark-comment")).toHaveCount(0);
    const text = "Let the top note stay where it is and move the inner voices by a step.";
    await teacher.page.getByLabel("Comment on change 3").fill(text);
    await teacher.page.getByRole("button", { name: "Pin comment here" }).click();
    await expect(teacher.page.getByRole("region", { name: "Comments on change 3" })).toContainText(text);
    // The teacher sees the marks at once.
    await expectMarksAt(teacher.page, change, to);

    // The student opens the take at its start and finds the comment by its marks.
    await student.page.goto(`/takes/${chosen.id}`);
    await expect(student.page.getByRole("heading", { level: 1 })).toBeVisible();
    await expectMarksAt(student.page, change, to);
    await student.page
      .getByTestId("change-row")
      .filter({ has: student.page.getByTestId("comment-mark") })
      .locator("button[data-change]")
      .click();
    await expect(student.page.getByRole("heading", { name: /^Change 3: / })).toBeVisible();
    const here = student.page.getByRole("region", { name: "Comments on change 3" });
    await expect(here.getByTestId("comment")).toContainText("Ines Marlowe");
    await expect(here.getByTestId("comment")).toContainText(text);
    const width = await student.page.evaluate(() => document.documentElement.scrollWidth);
    expect(width).toBe(size.width);
    mkdirSync(SCREENS, { recursive: true });
    await student.page.getByTestId("mark-comment").scrollIntoViewIfNeeded();
    await student.page.screenshot({ path: `${SCREENS}/comment-marks-timeline-${size.name}.png` });
    await here.scrollIntoViewIfNeeded();
    await student.page.screenshot({ path: `${SCREENS}/comment-marks-change-${size.name}.png` });

    expect(student.errors, "student's console errors").toEqual([]);
    expect(teacher.errors, "teacher's console errors").toEqual([]);
    await teacher.context.close();
    await student.context.close();
  });
}
