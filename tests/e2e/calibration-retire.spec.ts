import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";

/**
 * The admin retires a calibration from the equipment page with a reason: a reason too short is
 * named on the field; once retired the set shows it with its reason and no longer as current.
 * The set and calibration are made here, on the demo project, so the demo's own sets stay.
 */
const stamp = Date.now().toString(36);

test("the admin retires a calibration with a reason from the equipment page", async ({ page }) => {
  const [project] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  const projectId = project!.id;
  const admin = await apiAs(PEOPLE.admin);
  const set = await admin.post(`/api/projects/${projectId}/equipment-sets`, {
    data: {
      name: `Zeta retire set ${stamp}`,
      jackSerial: `RJ-${stamp}`,
      gaugeSerial: `RG-${stamp}`,
      pumpSerial: null,
      jackGripMm: null,
      maxForceN: null,
    },
  });
  expect(set.status()).toBe(201);
  const { setId } = (await set.json()) as { setId: string };
  const calibration = await admin.post(`/api/projects/${projectId}/equipment-sets/${setId}/calibrations`, {
    data: {
      calibratedOn: "2026-11-20",
      validUntil: null,
      points: [5, 10, 20, 30, 40].map((p) => ({ pressureMPa: p, forceN: 5100 * p - 900 })),
      laboratory: null,
      certificateAttachmentId: null,
    },
  });
  expect(calibration.status()).toBe(201);

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
  await card.getByRole("button", { name: "Retire the calibration of 2026-11-20" }).click();
  await expect(card).toContainText("Write why the calibration is retired, in a sentence");
  await card.getByLabel("Why it is retired").fill("Gauge dropped on the deck; sent back to the laboratory.");
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
