import { mkdirSync } from "node:fs";
import path from "node:path";
import { expect, signIn, test } from "./fixtures";

// A take sent as free practice (no exercise) has no target: its page says so, names the key it
// is heard in and the student's exercise it likely is, checks it against a progression the
// student types, and files it under the exercise with one button. At a laptop's size and a
// phone's, with no sideways scroll; screenshots under test-results/screens/.

const sample = (name: string) => path.resolve("samples", name);
const SCREENS = "test-results/screens";
const SIZES = [
  { name: "desktop", width: 1366, height: 900, student: "yuki@tidewater.example" },
  { name: "phone", width: 390, height: 844, student: "samir@tidewater.example" },
] as const;

for (const size of SIZES) {
  test(`a free-practice take is checked against a progression and filed (${size.name})`, async ({ page }) => {
    test.setTimeout(120_000);
    await page.setViewportSize({ width: size.width, height: size.height });
    await signIn(page, size.student);
    await page.goto("/takes/new");
    await expect(page.getByRole("button", { name: /^Upload/ })).toBeDisabled();
    await page.getByLabel("MIDI files", { exact: true }).setInputFiles(sample("sunday-ballad-ab.mid"));
    await page.getByRole("button", { name: "Upload" }).click();
    await expect(page.getByTestId("upload-row")).toHaveAttribute("data-stage", "analysed");
    await page.getByRole("link", { name: "Open take sunday-ballad-ab.mid" }).click();
    await expect(page.getByRole("heading", { level: 1, name: "Free practice take" })).toBeVisible();

    const card = page.getByTestId("practice-check");
    await expect(card.getByRole("heading", { name: "Against a progression" })).toBeVisible();
    await expect(card).toContainText("Free practice: no exercise sets a target for this take");
    await expect(card.getByTestId("practice-heard-key")).toHaveText(/^(A♭ major|F minor)$/);
    await expect(card.getByTestId("practice-likely")).toContainText("“Sunday ballad in A♭” in A♭ major");

    // The student names the progression in Roman numerals, as the teacher wrote it, in A♭.
    await card.getByLabel("Progression", { exact: true }).fill("vi–IV–I–V");
    await card.getByLabel("Key", { exact: true }).selectOption({ label: "A♭ major" });
    await card.getByRole("button", { name: "Check" }).click();
    const result = card.getByRole("region", { name: "Result of the check" });
    await expect(result.getByRole("heading", { name: "Against vi–IV–I–V in A♭ major" })).toBeVisible();
    await expect(result.getByTestId("grading-accuracy")).toHaveText(/^\d+%$/);
    await expect(page).toHaveURL(/against=vi/);
    const widths = await page.evaluate(() => ({ doc: document.documentElement.scrollWidth, view: window.innerWidth }));
    expect(widths.doc).toBe(widths.view);
    mkdirSync(SCREENS, { recursive: true });
    await card.scrollIntoViewIfNeeded();
    await card.screenshot({ path: `${SCREENS}/practice-check-${size.name}.png` });

    // A chord the page cannot read is named instead of a result.
    await card.getByLabel("Progression", { exact: true }).fill("vi IV X V");
    await card.getByRole("button", { name: "Check" }).click();
    await expect(card.getByTestId("practice-error")).toContainText("“vi IV X V” could not be read");

    // One button files it under the exercise; the page then grades it against the exercise.
    await card.getByRole("button", { name: "File it under “Sunday ballad in A♭”" }).click();
    await expect(page.getByRole("heading", { level: 1, name: "Sunday ballad in A♭" })).toBeVisible();
    await expect(page.getByTestId("practice-check")).toHaveCount(0);
    await expect(page.getByRole("heading", { name: "Against the exercise: Sunday ballad in A♭" })).toBeVisible();
  });
}
