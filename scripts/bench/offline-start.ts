/**
 * Offline start: how long from navigation to a usable record form (the pour's tendon list drawn
 * from the tablet's database, a tendon chosen, "Save record" on screen), with the offline worker
 * installed, once with the network cut and once online, alternating, in one run of Chromium.
 * Uses the demo job (crew@demo.tautline.test, pour "L3 Pour 1"), which `npm run bench` seeds.
 * Starts the app on BENCH_PORT (default 3390) against DATABASE_URL.
 */
import { chromium, type Page } from "@playwright/test";
import { contextWithSession, percentile, report, signIn, startApp, waitForUrl } from "./harness";

const PORT = Number(process.env.BENCH_PORT ?? 3390);
const BASE = `http://localhost:${PORT}`;
const POUR = "L3 Pour 1";
const ROUNDS = 6;

async function openForm(page: Page, url: string): Promise<number> {
  const started = performance.now();
  await page.goto(url, { waitUntil: "commit" });
  const row = page.getByTestId("tendon-row").first();
  await row.waitFor({ state: "visible", timeout: 30_000 });
  await row.click();
  await page.getByRole("button", { name: "Save record" }).waitFor({ state: "visible", timeout: 30_000 });
  return performance.now() - started;
}

const stop = startApp(PORT, {});
const browser = await chromium.launch({ executablePath: "/usr/bin/chromium" });
try {
  await waitForUrl(`${BASE}/api/health`);
  const cookie = await signIn(BASE, "crew@demo.tautline.test", "tautline-demo");
  const context = await contextWithSession(browser, BASE, cookie);
  const page = await context.newPage();
  await page.goto(`${BASE}/field`);
  await page.evaluate(() => navigator.serviceWorker.ready);
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 30_000 });
  await page.getByTestId("available-pour").filter({ hasText: POUR }).getByRole("button").click();
  const ready = page.getByTestId("ready-pour").filter({ hasText: POUR });
  await ready.getByTestId("ready-offline").waitFor({ timeout: 30_000 });
  await ready.getByRole("link", { name: "Open tendon list" }).click();
  await page.getByTestId("tendon-row").first().waitFor({ timeout: 30_000 });
  const formUrl = page.url();

  const online: number[] = [];
  const offline: number[] = [];
  // A first load of each kind warms the server and the worker's cache; not counted.
  await openForm(page, formUrl);
  for (let i = 0; i < ROUNDS; i++) {
    await context.setOffline(true);
    const cut = await openForm(page, formUrl);
    await context.setOffline(false);
    const up = await openForm(page, formUrl);
    if (i > 0) {
      offline.push(cut);
      online.push(up);
    }
  }
  report({
    figure: `offline start: navigation to a usable record form, network cut, median of ${offline.length}`,
    value: `${(percentile(offline, 50) / 1000).toFixed(2)} s (max ${(Math.max(...offline) / 1000).toFixed(2)} s)`,
    target: "",
    holds: null,
  });
  report({
    figure: `offline start: the same online, median of ${online.length}`,
    value: `${(percentile(online, 50) / 1000).toFixed(2)} s (max ${(Math.max(...online) / 1000).toFixed(2)} s)`,
    target: "",
    holds: null,
  });
} finally {
  await browser.close();
  await stop();
}
