import { readFileSync } from "node:fs";
import path from "node:path";
import { expect, signIn, test } from "./fixtures";

const sample = (name: string) => path.resolve("samples", name);

// The demo student's practice day: upload two takes, watch them finish, read one change by
// change and listen to it. The expected figures for clumsy-root-position-d.mid come from
// RULES.md rule 7 by hand: D4 F♯4 A4 → G4 B4 D5 moves every voice 5 up (15 in all, the
// RULES.md's own example), and the closest voicing of G from there is D4 G4 B4 (3).
test("a student uploads two takes, reads one change by change and plays it", async ({ page }) => {
  await signIn(page, "dara@tidewater.example");
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Upload" }).click();
  await expect(page.getByRole("heading", { name: "Upload takes" })).toBeVisible();
  // Once the page is interactive the upload button waits for files.
  const upload = page.getByRole("button", { name: /^Upload/ });
  await expect(upload).toBeDisabled();

  await page
    .getByLabel("MIDI files")
    .setInputFiles([sample("clumsy-root-position-d.mid"), sample("three-chord-smoothing-d.mid")]);
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

  // The chord lanes under the roll: D G A D, I IV V I in D.
  await expect(page.getByTestId("chord-symbol")).toHaveText(["D", "G", "A", "D"]);
  await expect(page.getByTestId("chord-roman")).toHaveText(["I", "IV", "V", "I"]);

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
  await expect(page.getByTestId("suggestion").first()).toContainText("Smoothest: D–G–B, moves 3");
  await expect(page.getByTestId("suggestion").first().getByRole("img")).toHaveAttribute(
    "aria-label",
    /D4 to D4 0, F♯4 to G4 \+1, A4 to B4 \+2/,
  );

  // Keyboard: the arrow keys move through the changes from the piano roll.
  await page.getByRole("group", { name: /^Piano roll/ }).focus();
  await page.keyboard.press("ArrowRight");
  await expect(page.getByRole("heading", { name: "Change 2: G → A" })).toBeVisible();
  // G → A already moves as little as it can (6): no suggestion is offered (RULES.md rule 8).
  await expect(page.getByTestId("suggestion")).toHaveCount(0);
  await page.keyboard.press("ArrowLeft");
  await expect(page.getByRole("heading", { name: "Change 1: D → G" })).toBeVisible();

  // Playback in the browser's own Web Audio.
  const play = page.getByRole("button", { name: "Play take" });
  await play.click();
  await expect(play).toHaveAttribute("aria-pressed", "true");
  await expect(page.getByTestId("playback-status")).toContainText("Playing the take");
  await page.getByRole("button", { name: "Stop" }).click();
  await expect(play).toHaveAttribute("aria-pressed", "false");
  await expect(page.getByTestId("playback-status")).not.toContainText("Playing");
  const smoother = page.getByRole("button", { name: "Hear the smoother path" });
  await smoother.click();
  await expect(smoother).toHaveAttribute("aria-pressed", "true");
  await expect(page.getByTestId("playback-status")).toContainText("Playing the smoother path");
  // A suggestion plays on its own and stops the path.
  await page.getByTestId("suggestion").first().getByRole("button", { name: "Play this" }).click();
  await expect(smoother).toHaveAttribute("aria-pressed", "false");
  await expect(page.getByTestId("playback-status")).toContainText("Playing smoothest voicing");
});

/** The browser reports the API's own refusals as failed loads; those are the answers under test. */
function allowRefusals(consoleErrors: string[], statuses: number[]) {
  const expected = consoleErrors.filter((e) => statuses.some((s) => e.includes(`status of ${s}`)));
  expect(expected).toHaveLength(statuses.length);
  const others = consoleErrors.filter((e) => !expected.includes(e));
  consoleErrors.length = 0;
  consoleErrors.push(...others);
}

