import { mkdirSync } from "node:fs";
import AxeBuilder from "@axe-core/playwright";
import type { Page } from "@playwright/test";
import { encodeMidi } from "../../app/browser/midiEncode";
import { expect, signIn, test } from "./fixtures";

// The student's pages at a laptop's size (1366×900) and a phone's (390×844): no sideways
// scroll (the document is exactly as wide as the viewport), no console error (fixtures),
// axe-core (Deque's accessibility rules engine, WCAG 2.x A/AA tags) without serious or
// critical findings, text of at least 12 px on the phone, dates on one line; a screenshot of
// each page at each size goes to test-results/screens/ for a person to look at.

const SIZES = [
  { name: "desktop", width: 1366, height: 900 },
  { name: "phone", width: 390, height: 844 },
] as const;
const SCREENS = "test-results/screens";

async function seriousViolations(page: Page, label: string) {
  const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  return results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map(
      (v) =>
        `${label}: ${v.id} (${v.impact}) ${v.help} → ${v.nodes
          .map((n) => n.target.join(" "))
          .slice(0, 3)
          .join(", ")}`,
    );
}

/** Visible text set smaller than 12 px: the element and its size. */
function smallText(page: Page) {
  return page.evaluate(() => {
    const small: string[] = [];
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    for (let node = walker.nextNode(); node; node = walker.nextNode()) {
      const el = node.parentElement;
      if (!el || !node.textContent?.trim()) continue;
      const box = el.getBoundingClientRect();
      const style = getComputedStyle(el);
      if (box.width === 0 || box.height === 0 || style.visibility === "hidden" || el.closest(".sr-only")) continue;
      // Text in a drawing is as large as the drawing's scale makes it.
      const svg = el.closest("svg");
      const scale = svg?.getScreenCTM()?.a ?? 1;
      const size = parseFloat(style.fontSize) * scale;
      if (size < 11.9)
        small.push(`${el.tagName.toLowerCase()} "${node.textContent.trim().slice(0, 30)}" ${size.toFixed(1)}px`);
    }
    return small;
  });
}

/** Dates and state badges that wrap onto a second line. */
function wrappedDates(page: Page) {
  return page.evaluate(() =>
    [...document.querySelectorAll<HTMLElement>("[data-testid='exercise-state'], time, .whitespace-nowrap")]
      .filter((el) => el.getBoundingClientRect().width > 0)
      .filter((el) => el.getBoundingClientRect().height > parseFloat(getComputedStyle(el).lineHeight || "20") * 1.5 + 8)
      .map((el) => el.textContent?.trim() ?? ""),
  );
}

async function checkPage(page: Page, label: string, size: (typeof SIZES)[number]) {
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  const widths = await page.evaluate(() => ({
    doc: document.documentElement.scrollWidth,
    view: window.innerWidth,
    // What sticks out, to say where to look when the widths differ.
    wide: [...document.body.querySelectorAll<HTMLElement>("*")]
      .filter((el) => el.getBoundingClientRect().right > window.innerWidth + 0.5)
      .slice(0, 5)
      .map(
        (el) =>
          `${el.tagName.toLowerCase()}.${String(el.className).slice(0, 60)} ${Math.round(el.getBoundingClientRect().right)}`,
      ),
  }));
  expect(widths.doc, `${label} at ${size.name}: document width (${widths.wide.join("; ")})`).toBe(widths.view);
  expect(await seriousViolations(page, `${label} at ${size.name}`)).toEqual([]);
  if (size.name === "phone") {
    expect(await smallText(page), `${label}: text under 12 px`).toEqual([]);
    expect(await wrappedDates(page), `${label}: dates on two lines`).toEqual([]);
  }
  mkdirSync(SCREENS, { recursive: true });
  await page.screenshot({ path: `${SCREENS}/${label}-${size.name}.png`, fullPage: true });
}

