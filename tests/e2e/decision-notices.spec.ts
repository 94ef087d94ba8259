import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo } from "./people";
import { makePourFixture, typedReading, pushReadings, outOfBandFlagId, decideFlag } from "./pour-fixture";
import { openPourAsCrew, tendonFlagsAsEngineer } from "./field-steps";

/**
 * A decision reaches the slab edge as a notice: the engineer orders a restress; after the crew's
 * next sync the tablet (portrait, 800 × 1280) shows a notice naming the tendon, the order, the
 * engineer's words and what to do; it stays through a reload until the crew taps "Read". Then the
 * engineer accepts and releases the pour, and the next sync brings both as notices.
 */

const stamp = Date.now().toString(36);
const POUR = `Notice check ${stamp}`;
const ORDER = "Long by about 15 %: restress to the same gauge pressure and re-read the marks at end A.";

test("the engineer's decision shows on the crew's tablet after the next sync and stays until read", async ({
  browser,
}) => {
  test.setTimeout(150_000);
  const fx = await makePourFixture(POUR, [`NT-${stamp}-1`, `NT-${stamp}-2`]);
  const [clear, held] = fx.tendons as [(typeof fx.tendons)[number], (typeof fx.tendons)[number]];
  const crewApi = await apiAs(PEOPLE.crew);
  await pushReadings(crewApi, fx, [
    [clear.id, 1.0],
    [held.id, 1.15],
  ]);
  const flagId = await outOfBandFlagId(held.id);

  const ctx = await browser.newContext({ viewport: { width: 800, height: 1280 }, hasTouch: true });
  const crew = await ctx.newPage();
  await openPourAsCrew(crew, POUR);
  await expect(crew.getByTestId("tendon-row").first()).toContainText(held.tag);
  // A first download is read fresh: what it holds is on the tendon panels, not in a notice.
  await expect(crew.getByTestId("decision-notices")).toHaveCount(0);

  const engineer = await apiAs(PEOPLE.engineer);
  await decideFlag(engineer, fx, flagId, "restress", ORDER);

  await crew.getByRole("button", { name: "Sync now" }).click();
  const notices = crew.getByTestId("decision-notices");
  const notice = notices.getByTestId("decision-notice");
  await expect(notice).toHaveCount(1, { timeout: 15_000 });
  await expect(notice).toHaveAttribute("data-kind", "decision");
  await expect(notice.getByTestId("notice-subject")).toHaveText(held.tag);
  await expect(notice.getByTestId("notice-what")).toHaveText(
    "Engineer's decision on the out of band flag: restress ordered.",
  );
  await expect(notice.getByTestId("notice-words")).toContainText(ORDER);
  await expect(notice.getByTestId("notice-instruction")).toContainText(
    "What to do: Restress this tendon as the engineer instructs",
  );
  // At the top of the pour view, above the tendon list, with a button a gloved hand can hit.
  const noticeBox = (await notices.boundingBox())!;
  expect(noticeBox.y).toBeLessThan((await crew.getByTestId("tendon-list").boundingBox())!.y);
  const button = crew.getByTestId("acknowledge-notices");
  expect((await button.boundingBox())!.height).toBeGreaterThanOrEqual(48);
  await screenshot(crew, "field-notice-restress-portrait");

  // A reload keeps it (it lives in the tablet's database), and the field log's front page shows it too.
  await crew.reload();
  await expect(crew.getByTestId("decision-notice")).toHaveCount(1);
  await crew.goto("/field");
  await expect(crew.getByTestId("decision-notice").getByTestId("notice-subject")).toHaveText(held.tag);
  await expect(crew.getByTestId("decision-notice")).toContainText(POUR);
  await screenshot(crew, "field-notice-home-portrait");
  // The tag opens the tendon, whose panel carries the same order.
  await crew.getByRole("link", { name: `Open tendon ${held.tag}` }).click();
  await expect(crew.getByTestId("selected-tag")).toHaveText(held.tag);
  await expect(crew.getByTestId("hold-instruction")).toContainText(ORDER);
  await expect(crew.getByTestId("decision-notice")).toHaveCount(1);

  await crew.getByTestId("acknowledge-notices").click();
  await expect(crew.getByTestId("decision-notices")).toHaveCount(0);
  await crew.reload();
  await expect(crew.getByTestId("tendon-row").first()).toContainText(held.tag);
  await expect(crew.getByTestId("decision-notices")).toHaveCount(0);
  // The hold itself stays on the tendon's panel: reading the notice lifts nothing.
  await expect(crew.getByTestId("tendon-row").first().getByTestId("hold-summary")).toHaveText(
    "Held · restress ordered",
  );

  // The engineer accepts the tendon after all and releases the pour: both arrive with the next sync.
  await decideFlag(engineer, fx, flagId, "accept", "Accepted as stressed: the wedges were found seated on inspection.");
  const released = await engineer.post(`/api/projects/${fx.projectId}/pours/${fx.pourId}/release`, {
    data: {
      statement: `${POUR} is released for tail cutting.`,
      signerName: "Test Engineer",
      licence: "PE (test)",
      confirmed: true,
    },
  });
  expect(released.status()).toBe(201);
  await crew.getByRole("button", { name: "Sync now" }).click();
  await expect(crew.getByTestId("decision-notice")).toHaveCount(2, { timeout: 15_000 });
  await expect(crew.locator('[data-testid="decision-notice"][data-kind="released"]')).toContainText(
    `${POUR} is released for tail cutting.`,
  );
  await expect(crew.locator('[data-testid="decision-notice"][data-kind="decision"]')).toContainText("accepted");
  // The accepted tendon is no longer held: the server's verdict stands, decided, with no "do not cut" alarm.
  await expect(crew.getByTestId("server-verdict")).toContainText("Long");
  await expect(crew.getByTestId("verdict-settled")).toBeVisible();
  await expect(crew.getByText("Out of band: do not cut the tails")).toHaveCount(0);
  await screenshot(crew, "field-notice-released-portrait");
  await crew.getByTestId("acknowledge-notices").click();
  await expect(crew.getByTestId("decision-notices")).toHaveCount(0);

  await ctx.close();
  await crewApi.dispose();
  await engineer.dispose();
});

