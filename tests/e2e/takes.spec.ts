import path from "node:path";
import { expect, signIn, test } from "./fixtures";

const sample = (name: string) => path.resolve("samples", name);

// The demo student's practice day: upload two takes, watch them finish, read one change by
// change and listen to it. The expected figures for clumsy-root-position-d.mid come from
// DOMAIN rule 7 by hand: D4 F♯4 A4 → G4 B4 D5 moves every voice 5 up (15 in all, the
// DOMAIN's own example), and the closest voicing of G from there is D4 G4 B4 (3).
test("a student uploads two takes, reads one change by change and plays it", async ({ page }) => {
  await signIn(page, "dara@tidewater.example");
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Upload" }).click();
  await expect(page.getByRole("heading", { name: "Upload takes" })).toBeVisible();
  // Once the page is interactive the upload button waits for files.
  const upload = page.getByRole("button", { name: /^Upload/ });
  await expect(upload).toBeDisabled();

  await page.getByLabel("MIDI files").setInputFiles([sample("clumsy-root-position-d.mid"), sample("three-chord-smoothing-d.mid")]);
  const rows = page.getByTestId("upload-row");
  await expect(rows).toHaveCount(2);
  await expect(rows.filter({ hasText: "Ready to upload" })).toHaveCount(2);
  await page.getByRole("button", { name: "Upload 2 takes" }).click();

  // Each file is its own request; both rows end analysed with their figures and a link.
  await expect(rows.nth(0)).toHaveAttribute("data-stage", "analysed");
  await expect(rows.nth(1)).toHaveAttribute("data-stage", "analysed");
  await expect(rows.nth(0)).toContainText("4 chords");
  await expect(page.getByText("All done.")).toBeVisible();

  await page.getByRole("link", { name: "Open take clumsy-root-position-d.mid" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Free practice take" })).toBeVisible();

  // The chord strip: D G A D, I IV V I in D.
  await expect(page.getByTestId("chord-symbol")).toHaveText(["D", "G", "A", "D"]);
  const strip = page.getByRole("list", { name: /^Chords, in D/ });
  await expect(strip).toContainText("IV");

  // The motion of each change, and the flagged change explained with its numbers.
  await expect(page.getByTestId("change-row")).toHaveCount(3);
  await expect(page.getByTestId("change-motion")).toHaveText(["15", "6", "21"]);
  const first = page.getByTestId("change-row").first();
  await expect(first).toContainText("D → G");
  await expect(first.getByTestId("flag-explanation")).toHaveText(
    "Whole hand jumpedBoth chords are in root position and every note jumped 5 semitones up; D–G–B would have moved 3, against 15 as played.",
  );

  // The first flagged change is selected; its smoothest voicing is drawn and playable.
  await expect(page.getByRole("heading", { name: "Change 1: D → G" })).toBeVisible();
  await expect(page.getByTestId("suggestion").first()).toContainText("Smoothest: D–G–B (D4 G4 B4), moves 3");

  // Keyboard: the arrow keys move through the changes from the piano roll.
  await page.getByRole("group", { name: /^Piano roll/ }).focus();
  await page.keyboard.press("ArrowRight");
  await expect(page.getByRole("heading", { name: "Change 2: G → A" })).toBeVisible();

  // Playback in the browser's own Web Audio.
  const play = page.getByRole("button", { name: "Play take" });
  await play.click();
  await expect(play).toHaveAttribute("aria-pressed", "true");
  await expect(page.getByTestId("playback-status")).toContainText("Playing the take");
  await page.getByRole("button", { name: "Stop" }).click();
  await expect(play).toHaveAttribute("aria-pressed", "false");
  await expect(page.getByTestId("playback-status")).not.toContainText("Playing");
});
