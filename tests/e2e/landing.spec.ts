import { expect, test } from "@playwright/test";
import { screenshot, watchForeignRequests } from "./support";

test("the landing page says what Tautline is, loads only from this machine, and shows the caution", async ({
  page,
}) => {
  const foreign = watchForeignRequests(page);
  const requests: string[] = [];
  page.on("request", (r) => requests.push(r.url()));

  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Every tendon");
  await expect(page.getByText("stressing log for post-tensioned concrete")).toBeVisible();
  await expect(page.getByRole("note", { name: "Caution" })).toContainText("engineer of record");
  await page.waitForLoadState("networkidle");

  // The shipped typeface must come from the app itself.
  const fontsLoaded = await page.evaluate(async () => {
    await document.fonts.ready;
    return [...document.fonts].filter((f) => f.status === "loaded").length;
  });
  expect(fontsLoaded).toBeGreaterThan(0);
  expect(requests.some((u) => u.endsWith(".woff2"))).toBe(true);
  expect(foreign).toEqual([]);

  await screenshot(page, "landing-tablet-landscape");
  await page.setViewportSize({ width: 800, height: 1280 });
  await screenshot(page, "landing-tablet-portrait");
});

test("health answers JSON with the database up", async ({ request }) => {
  const response = await request.get("/api/health");
  expect(response.status()).toBe(200);
  expect(response.headers()["content-type"]).toContain("application/json");
  const body = await response.json();
  expect(body).toMatchObject({ status: "ok", database: { up: true } });
  expect(body.database.schemaVersion).toMatch(/^\d{4}-\d{2}-\d{2}T/);
});

test("an unknown address shows the written not-found page", async ({ page }) => {
  const response = await page.goto("/no-such-page");
  expect(response?.status()).toBe(404);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("There is nothing at this address.");
});
