import { expect, test } from "@playwright/test";
import pg from "pg";
import { STRESSING_SAFETY_CAUTION } from "@/lib/cautions";
import { CONCRETE_GO_AHEAD, logTendon, makeFieldPour, plan, shoot } from "./field-steps";
import { PEOPLE, signInWithPassword } from "./people";

/**
 * The crew's whole offline shift in Chromium: sign in, take a pour out, lose the signal, log
 * three tendons (one out of band), reload with no signal and find them, get the signal back,
 * watch them go, and check PostgreSQL holds each exactly once. Each test stresses a pour of its own.
 */

test("a crew logs a pour with no signal and every record reaches PostgreSQL exactly once", async ({
  page,
  context,
}) => {
  test.setTimeout(120_000);
  const pour = await makeFieldPour("Offline shift", 12);
  const POUR = pour.name;
  const p = await plan(POUR);

  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home/);
  await page.goto("/field");
  await expect(page.getByTestId("operator")).toContainText("Operator:");
  // The offline worker must control the page before the signal goes.
  await page.evaluate(() => navigator.serviceWorker.ready);
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);

  await page.getByTestId("available-pour").filter({ hasText: POUR }).getByRole("button").click();
  const ready = page.getByTestId("ready-pour").filter({ hasText: POUR });
  await expect(ready.getByTestId("ready-offline")).toBeVisible();
  await expect(ready.getByTestId("ready-counts")).toContainText(`${pour.count} tendons`);
  await expect(ready.getByTestId("ready-age")).toContainText("Data from");
  await shoot(page, "field-ready-offline-landscape");

  await context.setOffline(true);
  await ready.getByRole("link", { name: "Open tendon list" }).click();
  await expect(page.getByTestId("connection")).toHaveText("No signal");
  // The pour has no lab results yet: the tablet says so before the first pull.
  await expect(page.getByTestId("concrete-gate-field")).toContainText("Concrete not confirmed: do not stress");
  // Where the jack is pulled, the record form carries the stressing safety caution in the one wording.
  await page.getByTestId("tendon-row").filter({ hasText: p.tendons[0]!.tag }).click();
  await expect(
    page.getByRole("form", { name: "New record" }).getByRole("note", { name: "Safety caution" }),
  ).toContainText(STRESSING_SAFETY_CAUTION);
  for (const [i, t] of p.tendons.entries())
    await logTendon(page, t, p.finalPsi, i === 0 ? "field-form-offline-landscape" : undefined, i === 0);
  await expect(page.getByTestId("pending-count")).toContainText("3 records");
  await expect(page.getByRole("alert").filter({ hasText: "Out of band" })).toHaveCount(0); // the last one logged is in band
  await expect(page.getByTestId("pour-progress")).toContainText(`${pour.count} tendons · 3 stressed (1 flagged)`);
  await shoot(page, "field-log-offline-landscape");

  // Reload with no signal: the worker serves the page, the tablet database still has the records.
  await page.reload();
  await expect(page.getByTestId("pending-count")).toContainText("3 records");
  await page.getByLabel("Find a tendon by tag").fill(p.tendons[1]!.tag);
  await expect(
    page.getByTestId("tendon-row").filter({ hasText: p.tendons[1]!.tag }).locator("[data-state]"),
  ).toHaveText("flagged");
  await page.getByTestId("tendon-row").filter({ hasText: p.tendons[1]!.tag }).click();
  await expect(page.getByTestId("verdict")).toContainText("Long");
  await expect(page.getByTestId("judged-by")).toHaveText(/on this tablet until sent/i);
  await expect(page.getByRole("alert").filter({ hasText: "Out of band" })).toBeVisible();
  await page.getByLabel("Find a tendon by tag").fill("");
  for (const t of [p.tendons[0]!, p.tendons[2]!]) {
    await expect(page.getByTestId("tendon-row").filter({ hasText: t.tag }).locator("[data-state]")).toHaveText("done");
  }
  await shoot(page, "field-log-reloaded-offline-landscape");
  await page.setViewportSize({ width: 800, height: 1280 });
  await shoot(page, "field-log-offline-portrait");

  // Signal back: the records go, and the server's verdict comes back.
  await context.setOffline(false);
  await page.getByRole("button", { name: "Sync now" }).click();
  await expect(page.getByTestId("pending-count")).toContainText("0 records", { timeout: 20_000 });
  await expect(page.getByTestId("end-A").getByTestId("sync-state")).toHaveText("sent");
  await expect(page.getByTestId("server-verdict")).toContainText("Long");
  // Judged by the server now: the tablet no longer says the verdict is its own.
  await expect(page.getByTestId("judged-by")).toHaveText(/judged by the server/i);
  // The bar's count says what it counts: records the server refused, not flagged tendons.
  await expect(page.getByTestId("attention-count")).toContainText("Records the server refused");
  await expect(page.getByTestId("attention-count")).toContainText("0");
  await expect(page.getByTestId("last-sync")).not.toContainText("never");
  await shoot(page, "field-log-synced-portrait");
  await page.setViewportSize({ width: 1280, height: 800 });

  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    const { rows } = await client.query<{ tendon_id: string; n: number }>(
      "select tendon_id, count(*)::int as n from records where tendon_id = any($1::uuid[]) group by tendon_id",
      [p.tendons.map((t) => t.id)],
    );
    expect(rows.map((r) => r.n)).toEqual([1, 1, 1]);
    const ops = await client.query<{ n: number }>(
      "select count(*)::int as n from applied_ops where record_id in (select id from records where tendon_id = any($1::uuid[]))",
      [p.tendons.map((t) => t.id)],
    );
    expect(ops.rows[0]!.n).toBe(3);
    // The crew's reason to stress before the concrete was confirmed is kept on every record.
    const goAhead = await client.query<{ concrete_go_ahead: string | null }>(
      "select concrete_go_ahead from records where tendon_id = any($1::uuid[])",
      [p.tendons.map((t) => t.id)],
    );
    expect(goAhead.rows.map((r) => r.concrete_go_ahead)).toEqual([
      CONCRETE_GO_AHEAD,
      CONCRETE_GO_AHEAD,
      CONCRETE_GO_AHEAD,
    ]);
    // The gauge photo follows its record: uploaded, checked by content and stored once.
    await expect
      .poll(
        async () =>
          (
            await client.query<{ n: number }>(
              "select count(*)::int as n from attachments where purpose = 'record_photo' and status = 'stored' and sha256 is not null and record_id in (select id from records where tendon_id = $1)",
              [p.tendons[0]!.id],
            )
          ).rows[0]!.n,
        { timeout: 30_000 },
      )
      .toBe(1);
  } finally {
    await client.end();
  }
});

