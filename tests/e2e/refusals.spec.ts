import { expect, signIn, test } from "./fixtures";

/** The browser reports the page's own refusal status; that one is expected here, nothing else. */
function allowOwnStatus(consoleErrors: string[], status: number) {
  expect(consoleErrors).toEqual([expect.stringContaining(`status of ${status}`)]);
  consoleErrors.length = 0;
}

test("a student who opens the board is refused and still shown as signed in", async ({ page, consoleErrors }) => {
  await signIn(page, "dara@tidewater.example");
  // A full page load, as from a bookmark or a typed address.
  const response = await page.goto("/board");
  expect(response?.status()).toBe(403);
  await expect(page.getByRole("heading", { name: "Not yours to see" })).toBeVisible();
  await expect(page.getByText("Only the studio's teachers can open this.")).toBeVisible();
  const nav = page.getByRole("navigation", { name: "Main" });
  await expect(nav.getByText("Dara Okafor · Tidewater Keys").first()).toBeVisible();
  await expect(nav.getByRole("button", { name: "Sign out" }).first()).toBeVisible();
  await expect(nav.getByRole("link", { name: "Sign in" })).toHaveCount(0);
  await expect(nav.getByRole("link", { name: "Board" })).toHaveCount(0);
  // The student's own navigation leads on from the refusal.
  await nav.getByRole("link", { name: "Practice" }).first().click();
  await expect(page.getByRole("heading", { name: "Hello, Dara" })).toBeVisible();
  await expect(nav.getByText("Dara Okafor · Tidewater Keys").first()).toBeVisible();
  allowOwnStatus(consoleErrors, 403);
});

test("a teacher who opens the upload page is refused and still shown as signed in", async ({ page, consoleErrors }) => {
  await signIn(page, "ines@tidewater.example");
  const response = await page.goto("/takes/new");
  expect(response?.status()).toBe(403);
  await expect(page.getByText("This page is for students.")).toBeVisible();
  const nav = page.getByRole("navigation", { name: "Main" });
  await expect(nav.getByText("Ines Marlowe · Tidewater Keys").first()).toBeVisible();
  await expect(nav.getByRole("link", { name: "Sign in" })).toHaveCount(0);
  await nav.getByRole("link", { name: "Board" }).first().click();
  await expect(page).toHaveURL(/\/board$/);
  await expect(nav.getByText("Ines Marlowe · Tidewater Keys").first()).toBeVisible();
  allowOwnStatus(consoleErrors, 403);
});
