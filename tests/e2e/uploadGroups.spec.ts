import { mkdirSync } from "node:fs";
import path from "node:path";
import { expect, signIn, test } from "./fixtures";

// Filing each take of one upload under its own exercise in a browser without JavaScript: the
// files picked at the top go to the exercise chosen there, and each group of files goes to
// its own exercise. At a laptop's size and a phone's, with no sideways scroll and a
// screenshot of the form and of the results under test-results/screens/.

const sample = (name: string) => path.resolve("samples", name);
const SCREENS = "test-results/screens";
const SIZES = [
  { name: "desktop", width: 1366, height: 900, student: "owen@tidewater.example" },
  { name: "phone", width: 390, height: 844, student: "lena@tidewater.example" },
] as const;

async function documentFits(page: import("@playwright/test").Page) {
  const w = await page.evaluate(() => ({ doc: document.documentElement.scrollWidth, view: window.innerWidth }));
  expect(w.doc).toBe(w.view);
}

test.describe("without JavaScript", () => {
  test.use({ javaScriptEnabled: false });

  for (const size of SIZES) {
    test(`each group of files goes to its own exercise (${size.name})`, async ({ page }) => {
      test.setTimeout(120_000);
      await page.setViewportSize({ width: size.width, height: size.height });
      await signIn(page, size.student);
      await page.goto("/takes/new");
      await expect(page.getByRole("heading", { level: 1, name: "Upload takes" })).toBeVisible();
      const groups = page.getByRole("group", { name: "Files for other exercises" });
      await expect(groups).toBeVisible();

      // The top choice: the smoothing exercise, for the files picked in the main field.
      await page.getByLabel("Exercise", { exact: true }).selectOption({ label: "Three-chord smoothing in D" });
      await page.getByLabel("MIDI files", { exact: true }).setInputFiles(sample("three-chord-smoothing-d.mid"));
      // Group 1: the ballad; group 2: free practice.
      await groups.getByLabel("Group 1: exercise").selectOption({ label: "Sunday ballad in A♭" });
      await groups.getByLabel("Group 1: files").setInputFiles(sample("sunday-ballad-ab.mid"));
      await groups.getByLabel("Group 2: exercise").selectOption({ label: "Free practice (no exercise)" });
      await groups.getByLabel("Group 2: files").setInputFiles(sample("minor-colour-g.mid"));
      await documentFits(page);
      mkdirSync(SCREENS, { recursive: true });
      await page.screenshot({ path: `${SCREENS}/upload-groups-form-${size.name}.png`, fullPage: true });

      await page.getByRole("button", { name: "Upload" }).click();
      const rows = page.getByTestId("upload-row");
      await expect(rows).toHaveCount(3);
      await expect(rows.filter({ hasText: "Analysed" })).toHaveCount(3);
      // Each take fits the exercise it was filed under: no warning.
      await expect(page.getByTestId("fit-notice")).toHaveCount(0);
      await documentFits(page);
      await page.screenshot({ path: `${SCREENS}/upload-groups-results-${size.name}.png`, fullPage: true });

      // Each take's page names where it was filed.
      const filed = [
        ["three-chord-smoothing-d.mid", "Three-chord smoothing in D"],
        ["sunday-ballad-ab.mid", "Sunday ballad in A♭"],
        ["minor-colour-g.mid", "Free practice take"],
      ] as const;
      const links: string[] = [];
      for (const [file] of filed)
        links.push((await page.getByRole("link", { name: `Open take ${file}` }).getAttribute("href")) ?? "");
      for (const [i, [, title]] of filed.entries()) {
        await page.goto(links[i]);
        await expect(page.getByRole("heading", { level: 1 })).toHaveText(title);
      }
    });
  }
});

test.describe("with JavaScript", () => {
  const withScripts = [
    { ...SIZES[0], student: "yuki@tidewater.example" },
    { ...SIZES[1], student: "felix@tidewater.example" },
  ];
  for (const size of withScripts) {
    test(`each file's own choice files it under its exercise (${size.name})`, async ({ page }) => {
      test.setTimeout(120_000);
      await page.setViewportSize({ width: size.width, height: size.height });
      await signIn(page, size.student);
      await page.goto("/takes/new");
      // Scripts running: the upload button waits for files, and no groups are offered.
      await expect(page.getByRole("button", { name: /^Upload/ })).toBeDisabled();
      await expect(page.getByRole("group", { name: "Files for other exercises" })).toHaveCount(0);
      await page.getByLabel("Exercise", { exact: true }).selectOption({ label: "Three-chord smoothing in D" });
      await page
        .getByLabel("MIDI files", { exact: true })
        .setInputFiles([sample("three-chord-smoothing-d.mid"), sample("falling-bass-eb.mid")]);
      const rows = page.getByTestId("upload-row");
      await expect(rows).toHaveCount(2);
      await expect(rows.nth(0).getByRole("combobox")).toContainText("As above: Three-chord smoothing in D");
      await rows.nth(1).getByRole("combobox").selectOption({ label: "Falling bass in E♭" });
      await documentFits(page);
      await page.screenshot({ path: `${SCREENS}/upload-per-file-${size.name}.png`, fullPage: true });
      await page.getByRole("button", { name: "Upload 2 takes" }).click();
      await expect(rows.nth(0)).toHaveAttribute("data-stage", "analysed");
      await expect(rows.nth(1)).toHaveAttribute("data-stage", "analysed");
      await expect(page.getByTestId("fit-notice")).toHaveCount(0);

      const href = await page.getByRole("link", { name: "Open take falling-bass-eb.mid" }).getAttribute("href");
      await page.getByRole("link", { name: "Open take three-chord-smoothing-d.mid" }).click();
      await expect(page.getByRole("heading", { level: 1 })).toHaveText("Three-chord smoothing in D");
      await page.goto(href!);
      await expect(page.getByRole("heading", { level: 1 })).toHaveText("Falling bass in E♭");
    });
  }
});
