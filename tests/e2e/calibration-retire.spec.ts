import { expect, test } from "@playwright/test";
import { makePourFixture, pushReadings, makeCalibratedSet, demoProjectId } from "./pour-fixture";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";

/**
 * The admin retires a calibration from the equipment page with a reason: a reason too short is
 * named on the field; once retired the set shows it with its reason and no longer as current.
 * The set and calibration are made here, on the demo project, so the demo's own sets stay.
 */
const stamp = Date.now().toString(36);

test("the admin retires a calibration with a reason from the equipment page", async ({ page }) => {
  const projectId = await demoProjectId();
  const admin = await apiAs(PEOPLE.admin);
  const { setId } = await makeCalibratedSet(
    admin,
    projectId,
    { name: `Zeta retire set ${stamp}`, jackSerial: `RJ-${stamp}`, gaugeSerial: `RG-${stamp}` },
    "2026-11-20",
  );

  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/(home|setup)/);
  await page.goto(`/projects/${projectId}/equipment`);
  const card = page.locator("li.card").filter({ hasText: `Zeta retire set ${stamp}` });
  await expect(card).toContainText("calibrated 2026-11-20");
  // The calibration chart: its box is named with the page, its drawing (recharts) loads after it.
  const chart = card.getByRole("img", {
    name: new RegExp(`^Calibration of Zeta retire set ${stamp}.*: 5 points and the fitted line$`),
  });
  await expect(chart.locator("svg.recharts-surface")).toBeVisible();
  await expect(chart.locator(".recharts-scatter-symbol")).toHaveCount(5);
  await screenshot(page, "equipment-calibration-chart");
  await card.getByText("Retire this calibration…").click();
  await card.getByLabel("Why it is retired").fill("bad");
  await card.getByRole("button", { name: "Check what the retirement changes" }).click();
  await expect(card).toContainText("Write why the calibration is retired, in a sentence");
  await expect(card.getByTestId("retirement-preview")).toHaveCount(0);
  await card.getByLabel("Why it is retired").fill("Gauge dropped on the deck; sent back to the laboratory.");
  await card.getByRole("button", { name: "Check what the retirement changes" }).click();
  // No record stands on this set's calibration: nothing is judged again, and nothing is written yet.
  await expect(card.getByTestId("retirement-preview")).toHaveText(
    "This retirement judges 0 stressed tendons again; no verdict changes. Press again to retire.",
  );
  const [standing] = await queryDemo<{ retired_at: Date | null }>(
    "select retired_at from calibrations where equipment_set_id = $1",
    [setId],
  );
  expect(standing!.retired_at).toBeNull();
  await card.getByRole("button", { name: "Retire the calibration of 2026-11-20" }).click();
  await expect(card.getByTestId("retired-calibration")).toHaveText(
    "Calibration of 2026-11-20 retired: Gauge dropped on the deck; sent back to the laboratory.",
  );
  await expect(card).toContainText("No calibration");
  await screenshot(page, "calibration-retired");
  const [row] = await queryDemo<{ retired_reason: string }>(
    "select retired_reason from calibrations where equipment_set_id = $1",
    [setId],
  );
  expect(row!.retired_reason).toBe("Gauge dropped on the deck; sent back to the laboratory.");
});

test("the retirement's check says how many stressed tendons stand on the calibration, and writes nothing", async ({
  page,
}) => {
  test.setTimeout(120_000);
  const fx = await makePourFixture(`Calibration retire ${stamp}`, [`CR-${stamp}-1`, `CR-${stamp}-2`]);
  const admin = await apiAs(PEOPLE.admin);
  const setName = `Zeta retire check set ${stamp}`;
  const { setId, calibrationId } = await makeCalibratedSet(
    admin,
    fx.projectId,
    { name: setName, jackSerial: `RCJ-${stamp}`, gaugeSerial: `RCG-${stamp}` },
    "2026-11-20",
  );
  await admin.dispose();
  // Both tendons stressed with this set, their records naming the calibration.
  const crew = await apiAs(PEOPLE.crew);
  const withSet = { ...fx, setId, calibrationId, line: { slope: 5100, intercept: -900 } };
  await pushReadings(
    crew,
    withSet,
    fx.tendons.map((t) => [t.id, 1.0] as const),
  );
  await crew.dispose();
  const evaluations = async () =>
    (
      await queryDemo<{ n: string }>(
        "select count(*)::text as n from evaluations where tendon_id in (select id from tendons where pour_id = $1)",
        [fx.pourId],
      )
    )[0]!.n;
  const before = await evaluations();

  await page.setViewportSize({ width: 1440, height: 900 });
  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/(home|setup)/);
  await page.goto(`/projects/${fx.projectId}/equipment`);
  const card = page.locator("li.card").filter({ hasText: setName });
  await card.getByText("Retire this calibration…").click();
  const form = card.getByRole("form", { name: "Retire the calibration of 2026-11-20" });
  await form.getByLabel("Why it is retired").fill("The gauge was dropped; checking what retiring it re-judges.");
  await form.getByRole("button", { name: "Check what the retirement changes" }).click();
  const preview = form.getByTestId("retirement-preview");
  // Without a calibration the gauge gives no force: the verdicts may stand, so the words are matched loosely.
  await expect(preview).toHaveText(
    /^This retirement judges 2 stressed tendons again; (no verdict changes|\d verdicts? changes?: CR-.+?)(; .+)?\. Press again to retire\.$/,
  );
  await screenshot(page, "calibration-retire-preview");
  // The check wrote nothing: the calibration stands and no evaluation was added.
  expect(await evaluations()).toBe(before);
  const [standing] = await queryDemo<{ retired_at: Date | null }>("select retired_at from calibrations where id = $1", [
    calibrationId,
  ]);
  expect(standing!.retired_at).toBeNull();
  // Editing the reason asks for a new check.
  await form.getByLabel("Why it is retired").fill("The gauge was dropped on the deck.");
  await expect(preview).toHaveCount(0);
  await expect(form.getByRole("button", { name: "Check what the retirement changes" })).toBeVisible();
});
