import AxeBuilder from "@axe-core/playwright";
import type { Page } from "@playwright/test";
import { expect, signIn, test } from "./fixtures";

// Recording in the browser from a MIDI keyboard. Chromium's Web MIDI is replaced before the
// page loads by a scripted keyboard whose messages the test sends; the bytes follow the MIDI
// 1.0 specification (0x9n note-on, velocity 0 = note-off, 0x8n note-off, 0xBn 64 = sustain).

type Scripted = { at: number; data: number[] };

declare global {
  interface Window {
    __fakeMidi: {
      play: (events: Scripted[]) => Promise<void>;
      send: (data: number[]) => void;
      listening: () => boolean;
    };
  }
}

/** Runs in the page before any of its scripts: one fake input, driven by the test. */
function installFakeMidi(mode: string) {
  const nav = navigator as Navigator & { requestMIDIAccess?: unknown };
  if (mode === "missing") {
    delete (Navigator.prototype as { requestMIDIAccess?: unknown }).requestMIDIAccess;
    return;
  }
  // The permission is not granted yet, so the panel waits for "Connect keyboard".
  const query = navigator.permissions.query.bind(navigator.permissions);
  navigator.permissions.query = (d: PermissionDescriptor) =>
    d.name === ("midi" as PermissionName) ? Promise.resolve({ state: "prompt" } as PermissionStatus) : query(d);
  if (mode === "refused") {
    Object.defineProperty(nav, "requestMIDIAccess", {
      configurable: true,
      value: () => Promise.reject(new DOMException("Permission denied", "NotAllowedError")),
    });
    return;
  }
  const input = {
    id: "scripted-1",
    name: "Scripted keyboard",
    manufacturer: "Nearnote tests",
    type: "input",
    state: "connected",
    connection: "open",
    onmidimessage: null as null | ((e: { data: Uint8Array; timeStamp: number }) => void),
    addEventListener() {},
    removeEventListener() {},
  };
  const access = {
    inputs: new Map([[input.id, input]]),
    outputs: new Map(),
    sysexEnabled: false,
    onstatechange: null,
    addEventListener() {},
    removeEventListener() {},
  };
  Object.defineProperty(nav, "requestMIDIAccess", { configurable: true, value: () => Promise.resolve(access) });
  const deliver = (data: number[], timeStamp: number) =>
    input.onmidimessage?.({ data: new Uint8Array(data), timeStamp });
  window.__fakeMidi = {
    listening: () => input.onmidimessage !== null,
    send: (data) => deliver(data, performance.now()),
    // Each message is stamped with its scripted time (as a keyboard's driver stamps it), and
    // delivered once that time has come, so the take's timing is exactly the script's.
    play: async (events) => {
      const t0 = performance.now();
      for (const e of events) {
        const due = t0 + e.at;
        const wait = due - performance.now();
        if (wait > 0) await new Promise((r) => setTimeout(r, wait));
        deliver(e.data, due);
      }
    },
  };
}

/** A chord held `hold` ms from `at`: note-ons a few ms apart, as hands strike. */
function chord(at: number, pitches: number[], hold = 400, offWithVelocityZero = false): Scripted[] {
  const on = pitches.map((p, i) => ({ at: at + i * 5, data: [0x90, p, 80 + i * 5] }));
  const off = pitches.map((p) => ({ at: at + hold, data: offWithVelocityZero ? [0x90, p, 0] : [0x80, p, 64] }));
  return [...on, ...off];
}

const byTime = (a: Scripted, b: Scripted) => a.at - b.at;

async function openRecorder(page: Page) {
  await signIn(page, "dara@tidewater.example");
  await page.goto("/takes/new");
  await expect(page.getByRole("heading", { name: "Upload takes" })).toBeVisible();
  return page.getByTestId("record-panel");
}