test("files the server refuses or cannot analyse each get their own answer", async ({ page, consoleErrors }) => {
  await signIn(page, "dara@tidewater.example");
  await page.goto("/takes/new");
  await expect(page.getByRole("button", { name: /^Upload/ })).toBeDisabled();
  const truncated = readFileSync(sample("held-bass-d.mid")).subarray(0, 40);
  await page.getByLabel("MIDI files").setInputFiles([
    // Text renamed .mid: no "MThd" signature, so 415 and nothing stored (Standard MIDI File 1.0 header chunk).
    { name: "shopping-list.mid", mimeType: "audio/midi", buffer: Buffer.from("eggs, flour, milk\n") },
    // A real header cut short inside its first track: stored as a failed take (422).
    { name: "cut-short.mid", mimeType: "audio/midi", buffer: truncated },
    // Not a MIDI name at all: refused in the browser before sending.
    { name: "voice-memo.m4a", mimeType: "audio/mp4", buffer: Buffer.from("....") },
  ]);
  const rows = page.getByTestId("upload-row");
  await expect(rows.nth(2)).toHaveAttribute("data-stage", "refused");
  await expect(rows.nth(2)).toContainText("Only MIDI files");
  await page.getByRole("button", { name: "Upload 2 takes" }).click();
  await expect(rows.nth(0)).toHaveAttribute("data-stage", "refused");
  await expect(rows.nth(0)).toContainText("not a MIDI file");
  await expect(rows.nth(1)).toHaveAttribute("data-stage", "failed");
  allowRefusals(consoleErrors, [415, 422]);

  await rows.nth(1).getByRole("link", { name: "See the stored take" }).click();
  await expect(page.getByRole("heading", { name: "This take could not be analysed" })).toBeVisible();
  await expect(page.getByText("cut-short.mid")).toBeVisible();
  await expect(page.getByRole("link", { name: "Download MIDI" })).toHaveAttribute("href", /\/api\/takes\/.+\/file$/);
});

test("the same file twice links to the take uploaded before", async ({ page, consoleErrors }) => {
  await signIn(page, "dara@tidewater.example");
  await page.goto("/takes/new");
  const upload = page.getByRole("button", { name: /^Upload/ });
  await expect(upload).toBeDisabled();
  const rows = page.getByTestId("upload-row");
  await page.getByLabel("MIDI files").setInputFiles(sample("clumsy-top-line-d.mid"));
  await upload.click();
  await expect(rows.nth(0)).toHaveAttribute("data-stage", "analysed");
  // The second time the file is dropped on the drop zone instead of picked.
  const bytes = readFileSync(sample("clumsy-top-line-d.mid")).toString("base64");
  const dropped = await page.evaluateHandle((b64) => {
    const data = new DataTransfer();
    data.items.add(
      new File([Uint8Array.from(atob(b64), (c) => c.charCodeAt(0))], "clumsy-top-line-d.mid", { type: "audio/midi" }),
    );
    return data;
  }, bytes);
  await page.getByText("Choose MIDI files, or drop them here").dispatchEvent("drop", { dataTransfer: dropped });
  await expect(rows).toHaveCount(2);
  await page.getByRole("button", { name: "Upload" }).click();
  await expect(rows.nth(1)).toHaveAttribute("data-stage", "duplicate");
  allowRefusals(consoleErrors, [409]);
  const first = await rows
    .nth(0)
    .getByRole("link", { name: /Open take/ })
    .getAttribute("href");
  await expect(rows.nth(1).getByRole("link", { name: "Open the earlier take" })).toHaveAttribute("href", first!);
});

