import { writeMidi, type MidiData, type MidiEvent } from "midi-file";
import AxeBuilder from "@axe-core/playwright";
import type { Page } from "@playwright/test";
import { expect, signIn, test } from "./fixtures";

/** Pages of extra browser contexts report console errors to the fixture like the default page does. */
function watch(page: Page, errors: string[]) {
  page.on("console", (m) => {
    if (m.type() === "error") errors.push(m.text());
  });
  page.on("pageerror", (e) => errors.push(e.message));
}

/**
 * A take in root position all the way, D G A D, written with `midi-file` (npm): D4 F#4 A4 to
 * G4 B4 D5 moves every voice 5 up, a root-position leap by RULES.md rule 9. The velocity is
 * varied so the file is new to the server on every run.
 */
function blockChordTake(): Buffer {
  const velocity = 60 + (Date.now() % 40);
  const chords = [
    [62, 66, 69],
    [67, 71, 74],
    [69, 73, 76],
    [62, 66, 69],
  ];
  const events: MidiEvent[] = [];
  for (const chord of chords) {
    chord.forEach((n, i) =>
      events.push({ deltaTime: i === 0 ? 40 : 0, type: "noteOn", channel: 0, noteNumber: n, velocity } as MidiEvent),
    );
    chord.forEach((n, i) =>
      events.push({
        deltaTime: i === 0 ? 440 : 0,
        type: "noteOff",
        channel: 0,
        noteNumber: n,
        velocity: 0,
      } as MidiEvent),
    );
  }
  events.push({ deltaTime: 0, type: "endOfTrack", meta: true } as MidiEvent);
  const data = { header: { format: 0, numTracks: 1, ticksPerBeat: 480 }, tracks: [events] } as MidiData;
  return Buffer.from(writeMidi(data));
}