test("a student records I IV V I in D, sees each change graded while playing, uploads once and finds the same on the take page", async ({
  page,
}) => {
  await page.addInitScript(installFakeMidi, "keyboard");
  const posts: string[] = [];
  page.on("request", (r) => {
    if (r.method() === "POST" && new URL(r.url()).pathname === "/api/takes") posts.push(r.url());
  });
  const panel = await openRecorder(page);
  await page.getByLabel("Exercise").selectOption({ label: "Three-chord smoothing in D" });
  await page.getByLabel("Key", { exact: true }).selectOption("D");

  await panel.getByRole("button", { name: "Connect keyboard" }).click();
  await expect(panel.getByRole("combobox", { name: "Keyboard" })).toHaveValue("scripted-1");
  await expect.poll(() => page.evaluate(() => window.__fakeMidi.listening())).toBe(true);

  // The drawn keyboard answers before any recording.
  await page.evaluate(() => window.__fakeMidi.send([0x90, 62, 90]));
  await expect(panel.getByTestId("live-keys")).toHaveAttribute("data-held", "62");
  await page.evaluate(() => window.__fakeMidi.send([0x90, 62, 0]));
  await expect(panel.getByTestId("live-keys")).toHaveAttribute("data-held", "");

  await panel.getByRole("button", { name: "Record" }).click();
  await expect(panel.getByTestId("record-status")).toContainText("Count-in");
  await expect(panel.getByTestId("record-status")).toContainText("Recording");

  // D4 F#4 A4 → D4 G4 B4 → C#4 E4 A4 (I, IV over D, V over C#), pedal on the first chord.
  await page.evaluate(
    (events) => window.__fakeMidi.play(events),
    [
      { at: 0, data: [0xb0, 64, 127] },
      ...chord(0, [62, 66, 69]),
      { at: 420, data: [0xb0, 64, 0] },
      ...chord(500, [62, 67, 71], 400, true),
      ...chord(1000, [61, 64, 69]),
    ].sort(byTime),
  );
  // Graded while the take is still running. Motions by RULES.md rule 7, by hand: D F# A → D G B
  // moves 0+1+2 = 3; D G B → C# E A moves 1+3+2 = 6; both already the smallest (rule 8).
  const symbols = panel.getByTestId("live-chord-symbol");
  await expect(symbols).toHaveText(["D", "G/D", "A/C♯"]);
  await expect(panel.getByTestId("live-chord").last()).toHaveAttribute("data-settled", "yes");
  const motions = panel.getByTestId("live-change-motion");
  await expect(motions).toHaveText([
    "moved 3 · best 3 · as smooth as it gets",
    "moved 6 · best 6 · as smooth as it gets",
  ]);
  await expect(panel.getByTestId("record-status")).toContainText("Recording");

  // Back to D, then a block leap up to G: every voice +5 in root position (RULES.md worked
  // example): motion 15, best 3, flagged.
  await page.evaluate(
    (events) => window.__fakeMidi.play(events),
    [...chord(0, [62, 66, 69]), ...chord(500, [67, 71, 74], 600)].sort(byTime),
  );
  await expect(symbols).toHaveText(["D", "G/D", "A/C♯", "D", "G"]);
  await expect(motions.last()).toHaveAttribute("data-motion", "15");
  await expect(motions.last()).toHaveAttribute("data-best", "3");
  await expect(panel.getByTestId("live-chord").last().getByTestId("live-flag")).toHaveText("Whole hand jumped");
  await expect(panel.getByTestId("record-status")).toContainText("Recording");
  await panel.screenshot({ path: "test-results/record-graded-live.png" });

  await panel.getByRole("button", { name: "Stop" }).click();
  await expect(panel.getByTestId("record-status")).toContainText("Recording finished");
  await expect(panel).toContainText(/recording-\d{4}-\d{2}-\d{2}-\d{4}\.mid/);
  await expect(motions.evaluateAll((els) => els.map((e) => e.getAttribute("data-motion")))).resolves.toEqual([
    "3",
    "6",
    "3",
    "15",
  ]);

  // axe-core (Deque's rules engine, WCAG 2.x A/AA): no serious or critical violation in the panel.
  const axe = await new AxeBuilder({ page })
    .include('[data-testid="record-panel"]')
    .withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"])
    .analyze();
  expect(axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => v.id)).toEqual([]);

  // Play it back in the browser, then stop.
  await panel.getByRole("button", { name: "Play back" }).click();
  await panel.getByRole("button", { name: "Stop playback" }).click();

  // Leaving by a link while the take is unsent asks first; staying keeps everything.
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Practice" }).click();
  const dialog = page.getByRole("alertdialog", { name: "This recording is not uploaded yet" });
  await expect(dialog).toBeVisible();
  await dialog.getByRole("button", { name: "Stay on this page" }).click();
  await expect(dialog).toBeHidden();
  await expect(page).toHaveURL(/\/takes\/new/);
  await expect(symbols).toHaveCount(5);

  // Upload: a double click still sends once; the row shows the result like a file upload.
  await panel.getByRole("button", { name: "Upload this take" }).dblclick();
  const row = panel.getByTestId("upload-row");
  await expect(row).toHaveAttribute("data-stage", "analysed");
  await expect(row).toContainText("5 chords");
  await expect(panel.getByRole("button", { name: "Uploaded" })).toBeDisabled();
  expect(posts).toHaveLength(1);

  // Sent: leaving no longer asks. The take page shows the same chords and motions.
  await row.getByRole("link", { name: /Open take/ }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Three-chord smoothing in D" })).toBeVisible();
  await expect(page.getByTestId("chord-symbol")).toHaveText(["D", "G/D", "A/C♯", "D", "G"]);
  await expect(page.getByTestId("change-motion")).toHaveText(["3", "6", "3", "15"]);
  await expect(page.getByTestId("change-row").last().getByTestId("flag-explanation")).toContainText(
    "Whole hand jumped",
  );
  await page.screenshot({ path: "test-results/record-take-page.png", fullPage: true });
});

