import { defineConfig } from "@playwright/test";

// The app is started by scripts/test.sh (built, on its own port, against a throwaway database);
// Playwright only drives Debian's Chromium against it. No browser is ever downloaded.
const baseURL = process.env.E2E_BASE_URL ?? "http://localhost:3100";

export default defineConfig({
  testDir: "tests/e2e",
  outputDir: ".tmp/playwright",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  reporter: [["list"]],
  use: {
    baseURL,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: [
        "--no-sandbox",
        "--headless",
        "--disable-gpu",
        "--disable-quic",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        "--no-first-run",
      ],
    },
  },
  projects: [
    // The README's tour runs first, on the demo job as seeded, before other specs add their own data.
    { name: "tour", testMatch: /demo-tour\.spec\.ts/, use: { viewport: { width: 1280, height: 800 }, hasTouch: true } },
    {
      name: "tablet",
      testIgnore: [/demo-tour\.spec\.ts/, /field-update\.spec\.ts/],
      dependencies: ["tour"],
      use: { viewport: { width: 1280, height: 800 }, hasTouch: true },
    },
    // Last, alone: it deploys a next build of the offline worker into public/ and puts it back.
    {
      name: "update",
      testMatch: /field-update\.spec\.ts/,
      dependencies: ["tablet"],
      use: { viewport: { width: 1280, height: 800 }, hasTouch: true },
    },
  ],
});