test("the teacher sets an exercise, the student sends a take, the teacher comments on a flagged change, the student reads it there", async ({
  browser,
  consoleErrors,
}) => {
  // Two people, two sign-ins and an upload on a shared two-core machine: more than the default minute.
  test.setTimeout(180_000);
  const title = `Block chords in D ${Date.now() % 100000}`;

  // The teacher sets the exercise; the progression is expanded live as it is typed.
  const teacherContext = await browser.newContext();
  const teacher = await teacherContext.newPage();
  watch(teacher, consoleErrors);
  await signIn(teacher, "ines@tidewater.example");
  await teacher.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Exercises" }).click();
  await teacher.getByRole("link", { name: "New exercise" }).click();
  await teacher.getByLabel("Title").fill(title);
  await teacher.getByLabel("Key or keys").fill("D");
  const progression = teacher.getByLabel("Target progression");
  await progression.fill("I IV Q V");
  await expect(teacher.getByTestId("progression-error")).toContainText('Token 3 "Q"');
  await progression.fill("I IV V I");
  await expect(teacher.getByTestId("progression-preview")).toContainText("DI");
  await expect(teacher.getByTestId("progression-preview").locator("li")).toHaveText(["DI", "GIV", "AV", "DI"]);
  await teacher.getByLabel(/^Inversions/).check();
  await teacher.getByRole("button", { name: "Set exercise" }).click();
  await expect(teacher.getByRole("heading", { level: 1, name: title })).toBeVisible();
  await expect(teacher.getByTestId("model-path").locator("li")).toHaveCount(4);
  const exerciseUrl = teacher.url();

  // The student finds it and sends a take for it in D.
  const studentContext = await browser.newContext();
  const student = await studentContext.newPage();
  watch(student, consoleErrors);
  await signIn(student, "dara@tidewater.example");
  await student.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Exercises" }).click();
  await student.getByRole("link", { name: title, exact: true }).click();
  await student.getByRole("link", { name: "Upload or record in D" }).click();
  await student
    .getByLabel("MIDI files")
    .setInputFiles({ name: "block-chords.mid", mimeType: "audio/midi", buffer: blockChordTake() });
  await student.getByRole("button", { name: /^Upload/ }).click();
  await expect(student.getByTestId("upload-row").first()).toHaveAttribute("data-stage", "analysed");

  // The teacher opens the take from the exercise and pins a comment to the flagged change.
  await teacher.goto(exerciseUrl);
  await teacher
    .getByRole("row", { name: /Dara Okafor/ })
    .getByRole("link", { name: /latest/ })
    .click();
  await expect(teacher.getByRole("heading", { level: 1, name: title })).toBeVisible();
  await expect(teacher.getByTestId("grading-accuracy")).toHaveText("100%");
  await expect(teacher.getByRole("heading", { name: "Change 1: D → G" })).toBeVisible();
  await teacher.getByLabel("Comment on change 1").fill("Keep D on top and move only two fingers here.");
  await teacher.getByRole("button", { name: "Pin comment here" }).click();
  await expect(teacher.getByTestId("change-comments").getByTestId("comment")).toContainText("Keep D on top");

  // The teacher asked for that jump after all: marked intended, it leaves the score.
  const flags = teacher.locator("section", { has: teacher.getByRole("heading", { name: "Flags", exact: true }) });
  await flags.getByPlaceholder(/^Why/).first().fill("I asked for one block jump here.");
  await flags.getByRole("button", { name: "I asked for this" }).first().click();
  await expect(flags.getByTestId("intended-reason")).toContainText("I asked for one block jump here.");
  await expect(flags.getByTestId("intended-score")).toContainText("with the intended flags left out");

  // Reviewed is a button of its own, with undo.
  await teacher.getByRole("button", { name: "Mark reviewed" }).click();
  await expect(teacher.getByTestId("review-state")).toContainText("Reviewed");
  await teacher.getByRole("button", { name: "Undo" }).click();
  await expect(teacher.getByRole("button", { name: "Mark reviewed" })).toBeVisible();

  // The student sees new feedback at home and reads it at that change.
  await student.goto("/home");
  const unread = student.getByTestId("unread-feedback");
  await expect(unread).toContainText("Keep D on top");
  await unread.getByRole("link", { name: new RegExp(title) }).click();
  await expect(student.getByRole("heading", { name: "Change 1: D → G" })).toBeVisible();
  const here = student.getByRole("region", { name: "Comments on change 1" });
  await expect(here.getByTestId("comment")).toContainText("Ines Marlowe");
  await expect(here.getByTestId("comment")).toContainText("Keep D on top and move only two fingers here.");

  // And replies there.
  await here.getByText("Reply", { exact: true }).click();
  await here.getByLabel("Your reply").fill("Thanks, trying it now.");
  await here.getByRole("button", { name: "Post reply" }).click();
  await expect(student.getByRole("region", { name: "Comments on change 1" }).getByTestId("comment")).toHaveCount(2);

  await teacherContext.close();
  await studentContext.close();
});

// axe-core (Deque's rules engine, WCAG 2.x A/AA tags) on the teacher's exercise pages and the
// review queue; serious and critical violations fail.
test("the teacher's exercise pages and review queue pass axe", async ({ page }) => {
  test.setTimeout(120_000);
  const check = async (label: string) => {
    const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
    const serious = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
    expect(
      serious.map(
        (v) =>
          `${label}: ${v.id} ${v.help} → ${v.nodes
            .map((n) => n.target.join(" "))
            .slice(0, 3)
            .join(", ")}`,
      ),
    ).toEqual([]);
  };
  await signIn(page, "ines@tidewater.example");
  await page.goto("/exercises");
  await expect(page.getByRole("heading", { level: 1, name: "Exercises" })).toBeVisible();
  await check("exercises");
  await page.goto("/exercises/new");
  await page.getByLabel("Key or keys").fill("Ab");
  await page.getByLabel("Target progression").fill("vi IV I V");
  await expect(page.getByTestId("progression-preview")).toBeVisible();
  await check("new exercise");
  await page.goto("/exercises");
  await page.getByRole("link", { name: "Falling bass in E♭" }).click();
  await expect(page.getByTestId("model-path")).toBeVisible();
  await check("exercise, teacher");
  await page.goto("/review");
  await expect(page.getByTestId("review-queue")).toBeVisible();
  await check("review");
});
