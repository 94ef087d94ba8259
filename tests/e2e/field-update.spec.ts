import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { CONCRETE_GO_AHEAD, makeFieldPour, plan, shoot } from "./field-steps";
import { PEOPLE, signInWithPassword } from "./people";

/**
 * A new version of the field log reaching a tablet mid-shift. The next build is the one the app
 * runs with its build id changed, as `npm run build` writes it when the pages change: every page
 * the worker precaches gets a new revision, so the worker's script differs and the browser
 * installs it beside the running one. It must wait while a form is half-filled or a record is
 * waiting to be sent, and take over only when the crew says so.
 */

const SW = path.join("public", "sw.js");
const BUILD_ID = readFileSync(path.join(process.env.NEXT_DIST_DIR || ".next", "BUILD_ID"), "utf8").trim();
const NEXT_ID = `${BUILD_ID}-next`;

const prompt = (page: Page) => page.getByTestId("update-ready");

/** The revisions of the field-log page in the worker's precache. */
const precachedFieldRevisions = (page: Page) =>
  page.evaluate(async () => {
    const revisions: string[] = [];
    for (const name of await caches.keys()) {
      for (const request of await (await caches.open(name)).keys()) {
        const url = new URL(request.url);
        if (url.pathname === "/field" && url.searchParams.has("__WB_REVISION__"))
          revisions.push(url.searchParams.get("__WB_REVISION__")!);
      }
    }
    return revisions;
  });

test.describe.configure({ mode: "serial" });

let original: string;
test.beforeAll(() => {
  original = readFileSync(SW, "utf8");
  expect(original).toContain(`"${BUILD_ID}"`);
});
test.afterAll(() => {
  writeFileSync(SW, original);
});

test("an update waits for a dirty form and an unsent record, then takes over when the crew says so", async ({
  page,
  context,
}) => {
  test.setTimeout(120_000);
  const POUR = (await makeFieldPour("Update check", 3)).name;
  const p = await plan(POUR);
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home/);
  await page.goto("/field");
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
  expect(await precachedFieldRevisions(page)).toEqual([BUILD_ID]);
  await expect(prompt(page)).toHaveCount(0);

  await page.getByTestId("available-pour").filter({ hasText: POUR }).getByRole("button").click();
  const ready = page.getByTestId("ready-pour").filter({ hasText: POUR });
  await expect(ready.getByTestId("ready-offline")).toBeVisible();
  await ready.getByRole("link", { name: "Open tendon list" }).click();

  // Half-way through a reading when the next build is deployed.
  const t = p.tendons[0]!;
  await page.getByLabel("Find a tendon by tag").fill(t.tag);
  await page.getByTestId("tendon-row").filter({ hasText: t.tag }).click();
  await page.getByLabel(/Final gauge pressure/).fill(p.finalPsi);
  writeFileSync(SW, original.replaceAll(`"${BUILD_ID}"`, `"${NEXT_ID}"`));
  await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())!.update());

  await expect(prompt(page)).toContainText("A new version of the field log is ready.");
  await expect(prompt(page)).toContainText("once the form is saved or cleared and everything is sent");
  await expect(prompt(page).getByRole("button", { name: "Update now" })).toHaveCount(0);
  await shoot(page, "field-update-waiting-for-form-landscape");

  // Saved with no signal: the form is clean but the record waits in the outbox.
  await context.setOffline(true);
  await page.getByRole("radio", { name: /Set A/ }).check();
  await page.getByLabel(/Mark before/).fill("0");
  await page.getByLabel(/Mark after/).fill(t.after);
  await page.getByLabel(/Who confirmed the concrete on site/).fill(CONCRETE_GO_AHEAD);
  await page.getByRole("button", { name: "Save record" }).click();
  await expect(page.getByTestId("end-A").getByTestId("sync-state")).toHaveText("waiting to send");
  await expect(page.getByTestId("pending-count")).toContainText("1 record");
  await expect(prompt(page).getByRole("button", { name: "Update now" })).toHaveCount(0);
  expect(await precachedFieldRevisions(page)).toContain(BUILD_ID);

  // Sent: nothing holds the update back any more.
  await context.setOffline(false);
  await page.getByRole("button", { name: "Sync now" }).click();
  await expect(page.getByTestId("pending-count")).toContainText("0 records", { timeout: 20_000 });
  await expect(page.getByTestId("saved-note")).toHaveText("Saved on this tablet and received by the server.");
  const update = prompt(page).getByRole("button", { name: "Update now" });
  await expect(update).toBeVisible();
  await shoot(page, "field-update-ready-landscape");

  // The new worker takes over and the page reloads onto it, keeping what was logged.
  await Promise.all([page.waitForEvent("load"), update.click()]);
  await expect(prompt(page)).toHaveCount(0);
  await expect.poll(() => precachedFieldRevisions(page)).toEqual([NEXT_ID]);
  expect(await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())!.waiting)).toBeNull();
  await page.getByLabel("Find a tendon by tag").fill(t.tag);
  // Stressed, with the server's verdict, which may add flags of its own (here the unconfirmed concrete).
  const row = page.getByTestId("tendon-row").filter({ hasText: t.tag });
  await expect(row.locator("[data-state]")).toHaveText(/^(done|flagged)$/);
  await row.click();
  await expect(page.getByTestId("end-A").getByTestId("sync-state")).toHaveText("sent");
});
