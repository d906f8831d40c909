import { generateLongTake } from "../../scripts/lib/takeGenerator";
import { expect, signIn, test } from "./fixtures";

type Change = { from: number; to: number };
type Chord = { symbol: string | null };

// A ten-minute take's page carries only its first window of changes; jumping to the last
// change, and scrolling the roll to the end, fetch the windows that hold them.
test("the 10-minute take: jumping to its last change and scrolling the roll to the end show them", async ({
  page,
  baseURL,
}) => {
  test.setTimeout(180_000);
  await signIn(page, "dara@tidewater.example");
  const form = { file: { name: "long-10min.mid", mimeType: "audio/midi", buffer: Buffer.from(generateLongTake(10)) } };
  const up = await page.request.post("/api/takes", { multipart: form, headers: { Origin: baseURL! } });
  expect(up.status()).toBe(201);
  const { id } = (await up.json()) as { id: string };
  const { analysis } = (await (await page.request.get(`/api/takes/${id}`)).json()) as {
    analysis: { chords: Chord[]; changes: Change[] };
  };
  const count = analysis.changes.length;
  expect(count).toBeGreaterThan(200);

  await page.goto(`/takes/${id}`);
  await expect(page.getByRole("heading", { name: "Change by change" })).toBeVisible();
  // The page arrived without the last change.
  await expect(page.locator(`[data-change="${count - 1}"]`)).toHaveCount(0);

  // The roll scrolled to its end asks for the last window (the notes and chords drawn there).
  const lastWindow = Math.floor((count - 1) / 40) * 40;
  let fetched = false;
  page.on("response", (r) => {
    if (r.url().includes(`/api/takes/${id}/window?from=${lastWindow}&`) && r.status() === 200) fetched = true;
  });
  // A scroll made before the page's scripts have hydrated it is not heard: scroll again
  // (back, then to the end) until the window is asked for.
  await expect(async () => {
    await page.getByTestId("roll-scroller").evaluate(async (el) => {
      el.scrollTo({ left: 0 });
      await new Promise((r) => requestAnimationFrame(r));
      el.scrollTo({ left: el.scrollWidth });
    });
    await expect.poll(() => fetched, { timeout: 3_000 }).toBe(true);
  }).toPass({ timeout: 60_000 });

  // "Go to change N" shows its window: the row and the drawing of the last change appear.
  await page.getByLabel("Go to change").fill(String(count));
  await page.getByRole("button", { name: "Go", exact: true }).click();
  const row = page.locator(`[data-change="${count - 1}"]`);
  await expect(row).toHaveAttribute("aria-pressed", "true");
  const last = analysis.changes[count - 1];
  const title = page.getByRole("heading", { name: new RegExp(`^Change ${count}:`) });
  await expect(title).toBeVisible();
  // Its chord names (as the roll's lanes and the list print them) come from the fetched window.
  await expect(title).toContainText("→");
  await expect(title).not.toContainText("…");
  expect(analysis.chords[last.to]).toBeTruthy();
  await expect(row).toContainText(/moved|not graded/);
  await expect(row).not.toContainText("fetching");

  // Without scripts the same jump works through the page's own query.
  await page.goto(`/takes/${id}?change=${count}`);
  await expect(page.locator(`[data-change="${count - 1}"]`)).toHaveAttribute("aria-pressed", "true");
});