test("a student moves a take to an exercise, replaces it, then deletes it", async ({ page }) => {
  await signIn(page, "dara@tidewater.example");
  await page.goto("/takes/new");
  await expect(page.getByRole("button", { name: /^Upload/ })).toBeDisabled();
  await page.getByLabel("MIDI files").setInputFiles(sample("sunday-ballad-ab.mid"));
  await page.getByRole("button", { name: "Upload" }).click();
  await page.getByRole("link", { name: "Open take sunday-ballad-ab.mid" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Free practice take" })).toBeVisible();

  const move = page.getByRole("form", { name: "Move to another exercise" });
  await move
    .getByLabel("Exercise")
    .selectOption({ label: (await move.getByRole("option", { name: /Sunday ballad/ }).textContent())! });
  await move.getByRole("button", { name: "Move take" }).click();
  await expect(page.getByText("Take moved and graded against the exercise again.")).toBeVisible();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Sunday ballad");
  const accuracy = page.getByRole("definition").filter({ hasText: /^\d+%$/ });
  await expect(page.getByLabel("Take summary").getByText("Exercise accuracy")).toBeVisible();
  await expect(accuracy.first()).toBeVisible();
  await expect(page.getByRole("heading", { level: 3, name: "Against the exercise: vi IV I V" })).toBeVisible();
  const before = page.url();

  // Replacing keeps the take (its page, exercise, comments and review) and swaps the recording.
  const replace = page.getByRole("form", { name: "Replace with a new recording" });
  await replace.getByLabel("New MIDI file").setInputFiles(sample("held-bass-d.mid"));
  await replace.getByRole("button", { name: "Replace take" }).click();
  await expect(page.getByText("Take replaced and analysed.")).toBeVisible();
  expect(page.url()).toBe(before);
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Sunday ballad");
  const takeId = new URL(before).pathname.split("/").pop();
  const replaced = await page.request.get(`/api/takes/${takeId}`);
  expect((await replaced.json()).originalName).toBe("held-bass-d.mid");
  // A take in D filed under an exercise in A♭ is told so plainly, before any figure.
  await expect(page.getByTestId("next-step")).toContainText("This sounds like D major; the exercise is in A♭ major");

  const remove = page.getByRole("form", { name: "Delete this take" });
  await remove.getByRole("button", { name: "Delete take" }).click();
  // The confirmation box is required: nothing happens until it is ticked.
  await expect(page).toHaveURL(/\/takes\//);
  await remove.getByLabel("Yes, delete this take and its file").check();
  await remove.getByRole("button", { name: "Delete take" }).click();
  await expect(page).toHaveURL(/\/home$/);
  await expect(page.getByText("Take deleted, with its file.")).toBeVisible();
});

test("the student home: due exercises, a sortable takes table and the weekly chart", async ({ page }) => {
  await signIn(page, "dara@tidewater.example");
  await expect(page.getByRole("heading", { name: "Due exercises" })).toBeVisible();
  // Exercises with a take in every key are folded under "Done"; the others offer to send one.
  const doneList = page.locator("summary", { hasText: /^Done \(\d+\)$/ });
  if (await doneList.count()) await doneList.click();
  const item = page.getByTestId("home-exercise").filter({ hasText: "Three-chord smoothing in D" });
  const state = (await item.getByTestId("exercise-state").innerText()).trim();
  if (state === "Done") await expect(item.getByRole("link", { name: /Send a take/ })).toHaveCount(0);
  else
    await expect(item.getByRole("link", { name: /Send a take of Three-chord smoothing in D/ })).toHaveAttribute(
      "href",
      /exercise=.+&key=D$/,
    );

  // The list is sorted on the server: each header is a link to the order it names.
  const table = page.getByRole("table", { name: /Your takes/ });
  const scoreHeader = table.getByRole("columnheader", { name: "Score" });
  await scoreHeader.getByRole("link").click();
  await expect(page).toHaveURL(/sort=score&dir=desc/);
  await expect(scoreHeader).toHaveAttribute("aria-sort", "descending");
  const scores = async () =>
    (await table.getByTestId("take-row").locator("td:last-child").allTextContents())
      .map(Number)
      .filter((n) => !Number.isNaN(n));
  const first = await scores();
  expect(first.length).toBeGreaterThan(1);
  expect(first).toEqual([...first].sort((a, b) => b - a));
  // Keyboard: the header is a link, so Enter sorts the other way.
  await scoreHeader.getByRole("link").focus();
  await page.keyboard.press("Enter");
  await expect(scoreHeader).toHaveAttribute("aria-sort", "ascending");
  const second = await scores();
  expect(second).toEqual([...second].sort((a, b) => a - b));

  await expect(page.locator(".recharts-surface").first()).toBeVisible();
  await expect(page.getByRole("img", { name: /Chart of smoothness and score by week/ })).toBeVisible();
  await page.getByText("Show the figures as a table").click();
  await expect(page.getByRole("table", { name: "Smoothness and score by week" })).toBeVisible();
  await expect(page.getByRole("complementary", { name: "Looking after your hands" })).toBeVisible();
});

test.describe("without JavaScript", () => {
  test.use({ javaScriptEnabled: false });

  test("the upload form posts several files to the page and lists each result", async ({ page }) => {
    await signIn(page, "dara@tidewater.example");
    await page.goto("/takes/new");
    await page.getByLabel("MIDI files").setInputFiles([sample("falling-bass-eb.mid"), sample("minor-colour-g.mid")]);
    await page.getByRole("button", { name: "Upload" }).click();
    const rows = page.getByTestId("upload-row");
    await expect(rows).toHaveCount(2);
    await expect(rows.nth(0)).toHaveAttribute("data-stage", "analysed");
    await expect(rows.nth(1)).toHaveAttribute("data-stage", "analysed");
    await expect(rows.nth(0)).toContainText("falling-bass-eb.mid");
    await expect(rows.nth(0).getByRole("link", { name: /Open take/ })).toHaveAttribute("href", /^\/takes\/.+/);
  });

  test("the home page's takes and the teacher's week arrive whole, and the takes sort by plain links", async ({
    page,
  }) => {
    await signIn(page, "dara@tidewater.example");
    await page.goto("/home");
    // The parts whose code loads on its own are in the page as the server sent it, not a fallback.
    await expect(page.getByRole("heading", { name: "Week by week" })).toBeVisible();
    await expect(page.getByText("Loading the chart")).toHaveCount(0);
    const table = page.getByRole("table", { name: /Your takes/ });
    const rows = table.getByTestId("take-row");
    expect(await rows.count()).toBeGreaterThan(1);
    const scoreHeader = table.getByRole("columnheader", { name: "Score" });
    await scoreHeader.getByRole("link").click();
    await expect(page).toHaveURL(/\/home\?sort=score&dir=desc#takes$/);
    await expect(scoreHeader).toHaveAttribute("aria-sort", "descending");
    const scores = (await rows.locator("td:last-child").allTextContents()).map(Number).filter((n) => !Number.isNaN(n));
    expect(scores).toEqual([...scores].sort((a, b) => b - a));
    await page.getByRole("button", { name: "Sign out" }).click();

    await signIn(page, "ines@tidewater.example");
    await page.goto("/home");
    await expect(page.getByText("Loading your studio's week")).toHaveCount(0);
    await expect(page.getByTestId("not-practised")).toBeVisible();
  });
});

test("a teacher reads a student's take without the student's controls; another student is refused", async ({
  page,
  consoleErrors,
}) => {
  await signIn(page, "dara@tidewater.example");
  const href = await page
    .getByRole("table", { name: /Your takes/ })
    .getByTestId("take-row")
    .getByRole("link")
    .first()
    .getAttribute("href");
  expect(href).toMatch(/^\/takes\/.+/);
  await page.getByRole("button", { name: "Sign out" }).click();

  await signIn(page, "ines@tidewater.example");
  await page.goto(href!);
  await expect(page.getByText(/^Dara Okafor · recorded/)).toBeVisible();
  await expect(page.getByTestId("chord-symbol").first()).toBeVisible();
  await expect(page.getByRole("link", { name: "Download MIDI" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Manage this take" })).toHaveCount(0);
  await page.getByRole("button", { name: "Sign out" }).click();

  await signIn(page, "felix@tidewater.example");
  const response = await page.goto(href!);
  expect(response?.status()).toBe(403);
  await expect(page.getByRole("heading", { name: "Not yours to see" })).toBeVisible();
  allowRefusals(consoleErrors, [403]);
});