test("a recording in progress asks before the tab is closed", async ({ page }) => {
  await page.addInitScript(installFakeMidi, "keyboard");
  const panel = await openRecorder(page);
  await panel.getByRole("button", { name: "Connect keyboard" }).click();
  await panel.getByLabel("Count in one bar").uncheck();
  await panel.getByRole("button", { name: "Record" }).click();
  await expect(panel.getByTestId("record-status")).toContainText("Recording");
  // The keyboard used is remembered for the next visit.
  expect(await page.evaluate(() => localStorage.getItem("nearnote.recorder.input"))).toBe(
    JSON.stringify({ id: "scripted-1", name: "Scripted keyboard" }),
  );
  await page.evaluate((events) => window.__fakeMidi.play(events), chord(0, [62, 66, 69], 300));
  await expect(panel.getByTestId("live-chord-symbol")).toHaveText(["D"]);
  await page.screenshot({ path: "test-results/record-live.png", fullPage: true });

  const asked = page.waitForEvent("dialog");
  await page.close({ runBeforeUnload: true });
  const dialog = await asked;
  expect(dialog.type()).toBe("beforeunload");
  await dialog.accept();
});

test("without Web MIDI the panel says so and file upload still works", async ({ page }) => {
  await page.addInitScript(installFakeMidi, "missing");
  const panel = await openRecorder(page);
  await expect(panel).toContainText("This browser cannot record from a MIDI keyboard.");
  await expect(panel).toContainText("From MIDI files");
  await expect(panel.getByRole("button", { name: "Record" })).toHaveCount(0);
  // The rest of the page is untouched: a file still goes in.
  await page.getByLabel("MIDI files").setInputFiles("samples/three-chord-smoothing-d.mid");
  await expect(page.getByTestId("upload-row").filter({ hasText: "Ready to upload" })).toHaveCount(1);
});

test("when MIDI access is refused the panel says so plainly, with no console error", async ({ page }) => {
  await page.addInitScript(installFakeMidi, "refused");
  const panel = await openRecorder(page);
  await panel.getByRole("button", { name: "Connect keyboard" }).click();
  await expect(panel.getByRole("alert")).toContainText("Access to MIDI devices was refused.");
  await expect(panel.getByRole("alert")).toContainText("site settings");
  await page.screenshot({ path: "test-results/record-refused.png", fullPage: true });
});

test("on an exercise page the panel records at the exercise's tempo and key, and the take joins the exercise", async ({
  page,
}) => {
  await page.addInitScript(installFakeMidi, "keyboard");
  await signIn(page, "dara@tidewater.example");
  await page.goto("/exercises");
  await page.getByRole("link", { name: "Three-chord smoothing in D" }).click();
  const panel = page.getByTestId("record-panel");
  await panel.getByRole("button", { name: "Connect keyboard" }).click();
  // The demo exercise is set at 72 bpm.
  await expect(panel.getByLabel("Tempo")).toHaveValue("72");
  await panel.getByLabel("Count in one bar").uncheck();
  await panel.getByLabel("Metronome while recording").check();
  await panel.getByRole("button", { name: "Record" }).click();
  await expect(panel.getByTestId("record-status")).toContainText("Recording");
  await page.evaluate(
    (events) => window.__fakeMidi.play(events),
    [
      ...chord(0, [62, 66, 69]),
      ...chord(500, [62, 67, 71]),
      ...chord(1000, [61, 64, 69]),
      ...chord(1500, [62, 66, 69]),
    ].sort(byTime),
  );
  await expect(panel.getByTestId("live-chord-symbol")).toHaveText(["D", "G/D", "A/C♯", "D"]);
  await panel.getByRole("button", { name: "Stop" }).click();
  await panel.getByRole("button", { name: "Upload this take" }).click();
  const row = panel.getByTestId("upload-row");
  await expect(row).toHaveAttribute("data-stage", "analysed");
  const href = await row.getByRole("link", { name: /Open take/ }).getAttribute("href");
  // The exercise's own table refreshes: its latest take is the one just recorded.
  await expect(page.getByRole("link", { name: /^latest/ })).toHaveAttribute("href", href!);
  await page.screenshot({ path: "test-results/record-exercise-page.png", fullPage: true });
  await page.goto(href!);
  await expect(page.getByRole("heading", { level: 1, name: "Three-chord smoothing in D" })).toBeVisible();
  await expect(page.getByTestId("chord-symbol")).toHaveText(["D", "G/D", "A/C♯", "D"]);
  await expect(page.getByTestId("change-motion")).toHaveText(["3", "6", "3"]);
});
