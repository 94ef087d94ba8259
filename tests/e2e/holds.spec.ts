import { expect, test } from "@playwright/test";
import type { PullResponse } from "@/lib/schemas/sync";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";
import { makePourFixture, pushEndA, typedReading, pushReadings, outOfBandFlagId, decideFlag } from "./pour-fixture";
import { openPourAsCrew } from "./field-steps";

/**
 * The engineer's decision reaches the slab edge: a long tendon is held on the tablet with the
 * reason, listed first; the engineer orders a restress; after a sync the tablet shows the order in
 * words; the crew logs the restress, it comes back in band and the hold lifts; the crew records its
 * tails cut and the server has the cut, while another long tendon of the pour, still held, offers no
 * cut. On the way, the inspector's review queue lists the record whose tablet clock was off, on a
 * tendon no flag holds. The pour is made for this spec.
 */

const stamp = Date.now().toString(36);
const POUR = `Hold check ${stamp}`;

test("an engineer's restress order reaches the crew's tablet, the crew logs it, the tendon is no longer held and its tails are cut", async ({
  browser,
}) => {
  test.setTimeout(180_000);
  const fx = await makePourFixture(POUR, [`HD-${stamp}-1`, `HD-${stamp}-2`, `HD-${stamp}-3`]);
  const [clear, held, stillHeld] = fx.tendons as [
    (typeof fx.tendons)[number],
    (typeof fx.tendons)[number],
    (typeof fx.tendons)[number],
  ];
  const crewApi = await apiAs(PEOPLE.crew);
  // The clear tendon's tablet clock was 30 minutes behind the server's: in band, no flag, but its
  // time is for the inspector to check.
  const late = new Date(Date.now() - 30 * 60_000);
  const clearPush = await pushEndA(crewApi, fx, clear.id, 1.0, { deviceTime: late });
  expect(clearPush.result).toMatchObject({ status: "applied" });
  await pushReadings(crewApi, fx, [
    [held.id, 1.15],
    [stillHeld.id, 1.15],
  ]);
  const flagId = await outOfBandFlagId(held.id);
  expect(await queryDemo("select id from flags where tendon_id = $1", [clear.id])).toHaveLength(0);

  // The inspector's review queue lists the record whose time is off, though no flag holds its
  // tendon, with both times and the difference in words; records with a right clock are not there.
  const officeCtx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  const office = await officeCtx.newPage();
  await signInWithPassword(office, PEOPLE.inspector);
  await office.waitForURL(/\/home/);
  await office.goto(`/review?pourId=${fx.pourId}`);
  const times = office.locator("[data-clock-skew-list]");
  await expect(times.getByRole("heading", { name: "Times to check" })).toBeVisible();
  const skewRow = times.locator(`[data-skewed-record="${clearPush.recordId}"]`);
  await expect(skewRow.getByRole("link", { name: `Tendon ${clear.tag}` })).toHaveAttribute(
    "href",
    `/projects/${fx.projectId}/tendons/${clear.id}/flags`,
  );
  await expect(skewRow).toContainText(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} C[SD]T/);
  await expect(skewRow).toContainText("30 minutes before the server received it");
  await expect(times.locator("[data-skewed-record]")).toHaveCount(1);
  await expect(times).not.toContainText(held.tag);
  await screenshot(office, "review-times-to-check-desktop");
  await officeCtx.close();

  const ctx = await browser.newContext();
  const crew = await ctx.newPage();
  await openPourAsCrew(crew, POUR);

  // Held tendons come first in the list, with what holds them in words.
  const rows = crew.getByTestId("tendon-row");
  const heldRow = rows.filter({ hasText: held.tag });
  await expect(rows).toHaveCount(3);
  await expect(rows.last()).toContainText(clear.tag);
  await expect(heldRow.getByTestId("hold-summary")).toHaveText("Held · waiting for the engineer");
  await expect(rows.filter({ hasText: stillHeld.tag }).getByTestId("hold-summary")).toHaveText(
    "Held · waiting for the engineer",
  );
  await expect(rows.filter({ hasText: clear.tag }).getByTestId("hold-summary")).toHaveCount(0);
  await heldRow.click();
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
  await decideFlag(
    engineer,
    fx,
    flagId,
    "restress",
    "Long by about 15 %: check the wedges seated, restress to the same gauge pressure and re-read the marks.",
  );
  await crew.getByRole("button", { name: "Sync now" }).click();
  await expect(heldRow.getByTestId("hold-summary")).toHaveText("Held · restress ordered");
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
    [flagId],
  );
  expect(closed).toMatchObject({ status: "closed" });
  expect(closed!.close_reason).toMatch(/Restressed as ordered/);
  await screenshot(crew, "field-hold-lifted");

  // The hold lifted: the crew records the tails cut, after the confirmation that it cannot be undone.
  const tails = crew.getByTestId("tail-cut");
  await expect(tails).toHaveAttribute("data-cut", "clear");
  await tails.getByTestId("tail-cut-button").click();
  const dialog = crew.getByRole("dialog", { name: `Record tails cut on ${held.tag}?` });
  await expect(dialog).toContainText("cannot be undone");
  await dialog.getByRole("button", { name: `Tails of ${held.tag} are cut` }).click();
  await expect(tails).toHaveAttribute("data-cut", "cut");
  await crew.getByRole("button", { name: "Sync now" }).click();
  await expect(tails.getByTestId("tail-cut-sync")).toHaveText("received by the server", { timeout: 15_000 });
  await expect(heldRow.getByTestId("tail-state")).toHaveText("Tails cut");

  // The server has the cut: the pull gives it back, with no hold standing when it was made.
  const pulled = await crewApi.get(`/api/sync/pull?cursor=0&pours=${fx.pourId}`);
  expect(pulled.status()).toBe(200);
  const { tailCuts } = (await pulled.json()) as PullResponse;
  expect(tailCuts?.map((c) => ({ tendonId: c.tendonId, heldReasons: c.heldReasons }))).toEqual([
    { tendonId: held.id, heldReasons: [] },
  ]);

  // The other long tendon is still held: the tablet says why and offers no cut, and "all clear"
  // counts only the one clear tendon left.
  await rows.filter({ hasText: stillHeld.tag }).click();
  await expect(crew.getByTestId("selected-tag")).toHaveText(stillHeld.tag);
  await expect(tails).toHaveAttribute("data-cut", "held");
  await expect(tails).toContainText("Tails: held, do not cut");
  await expect(tails.getByTestId("tail-held-reasons")).toContainText("flag is still open");
  await expect(tails.getByTestId("tail-cut-button")).toHaveCount(0);
  await expect(tails.getByTestId("tail-cut-refused")).toBeVisible();
  await expect(rows.filter({ hasText: stillHeld.tag }).getByTestId("tail-state")).toHaveCount(0);
  await expect(crew.getByTestId("cut-all-clear")).toHaveText("Record tails cut on all clear tendons (1)");
  await screenshot(crew, "field-holds-tails-final");
  const cuts = await queryDemo<{ tendon_id: string }>("select tendon_id from tail_cuts where pour_id = $1", [
    fx.pourId,
  ]);
  expect(cuts).toEqual([{ tendon_id: held.id }]);

  await ctx.close();
  await crewApi.dispose();
  await engineer.dispose();
});