test("a tablet whose sign-in ran out keeps what it holds and sends it once the crew signs in again", async ({
  page,
  context,
}) => {
  test.setTimeout(120_000);
  const POUR = (await makeFieldPour("Signed out", 3)).name;
  const p = await plan(POUR);
  const t = p.tendons[0]!;

  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home/);
  await page.goto("/field");
  // As in the shift above: the offline worker controls the page before the signal goes (pages are
  // rendered per request for their CSP nonce, so the tendon list's code comes from the worker).
  await page.evaluate(() => navigator.serviceWorker.ready);
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
  await page.getByTestId("available-pour").filter({ hasText: POUR }).getByRole("button").click();
  const ready = page.getByTestId("ready-pour").filter({ hasText: POUR });
  await expect(ready.getByTestId("ready-offline")).toBeVisible();
  await ready.getByRole("link", { name: "Open tendon list" }).click();
  await context.setOffline(true);
  await logTendon(page, t, p.finalPsi);

  // The session ends while the tablet is out of signal; when the signal comes back the push is refused.
  await context.clearCookies();
  await context.setOffline(false);
  await page.getByRole("button", { name: "Sync now" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "You are signed out" })).toBeVisible();
  await expect(page.getByTestId("pending-count")).toContainText("1 record");
  await shoot(page, "field-signed-out");

  const count = async () => {
    const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
    await client.connect();
    try {
      return (await client.query<{ n: number }>("select count(*)::int as n from records where tendon_id = $1", [t.id]))
        .rows[0]!.n;
    } finally {
      await client.end();
    }
  };
  expect(await count()).toBe(0);

  // Signed in again, the tablet sends what it kept, once.
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home/);
  await page.goto("/field");
  await page.getByRole("button", { name: "Sync now" }).click();
  await expect(page.getByTestId("pending-count")).toContainText("0 records", { timeout: 20_000 });
  await expect.poll(count, { timeout: 10_000 }).toBe(1);
});