test("stressing a pour whose concrete is not confirmed asks the crew why, and the engineer reads it on the flag", async ({
  browser,
}) => {
  test.setTimeout(120_000);
  const pourName = `Go-ahead check ${stamp}`;
  const fx = await makePourFixture(pourName, [`GA-${stamp}-1`], { concreteConfirmed: false });
  const [tendon] = fx.tendons as [(typeof fx.tendons)[number]];
  const reading = typedReading(fx, 1.0);
  const reason = "Inspector read the field-cured cylinders on site at 3,200 psi before the first pull.";

  const ctx = await browser.newContext({ viewport: { width: 800, height: 1280 }, hasTouch: true });
  const crew = await ctx.newPage();
  await openPourAsCrew(crew, pourName);
  await expect(crew.getByTestId("concrete-gate-field")).toContainText("Concrete not confirmed: do not stress");
  await crew.getByTestId("tendon-row").filter({ hasText: tendon.tag }).click();
  const gate = crew.getByTestId("concrete-go-ahead");
  await expect(gate).toContainText("Concrete not confirmed: no lab results confirm");
  await crew.getByRole("radio", { name: /Set A/ }).check();
  await crew.getByLabel(/Final gauge pressure/).fill(reading.psi);
  await crew.getByLabel(/Mark before/).fill(reading.before);
  await crew.getByLabel(/Mark after/).fill(reading.after);
  // Without a reason nothing is saved, and the box says what it wants.
  await crew.getByRole("button", { name: "Save record" }).click();
  await expect(gate.getByRole("alert")).toContainText("say who confirmed it on site, or why stressing goes ahead");
  await expect(crew.getByTestId("end-A")).toHaveCount(0);
  await screenshot(crew, "field-concrete-go-ahead-asked-portrait");
  await crew.getByLabel(/Who confirmed the concrete on site/).fill(reason);
  await crew.getByRole("button", { name: "Save record" }).click();
  await expect(crew.getByTestId("end-A")).toBeVisible();
  await crew.getByRole("button", { name: "Sync now" }).click();
  await expect(crew.getByTestId("end-A").getByTestId("sync-state")).toHaveText("sent", { timeout: 15_000 });
  const [stored] = await queryDemo<{ concrete_go_ahead: string }>(
    "select concrete_go_ahead from records where tendon_id = $1",
    [tendon.id],
  );
  expect(stored).toEqual({ concrete_go_ahead: reason });

  // The engineer's page for the tendon: the concrete flag quotes the crew, and so does the record.
  const { office: engineerCtx, engineer } = await tendonFlagsAsEngineer(browser, fx.projectId, tendon.id, null);
  await expect(engineer.getByText(`Crew's reason to go ahead: ${reason}`).first()).toBeVisible();
  await expect(engineer.getByTestId("concrete-go-ahead-reason")).toContainText(reason);
  await screenshot(engineer, "flag-concrete-go-ahead");

  await ctx.close();
  await engineerCtx.close();
});
