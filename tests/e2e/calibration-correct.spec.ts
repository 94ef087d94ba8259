import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";
import { makeCalibratedSet, demoProjectId } from "./pour-fixture";

/**
 * The admin corrects a calibration from the equipment page: a future date is named on its box;
 * the first press shows what the correction would re-judge (nothing written), the second corrects;
 * the set then stands on the corrected figures, the old calibration is listed as corrected with
 * the reason, and the correction is audited. The set is made here, on the demo project, so the
 * demo's own sets stay. Figures invented (about 5.1 kN per MPa).
 */
const stamp = Date.now().toString(36);

test("the admin corrects a calibration after seeing what it re-judges", async ({ page }) => {
  const projectId = await demoProjectId();
  const admin = await apiAs(PEOPLE.admin);
  const { setId, calibrationId } = await makeCalibratedSet(
    admin,
    projectId,
    { name: `Zeta correct set ${stamp}`, jackSerial: `CJ-${stamp}`, gaugeSerial: `CG-${stamp}` },
    "2026-11-20",
  );

  await page.setViewportSize({ width: 1280, height: 900 });
  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/(home|setup)/);
  await page.goto(`/projects/${projectId}/equipment`);
  const card = page.locator("li.card").filter({ hasText: `Zeta correct set ${stamp}` });
  await expect(card).toContainText("calibrated 2026-11-20");
  await card.getByText("Correct this calibration…").click();
  const form = card.getByRole("form", { name: "Correct the calibration of 2026-11-20" });
  // The points come back as typed in the project's units (a US project: psi, kip).
  await expect(form.getByLabel(/Calibration points/)).toHaveValue(/^725\.2, 5\.5303\n/);

  // A date in the future is named on its box, and nothing is asked of the server.
  await form.getByLabel("Calibrated on").fill("2999-01-01");
  await form.getByLabel("Why it is corrected").fill("The laboratory's certificate is dated the 21st, not the 20th.");
  await form.getByRole("button", { name: "Check what the correction changes" }).click();
  await expect(form).toContainText("The calibration date is in the future");
  await expect(form.getByTestId("correction-preview")).toHaveCount(0);

  await form.getByLabel("Calibrated on").fill("2026-11-21");
  await form.getByRole("button", { name: "Check what the correction changes" }).click();
  await expect(form.getByTestId("correction-preview")).toHaveText(
    "This correction judges 0 stressed tendons again; no verdict changes. Press again to correct.",
  );
  await screenshot(page, "calibration-correction-preview");
  // Nothing written by the check.
  const before = await queryDemo<{ n: string }>(
    "select count(*)::text as n from calibrations where equipment_set_id = $1",
    [setId],
  );
  expect(before[0]!.n).toBe("1");

  await form.getByRole("button", { name: "Correct the calibration of 2026-11-20" }).click();
  await expect(card).toContainText("calibrated 2026-11-21", { timeout: 15_000 });
  await expect(card.getByTestId("retired-calibration")).toContainText(
    "Calibration of 2026-11-20 retired: Corrected: The laboratory's certificate is dated the 21st, not the 20th.",
  );
  await screenshot(page, "calibration-corrected");
  const audit = await queryDemo<{ action: string }>("select action from audit_events where target = $1", [
    `calibration:${calibrationId}`,
  ]);
  expect(audit.map((a) => a.action)).toEqual(["calibration.correct"]);
});
