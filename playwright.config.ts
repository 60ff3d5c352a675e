import { defineConfig, devices } from "@playwright/test";

const port = Number(process.env.TEST_APP_PORT ?? 3100);
const baseURL = `http://127.0.0.1:${port}`;

// Debian's Chromium, never a downloaded browser; flags keep it off the closed network.
const chromium = {
  executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
  args: [
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
  ],
};

const HTTP = /http\.spec\.ts$/;
const FAULTS = /faults\.spec\.ts$/;

export default defineConfig({
  testDir: "./test/e2e",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  forbidOnly: !!process.env.CI,
  timeout: 30_000,
  expect: { timeout: 10_000 },
  outputDir: ".data/playwright",
  reporter: "list",
  use: {
    baseURL,
    trace: "retain-on-failure",
    launchOptions: chromium,
  },
  projects: [
    { name: "desktop", testIgnore: [HTTP, FAULTS], use: { ...devices["Desktop Chrome"], launchOptions: chromium } },
    { name: "phone", testIgnore: [HTTP, FAULTS], use: { ...devices["Pixel 7"], launchOptions: chromium } },
    // Answers read over HTTP (headers, cookies, refusals): no screen size to repeat them for.
    { name: "http", testMatch: HTTP, use: { ...devices["Desktop Chrome"], launchOptions: chromium } },
    // Stops and restarts MariaDB under the running app, so it comes after everything else.
    // Alone: `npx playwright test --project=faults --no-deps`.
    {
      name: "faults",
      testMatch: FAULTS,
      dependencies: ["desktop", "phone", "http"],
      use: { ...devices["Desktop Chrome"], launchOptions: chromium },
    },
  ],
  webServer: {
    // The app's own server (`next start` that writes the caller's address), through a script that
    // execs `node` (not `npm run`), so Playwright stops the server itself.
    command: `bash scripts/serve.sh -p ${port} -H 127.0.0.1`,
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: "pipe",
    stderr: "pipe",
  },
});
