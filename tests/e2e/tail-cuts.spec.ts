import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo } from "./people";
import { makePourFixture, pushReadings } from "./pour-fixture";
import { openPourAsCrew } from "./field-steps";

/**
 * Tails cut at the slab edge, on a tablet: a held tendon (out of band, flag open) offers no cut;
 * a clear one (in band, concrete confirmed) is cut after a confirmation that says it cannot be
 * undone, and the cut reaches the server once. The pour is made for this spec.
 */

const stamp = Date.now().toString(36);
const POUR = `Tails check ${stamp}`;

test("a held tendon cannot be marked cut; a clear one is cut once after confirmation", async ({ browser }) => {
  test.setTimeout(120_000);
  const fx = await makePourFixture(POUR, [`TC-${stamp}-1`, `TC-${stamp}-2`]);
  const [clear, held] = fx.tendons as [(typeof fx.tendons)[number], (typeof fx.tendons)[number]];
  const crewApi = await apiAs(PEOPLE.crew);
  await pushReadings(crewApi, fx, [
    [clear.id, 1.0],
    [held.id, 1.15],
  ]);

  const ctx = await browser.newContext();
  const crew = await ctx.newPage();
  await openPourAsCrew(crew, POUR);

  const rows = crew.getByTestId("tendon-row");
  await expect(rows.filter({ hasText: clear.tag }).getByTestId("tail-state")).toHaveText("Clear to cut tails");
  await expect(rows.filter({ hasText: held.tag }).getByTestId("tail-state")).toHaveCount(0);
  await expect(crew.getByTestId("cut-all-clear")).toHaveText("Record tails cut on all clear tendons (1)");

  // The held tendon: the reasons, and no way to record a cut.
  await rows.filter({ hasText: held.tag }).click();
  const tails = crew.getByTestId("tail-cut");
  await expect(tails).toHaveAttribute("data-cut", "held");
  await expect(tails).toContainText("Tails: held, do not cut");
  await expect(tails.getByTestId("tail-held-reasons")).toContainText("flag is still open");
  await expect(tails.getByTestId("tail-cut-button")).toHaveCount(0);
  await expect(tails.getByTestId("tail-cut-refused")).toBeVisible();
  await screenshot(crew, "field-tails-held");

  // The clear tendon: cancel first (nothing recorded), then confirm.
  await rows.filter({ hasText: clear.tag }).click();
  await expect(tails).toHaveAttribute("data-cut", "clear");
  await tails.getByTestId("tail-cut-button").click();
  const dialog = crew.getByRole("dialog", { name: `Record tails cut on ${clear.tag}?` });
  await expect(dialog).toContainText("cannot be undone");
  await screenshot(crew, "field-tails-confirm");
  await dialog.getByRole("button", { name: "Cancel" }).click();
  await expect(tails).toHaveAttribute("data-cut", "clear");
  await tails.getByTestId("tail-cut-button").click();
  await dialog.getByRole("button", { name: `Tails of ${clear.tag} are cut` }).click();
  await expect(tails).toHaveAttribute("data-cut", "cut");
  const [crewRow] = await queryDemo<{ name: string }>("select name from users where email = $1", [PEOPLE.crew]);
  await expect(tails).toContainText(`By ${crewRow!.name}`);
  await crew.getByRole("button", { name: "Sync now" }).click();
  await expect(tails.getByTestId("tail-cut-sync")).toHaveText("received by the server", { timeout: 15_000 });
  await expect(rows.filter({ hasText: clear.tag }).getByTestId("tail-state")).toHaveText("Tails cut");
  await expect(crew.getByTestId("cut-all-clear")).toHaveCount(0);
  // Nothing can be restressed once the tails are cut.
  await expect(crew.getByRole("button", { name: "Record a restress" })).toHaveCount(0);
  await screenshot(crew, "field-tails-cut");

  const cuts = await queryDemo<{ tendon_id: string; held_reasons: string[] }>(
    "select tendon_id, held_reasons from tail_cuts where pour_id = $1",
    [fx.pourId],
  );
  expect(cuts).toEqual([{ tendon_id: clear.id, held_reasons: [] }]);
  const flags = await queryDemo("select id from flags where pour_id = $1 and kind = 'cut_while_held'", [fx.pourId]);
  expect(flags).toHaveLength(0);

  await ctx.close();
  await crewApi.dispose();
});
