import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";
import { makePourFixture, pushEndA, typedReading } from "./pour-fixture";

/**
 * The engineer's decision reaches the slab edge: a long tendon is held on the tablet with the
 * reason, listed first; the engineer orders a restress; after a sync the tablet shows the order in
 * words; the crew logs the restress, it comes back in band and the hold lifts. The pour is made
 * for this spec.
 */

const stamp = Date.now().toString(36);
const POUR = `Hold check ${stamp}`;

test("an engineer's restress order reaches the crew's tablet, the crew logs it and the tendon is no longer held", async ({
  browser,
}) => {
  test.setTimeout(120_000);
  const fx = await makePourFixture(POUR, [`HD-${stamp}-1`, `HD-${stamp}-2`]);
  const [clear, held] = fx.tendons as [(typeof fx.tendons)[number], (typeof fx.tendons)[number]];
  const crewApi = await apiAs(PEOPLE.crew);
  expect((await pushEndA(crewApi, fx, clear.id, 1.0)).result).toMatchObject({ status: "applied" });
  expect((await pushEndA(crewApi, fx, held.id, 1.15)).result).toMatchObject({ status: "applied" });
  const [flag] = await queryDemo<{ id: string }>("select id from flags where tendon_id = $1 and kind = 'out_of_band'", [
    held.id,
  ]);
  expect(flag).toBeTruthy();

  const ctx = await browser.newContext();
  const crew = await ctx.newPage();
  await signInWithPassword(crew, PEOPLE.crew);
  await crew.waitForURL(/\/home/);
  await crew.goto("/field");
  await crew.getByTestId("available-pour").filter({ hasText: POUR }).getByRole("button").click();
  await crew
    .getByTestId("ready-pour")
    .filter({ hasText: POUR })
    .getByRole("link", { name: "Open tendon list" })
    .click();

  // Held tendons come first in the list, with what holds them in words.
  const rows = crew.getByTestId("tendon-row");
  await expect(rows.first()).toContainText(held.tag);
  await expect(rows.first().getByTestId("hold-summary")).toHaveText("Held · waiting for the engineer");
  await expect(rows.filter({ hasText: clear.tag }).getByTestId("hold-summary")).toHaveCount(0);
  await rows.first().click();
  const panel = crew.getByTestId("hold-panel");
  await expect(panel).toContainText("Held: do not cut tails");
  await expect(panel.getByTestId("hold").filter({ hasText: "Out of band" }).getByTestId("hold-why")).toContainText(
    /long/i,
  );
  await expect(panel.getByTestId("hold-what-to-do")).toContainText("Wait for the engineer of record's decision");
  // The hold sits above the verdict, so the green or amber chip is never read alone.
  const holdBox = await panel.boundingBox();
  const verdictBox = await crew.getByTestId("verdict").boundingBox();
  expect(holdBox!.y).toBeLessThan(verdictBox!.y);
  await screenshot(crew, "field-hold-waiting");

  // The engineer orders a restress; the next sync brings the order down.
  const engineer = await apiAs(PEOPLE.engineer);
  const ordered = await engineer.post(`/api/projects/${fx.projectId}/flags/${flag!.id}/dispositions`, {
    data: {
      decision: "restress",
      reasons:
        "Long by about 15 %: check the wedges seated, restress to the same gauge pressure and re-read the marks.",
      licenceStatement: "Licensed professional engineer (test)",
    },
  });
  expect(ordered.status()).toBe(201);
  await crew.getByRole("button", { name: "Sync now" }).click();
  await expect(rows.first().getByTestId("hold-summary")).toHaveText("Held · restress ordered");
  await expect(panel.getByTestId("hold-instruction")).toContainText(
    "restress to the same gauge pressure and re-read the marks",
  );
  await expect(panel.getByTestId("hold-what-to-do")).toContainText("Restress this tendon as the engineer instructs");
  await screenshot(crew, "field-hold-restress-ordered");

  // The crew logs the restress on the tablet; it comes back in band and the hold lifts. The
  // project reads blind: the form still gives the target gauge pressure, only not the prediction.
  const reading = typedReading(fx, 1.0);
  await queryDemo("update projects set blind_entry = true where id = $1", [fx.projectId]);
  try {
    await crew.getByRole("button", { name: "Sync now" }).click();
    await crew.getByRole("button", { name: "Record a restress" }).click();
    await expect(crew.getByTestId("blind-note")).toBeVisible({ timeout: 15_000 });
    await crew.getByRole("radio", { name: /Set A/ }).check();
    await expect(crew.getByTestId("target-pressure")).toContainText(/\d,?\d{3} psi/);
    await expect(crew.getByTestId("target-pressure")).not.toContainText("Shown after saving");
    await screenshot(crew, "field-blind-entry-target");
  } finally {
    await queryDemo("update projects set blind_entry = false where id = $1", [fx.projectId]);
  }
  await crew.getByRole("button", { name: "Sync now" }).click();
  const form = crew.getByRole("form", { name: "New record" });
  await form
    .locator("label")
    .filter({ hasText: /^End A/ })
    .click();
  await crew.getByRole("radio", { name: /Set A/ }).check();
  await crew.getByLabel(/Final gauge pressure/).fill(reading.psi);
  await crew.getByLabel(/Mark before/).fill(reading.before);
  await crew.getByLabel(/Mark after/).fill(reading.after);
  await crew.getByRole("button", { name: "Save record" }).click();
  await crew.getByRole("button", { name: "Sync now" }).click();
  await expect(panel).toHaveCount(0, { timeout: 15_000 });
  await expect(rows.filter({ hasText: held.tag }).getByTestId("hold-summary")).toHaveCount(0);
  const [closed] = await queryDemo<{ status: string; close_reason: string }>(
    "select status, close_reason from flags where id = $1",
    [flag!.id],
  );
  expect(closed).toMatchObject({ status: "closed" });
  expect(closed!.close_reason).toMatch(/Restressed as ordered/);
  await screenshot(crew, "field-hold-lifted");

  await ctx.close();
  await crewApi.dispose();
  await engineer.dispose();
});
