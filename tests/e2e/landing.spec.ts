import { expect, test } from "./fixtures";

test("the landing page says what Nearnote does, with its own font and no console errors", async ({ page }) => {
  const fontResponses: string[] = [];
  const foreign: string[] = [];
  page.on("response", (r) => {
    if (/\.woff2?$/.test(new URL(r.url()).pathname) && r.ok()) fontResponses.push(r.url());
  });
  page.on("request", (r) => {
    if (!r.url().startsWith("http://127.0.0.1:") && !r.url().startsWith("data:")) foreign.push(r.url());
  });
  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Nearnote listens in between");
  await expect(page.getByRole("link", { name: "Sign in" }).first()).toBeVisible();
  await page.evaluate(() => document.fonts.ready);
  expect(await page.evaluate(() => document.fonts.check('16px "IBM Plex Sans"'))).toBe(true);
  await expect.poll(() => fontResponses.length).toBeGreaterThan(0);
  expect(fontResponses.every((u) => u.startsWith("http://127.0.0.1:"))).toBe(true);
  expect(foreign).toEqual([]);
});

test("an unknown address shows the friendly not-found page", async ({ page, consoleErrors }) => {
  const response = await page.goto("/no-such-page");
  expect(response?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Page not found" })).toBeVisible();
  // The browser reports the page's own 404 status; that one is expected here.
  expect(consoleErrors).toEqual([expect.stringContaining("404")]);
  consoleErrors.length = 0;
});

test("healthz reports the version, the database and the storage", async ({ request }) => {
  const r = await request.get("/healthz");
  expect(r.status()).toBe(200);
  expect(await r.json()).toMatchObject({ app: "nearnote", version: expect.any(String), database: "ok", storage: "ok" });
});
