import { defineConfig } from "@playwright/test";

const PORT = Number(process.env.E2E_PORT ?? 3210);

export default defineConfig({
  testDir: "tests/e2e",
  outputDir: `test-results/${PORT}`,
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: process.env.CI ? [["list"]] : [["list"]],
  use: {
    baseURL: `http://127.0.0.1:${PORT}`,
    trace: "retain-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      // Chromium's own background traffic is refused on this network; keep it quiet.
      args: ["--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"],
    },
  },
  webServer: {
    command: `node_modules/.bin/tsx scripts/e2e-server.ts`,
    url: `http://127.0.0.1:${PORT}/healthz`,
    env: { PORT: String(PORT), E2E_MAIL_DIR: "" },
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: "pipe",
  },
});