for (const size of SIZES) {
  test.describe(`at ${size.width}×${size.height}`, () => {
    test.use({ viewport: { width: size.width, height: size.height } });

    test(`a student's pages fit, read and pass axe (${size.name})`, async ({ page }) => {
      // Five pages, each with axe and a full-page screenshot, on a shared two-core machine.
      test.setTimeout(240_000);
      await signIn(page, "felix@tidewater.example");
      await checkPage(page, "student-home", size);
      await expect(page.getByRole("heading", { name: "Due exercises" })).toBeVisible();

      await page.goto("/exercises");
      await expect(page.getByTestId("student-exercise").first()).toBeVisible();
      await checkPage(page, "exercises", size);
      // The state each card shows is the one home showed for the same exercise.
      const firstCard = page.getByTestId("student-exercise").first();
      const title = (await firstCard.getByRole("heading").innerText()).trim();
      const listState = (await firstCard.getByTestId("exercise-state").innerText()).trim();
      await firstCard.getByRole("link", { name: title }).click();
      await expect(page.getByRole("heading", { level: 1, name: title })).toBeVisible();
      await expect(page.getByTestId("my-exercise-state").getByTestId("exercise-state")).toHaveText(listState);
      await expect(page.getByTestId("model-choices").locator("li").first()).toBeVisible();
      await checkPage(page, "exercise", size);
      await page.goto("/home");
      await expect(
        page.getByTestId("home-exercise").filter({ hasText: title }).getByTestId("exercise-state"),
      ).toHaveText(listState);

      await page.goto("/takes/new");
      await checkPage(page, "upload", size);

      await page.goto("/settings");
      await checkPage(page, "settings", size);
    });
  });
}

test.describe("on a phone", () => {
  test.use({ viewport: { width: 390, height: 844 } });

  test("the site navigation folds into a Menu button that opens, navigates and closes", async ({ page }) => {
    await signIn(page, "felix@tidewater.example");
    const nav = page.getByRole("navigation", { name: "Main" });
    const menu = nav.getByTestId("compact-menu");
    await expect(nav.getByRole("link", { name: "Exercises" })).toBeHidden();
    await menu.locator("summary").click();
    await expect(menu).toHaveAttribute("open", "");
    await nav.getByRole("link", { name: "Exercises" }).click();
    await expect(page.getByRole("heading", { level: 1, name: "Exercises" })).toBeVisible();
    await expect(menu).not.toHaveAttribute("open", "");
    await expect(nav.getByRole("link", { name: "Upload" })).toBeHidden();
  });
});

/**
 * vi IV I V in A♭ (Fm D♭ A♭ E♭, common practice degrees), twice round and home, as block
 * chords one a second; the velocity varies per run so the file is new to the studio each time.
 */
function balladInAb(): Buffer {
  const chords = [
    [53, 60, 65, 68],
    [49, 61, 65, 68],
    [44, 60, 63, 68],
    [51, 58, 63, 67],
  ];
  const seq = [...chords, ...chords, [44, 60, 63, 68]];
  const velocity = 60 + Math.floor(Math.random() * 40);
  const notes = seq.flatMap((c, i) => c.map((midi) => ({ midi, start: i, end: i + 0.9, velocity })));
  return Buffer.from(encodeMidi({ notes, bpm: 60, name: "ballad" }));
}

test("upload of a file under the wrong exercise shows the warning and moves it in one click", async ({ page }) => {
  await signIn(page, "lena@tidewater.example");
  await page.goto("/exercises");
  const smoothing = page
    .getByTestId("student-exercise")
    .filter({ hasText: "Three-chord smoothing in D" })
    .getByRole("link", { name: "Three-chord smoothing in D" });
  const href = await smoothing.getAttribute("href");
  await page.goto(`/takes/new?exercise=${href!.split("/").pop()}`);
  await page
    .getByLabel("MIDI files")
    .setInputFiles({ name: "ballad.mid", mimeType: "audio/midi", buffer: balladInAb() });
  const row = page.getByTestId("upload-row");
  // The file's own exercise starts as the one chosen above.
  await expect(row.getByLabel(/Exercise for this file/)).toHaveValue("");
  await page.getByRole("button", { name: /^Upload/ }).click();
  await expect(row).toHaveAttribute("data-stage", "analysed");
  const notice = row.getByTestId("fit-notice");
  await expect(notice).toContainText("This sounds like");
  await expect(notice).toContainText("“Three-chord smoothing in D” is in D major");
  await expect(notice).toContainText("It sounds like “Sunday ballad in A♭” in A♭ major");
  mkdirSync(SCREENS, { recursive: true });
  await page.screenshot({ path: `${SCREENS}/upload-wrong-exercise-desktop.png`, fullPage: true });

  // The take's page says the same, and one click files it under the likely exercise.
  await row.getByRole("link", { name: /Open take/ }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Three-chord smoothing in D" })).toBeVisible();
  await expect(page.getByTestId("fit-notice")).toContainText("It sounds like “Sunday ballad in A♭”");
  await page.getByRole("button", { name: "Move it to “Sunday ballad in A♭” in A♭" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Sunday ballad in A♭" })).toBeVisible();
  await expect(page.getByText("Take moved and graded against the exercise again.")).toBeVisible();
  await expect(page.getByTestId("fit-notice")).toHaveCount(0);
});
