import type { Page } from "@playwright/test";
import { expect, test } from "./fixtures";

/** Opens the newest caught message to `to` with this subject, through /dev/mail as a person would. */
async function openMail(page: Page, to: string, subject: RegExp) {
  const row = page.getByRole("row").filter({ hasText: to }).filter({ hasText: subject }).first();
  // Some mail leaves a moment after the page answered: look again until it is listed.
  await expect(async () => {
    await page.goto("/dev/mail");
    await expect(row).toBeVisible({ timeout: 1000 });
  }).toPass();
  await row.getByRole("link").click();
  await expect(page.getByRole("heading", { name: subject })).toBeVisible();
}

test("a teacher signs up, verifies, invites a student, and the student joins from the mailed link", async ({
  page,
  browser,
}) => {
  const run = Date.now().toString(36);
  const teacherEmail = `teacher-${run}@harbour.example`;
  const studentEmail = `student-${run}@harbour.example`;

  // The teacher starts a studio.
  await page.goto("/signup");
  await page.getByLabel("Your name").fill("Nell Arden");
  await page.getByLabel("E-mail").fill(teacherEmail);
  await page.getByLabel("Password", { exact: true }).fill("harbour-lights-1");
  await page.getByLabel("Studio name").fill("Harbour Lights");
  await page.getByRole("button", { name: "Create studio" }).click();
  // Nothing is created yet, and the page says the same whether or not the address is taken.
  await expect(page.getByRole("heading", { name: "Check your inbox" })).toBeVisible();
  await expect(page.getByText(teacherEmail)).toBeVisible();

  // The confirmation link from the caught mail creates the studio and signs the teacher in.
  await openMail(page, teacherEmail, /Confirm your e-mail address/);
  await page.getByRole("link", { name: /\/verify\?token=/ }).click();
  await page.waitForURL(/\/home$/);
  await expect(page.getByText("Your e-mail address is confirmed.")).toBeVisible();

  // The invitation.
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Students" }).click();
  await page.getByLabel("E-mail addresses").fill(studentEmail);
  await page.getByRole("button", { name: "Send invitations" }).click();
  await expect(page.getByText("1 invitation sent.")).toBeVisible();
  await expect(page.getByRole("table", { name: "Invitations not yet accepted" }).getByText(studentEmail)).toBeVisible();

  // The student, in their own browser, opens the link from the caught mail.
  const studentContext = await browser.newContext();
  const student = await studentContext.newPage();
  const studentErrors: string[] = [];
  student.on("console", (m) => {
    if (m.type() === "error") studentErrors.push(m.text());
  });
  await openMail(student, studentEmail, /invited you to Harbour Lights/);
  await student.getByRole("link", { name: /\/invite\// }).click();
  await expect(student.getByRole("heading", { name: "Join Harbour Lights" })).toBeVisible();
  await student.getByLabel("Your name").fill("Pip Lindqvist");
  await student.getByLabel("Choose a password").fill("practice-daily-9");
  await student.getByLabel("The same again").fill("practice-daily-9");
  await student.getByRole("button", { name: "Create my account" }).click();
  await student.waitForURL(/\/home$/);
  await expect(student.getByRole("heading", { name: "Hello, Pip" })).toBeVisible();
  await expect(student.getByText("Welcome to Harbour Lights.")).toBeVisible();
  await expect(student.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Students" })).toHaveCount(
    0,
  );

  // The same link does not work twice.
  await student.goBack();
  await student.reload();
  await expect(student.getByRole("heading", { name: "This invitation does not work" })).toBeVisible();
  expect(studentErrors.filter((e) => !e.includes("410"))).toEqual([]);
  await studentContext.close();

  // The teacher sees the new student on the roster.
  await page.reload();
  await expect(
    page
      .getByRole("table", { name: "Students of the studio" })
      .getByRole("cell", { name: "Pip Lindqvist", exact: true }),
  ).toBeVisible();
});

test("a signed-out visitor is sent to sign in and brought back", async ({ page }) => {
  await page.goto("/students");
  await page.waitForURL(/\/login\?redirectTo=%2Fstudents/);
  await page.getByLabel("E-mail").fill("ines@tidewater.example");
  await page.getByLabel("Password", { exact: true }).fill("tidewater-keys");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/students$/);
  await expect(page.getByRole("heading", { name: "Students", level: 1 })).toBeVisible();

  // Signing out ends the session: the roster is closed again.
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Sign in" })).toBeVisible();
  await page.goto("/students");
  await page.waitForURL(/\/login\?redirectTo=%2Fstudents/);
});
