import { expect, test } from "@playwright/test";
import { makePourFixture, pushEndA, makeCalibratedSet } from "./pour-fixture";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";

/**
 * Adding a calibration to a set whose records named none judges those tendons again: the form's
 * first press shows how many and what changes (nothing written), the second saves. The set, its
 * first calibration, the pour and the record are made here, so the demo's own stay as seeded.
 * Calibration figures invented (about 5.1 kN per MPa).
 */
const stamp = Date.now().toString(36);

test("adding a calibration shows first what it judges again, then saves on a second press", async ({ page }) => {
  test.setTimeout(120_000);
  const fx = await makePourFixture(`Calibration add ${stamp}`, [`CA-${stamp}-1`]);
  const admin = await apiAs(PEOPLE.admin);
  const setName = `Zeta add set ${stamp}`;
  const { setId } = await makeCalibratedSet(
    admin,
    fx.projectId,
    { name: setName, jackSerial: `AJ-${stamp}`, gaugeSerial: `AG-${stamp}` },
    "2026-11-01",
  );
  // The crew's record names the set and no calibration: it is judged on the one in force that day.
  const crew = await apiAs(PEOPLE.crew);
  const pushed = await pushEndA(
    crew,
    { ...fx, setId, calibrationId: null as unknown as string, line: { slope: 5100, intercept: -900 } },
    fx.tendons[0]!.id,
    1.0,
    // A record that names no calibration: the tablet asks why the set was used without one.
    { expiredCalibrationReason: "The set's new certificate had not reached the tablet yet." },
  );
  expect(pushed.result).toMatchObject({ status: "applied" });
  await crew.dispose();
  const evaluations = async () =>
    (
      await queryDemo<{ n: string }>("select count(*)::text as n from evaluations where tendon_id = $1", [
        fx.tendons[0]!.id,
      ])
    )[0]!.n;
  expect(await evaluations()).toBe("1");

  await page.setViewportSize({ width: 1440, height: 900 });
  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/(home|setup)/);
  await page.goto(`/projects/${fx.projectId}/equipment`);
  const form = page.getByRole("form", { name: "Add a calibration" });
  await form.getByLabel("Equipment set").selectOption({ label: setName });
  await form.getByLabel("Calibrated on").fill("2026-11-25");
  // The same line a little stiffer (psi, kip on this US project).
  await form
    .getByLabel(/Calibration points/)
    .fill(["1000, 7.8", "2000, 15.7", "3000, 23.6", "4000, 31.5", "5000, 39.4"].join("\n"));
  await form.getByRole("button", { name: "Save calibration" }).click();
  await expect(form.getByTestId("calibration-preview")).toHaveText(
    /^This calibration judges 1 stressed tendon again; (no verdict changes|1 verdict changes: CA-\S+)(; .+)?\. Press again to save it\.$/,
  );
  await screenshot(page, "calibration-add-preview");
  // Nothing written by the check.
  const calibrations = async () =>
    (
      await queryDemo<{ n: string }>("select count(*)::text as n from calibrations where equipment_set_id = $1", [
        setId,
      ])
    )[0]!.n;
  expect(await calibrations()).toBe("1");
  expect(await evaluations()).toBe("1");

  await form.getByRole("button", { name: "Save the calibration and judge again" }).click();
  await expect(form).toContainText("Calibration saved");
  expect(await calibrations()).toBe("2");
  const [latest] = await queryDemo<{ reason: string }>(
    "select reason from evaluations where tendon_id = $1 order by created_at desc limit 1",
    [fx.tendons[0]!.id],
  );
  expect(latest!.reason).toBe("calibration of 2026-11-25 added to the equipment set");
  await admin.dispose();
});
