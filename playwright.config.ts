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
    // Every spec passes alone and in any order (each makes the pours it stresses, signs or releases;
    // see DEVELOPERS.md). The order here is for the pictures: the README's tour runs first, so its
    // screenshots show the demo job as seeded, before other specs add their own pours.
    { name: "tour", testMatch: /demo-tour\.spec\.ts/, use: { viewport: { width: 1280, height: 800 }, hasTouch: true } },
    {
      name: "tablet",
      testIgnore: [/demo-tour\.spec\.ts/, /field-update\.spec\.ts/],
      dependencies: ["tour"],
      use: { viewport: { width: 1280, height: 800 }, hasTouch: true },
    },
    // Last: it deploys a next build of the offline worker into public/ and puts it back, which no
    // other spec must see. Alone: `playwright test tests/e2e/field-update.spec.ts --no-deps`.
    {
      name: "update",
      testMatch: /field-update\.spec\.ts/,
      dependencies: ["tablet"],
      use: { viewport: { width: 1280, height: 800 }, hasTouch: true },
    },
  ],
});
