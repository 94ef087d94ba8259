import { expect, test, type Locator, type Page } from "@playwright/test";
import { judgeStressing, type JudgeCalibration } from "@/lib/stressing/judge";
import { judgeRecord } from "../support/judge-record";
import { formatLength, parsePressure, MM_PER_INCH, MPA_PER_PSI } from "@/lib/units";
import { PEOPLE, queryDemo, signInWithPassword } from "./people";
import { makePourFixture, typedReading, type PourFixture } from "./pour-fixture";
import { screenshot } from "./support";
import { openPourAsCrew } from "./field-steps";

/**
 * The record form's second reading and wire-break details on a tablet: a mark read to 1/8 in on
 * the band's edge makes the form ask for the mark again to 1/16 in before anything is saved; the
 * re-read and one broken wire (its strand and place) are saved, reach the server and are stored
 * beside the first reading. Save stays on screen with the extra step open, in both orientations.
 */

const IN = MM_PER_INCH;
const stamp = Date.now().toString(36);
const POUR = `Re-read ${stamp}`;

async function expectOnScreen(page: Page, target: Locator, what: string) {
  const box = await target.boundingBox();
  const view = page.viewportSize()!;
  expect(box, `${what} is shown`).not.toBeNull();
  expect(box!.y + box!.height, `${what}: inside the ${view.height} px screen`).toBeLessThanOrEqual(view.height);
  await expect(target, `${what} is wholly seen`).toBeInViewport({ ratio: 1 });
}

/**
 * What the judge the tablet runs says of one marks reading of the pour's first tendon at
 * `finalMPa` (100 mm measured), on the project's basis in US units read to 1/8 in, with the
 * fixture's set holding `calibrations`.
 */
async function judgeOnPour(fx: PourFixture, finalMPa: number, calibrations: JudgeCalibration[]) {
  const [project] = await queryDemo<{ jacking_force_factor: number; time_zone: string }>(
    "select jacking_force_factor, time_zone from projects where id = $1",
    [fx.projectId],
  );
  return judgeStressing({
    project: {
      ...fx.project,
      unitSystem: "us",
      readingResolution: "1/8in",
      jackingForceFactor: project!.jacking_force_factor,
      timeZone: project!.time_zone,
    },
    tendon: fx.tendon,
    lot: fx.lot,
    sets: [{ id: fx.setId, name: "set", jackGripMm: null, maxForceN: null, calibrations }],
    records: [
      judgeRecord({
        deviceTime: new Date(),
        equipmentSetId: fx.setId,
        calibrationId: calibrations[0]?.id ?? null,
        finalPressureMPa: finalMPa,
      }),
    ],
  });
}

test("a reading the division could flip is read again finer before saving; a broken wire names its strand and place", async ({
  browser,
}) => {
  test.setTimeout(120_000);
  const fx = await makePourFixture(POUR, [`RR-${stamp}-1`]);
  const tendon = fx.tendons[0]!;
  const [set] = await queryDemo<{ name: string }>("select name from equipment_sets where id = $1", [fx.setId]);
  const [project] = await queryDemo<{ reading_resolution: string }>(
    "select reading_resolution from projects where id = $1",
    [fx.projectId],
  );
  expect(project!.reading_resolution).toBe("1/8in");

  // The band's upper edge for marks, from the same judge the tablet runs.
  const { psi } = typedReading(fx, 1);
  const finalMPa = parsePressure(psi, { field: "finalPressure", system: "SI", defaultUnit: "psi" });
  const judged = await judgeOnPour(fx, finalMPa, [
    {
      id: fx.calibrationId,
      calibratedOn: "2000-01-01",
      validUntil: "2100-01-01",
      ...fx.line,
      minPressureMPa: 0,
      maxPressureMPa: 1000,
    },
  ]);
  const upperMm = judged.comparison!.upperMm;
  // The 1/8 in division nearest the edge: ±1/16 in around it always straddles the edge.
  const firstAfter = formatLength(2 * IN + upperMm, "1/8 in").replace(/ in$/, "");
  // Read again to 1/16 in, 1/32 in or more inside the band.
  const sixteenth = IN / 16;
  const fineMm = Math.floor((upperMm - IN / 32) / sixteenth) * sixteenth;
  const fineAfter = formatLength(2 * IN + fineMm, "1/16 in").replace(/ in$/, "");

  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 }, hasTouch: true });
  const page = await ctx.newPage();
  await openPourAsCrew(page, POUR);
  await page.getByTestId("tendon-row").filter({ hasText: tendon.tag }).click();

  const form = page.getByTestId("record-form");
  const save = page.getByRole("button", { name: "Save record" });
  await page.getByRole("radio", { name: new RegExp(set!.name) }).check();
  await page.getByLabel(/Final gauge pressure/).fill(psi);
  await page.getByLabel(/Mark before/).fill("2");
  await page.getByLabel(/Mark after lock-off/).fill(firstAfter);
  await save.click();

  // Not saved: the form asks for the mark again to 1/16 in, with the sixteenths on the keys.
  const step = page.getByTestId("reread-step");
  await expect(step).toContainText("Read again to 1/16 in");
  await expect(form.getByRole("alert").filter({ hasText: "Not saved yet" })).toBeVisible();
  await expect(page.getByTestId("verdict")).toHaveCount(0);
  const again = page.getByLabel(/Mark after, read again/);
  await expect(again).toHaveAttribute("inputmode", "decimal");
  await expect(page.getByTestId("fraction-keys").getByRole("button", { name: "7/16", exact: true })).toBeVisible();
  for (const size of [
    { name: "landscape", width: 1280, height: 800 },
    { name: "portrait", width: 800, height: 1280 },
  ]) {
    await page.setViewportSize(size);
    await again.scrollIntoViewIfNeeded();
    await expectOnScreen(page, again, "the re-read box");
    await expectOnScreen(page, save, "Save");
    await screenshot(page, `record-reread-step-${size.name}`);
  }
  await page.setViewportSize({ width: 1280, height: 800 });

  // Saving with neither the re-read nor a reason is refused, naming the box.
  await save.click();
  await expect(form.getByText("Read the elongation again to the finer division")).toBeVisible();

  await again.fill(fineAfter);
  // One broken wire: its strand and where.
  await page.getByRole("button", { name: "Breaks, remarks, photos" }).click();
  await page.getByLabel(/Wire breaks/).fill("1");
  const brk = page.getByTestId("wire-break");
  await expect(brk).toHaveCount(1);
  await save.click();
  await expect(brk.getByText("Break 1: type the strand's number")).toBeVisible();
  await expect(brk.getByText("Break 1: say where the wire broke.")).toBeVisible();
  await brk.getByLabel(/Strand \(1–/).fill("1");
  await brk.getByText("At the far end").click();
  await brk.scrollIntoViewIfNeeded();
  await screenshot(page, "record-wire-break-details");
  await save.click();
  await expect(page.getByTestId("verdict")).toBeVisible();
  await expect(page.getByTestId("reread")).toHaveCount(0);
  await screenshot(page, "record-reread-saved");

  // On the server: the first reading beside the re-read that was judged, the break's strand and place.
  await expect
    .poll(
      async () =>
        (await queryDemo<{ n: string }>("select count(*) as n from records where tendon_id = $1", [tendon.id]))[0]!.n,
      { timeout: 30_000 },
    )
    .toBe("1");
  const [row] = await queryDemo<{
    measured_mm: number;
    first_reading_mm: number;
    wire_break_details: unknown;
  }>("select measured_mm, first_reading_mm, wire_break_details from records where tendon_id = $1", [tendon.id]);
  expect(row!.measured_mm).toBeCloseTo(fineMm, 6);
  expect(row!.first_reading_mm).toBeGreaterThan(row!.measured_mm);
  expect(row!.wire_break_details).toEqual([{ strand: 1, where: "far_end" }]);
  await ctx.close();
});

test("gauge steps entered offline are saved, synced and judged along their least-squares line", async ({ browser }) => {
  test.setTimeout(150_000);
  const fx = await makePourFixture(`Steps ${stamp}`, [`GS-${stamp}-1`]);
  const tendon = fx.tendons[0]!;
  const [set] = await queryDemo<{ name: string }>("select name from equipment_sets where id = $1", [fx.setId]);
  const [cal] = await queryDemo<{ min_pressure_mpa: number; max_pressure_mpa: number }>(
    "select min_pressure_mpa, max_pressure_mpa from calibrations where id = $1",
    [fx.calibrationId],
  );
  // The tendon's own prediction, from the judge the tablet runs: gross at the specified force and the plan's set.
  const { psi } = typedReading(fx, 1);
  const mpa = (typed: string) => parsePressure(typed, { field: "p", system: "SI", defaultUnit: "psi" });
  const probe = (await judgeOnPour(fx, mpa(psi), [])).ends[0]!;
  const G = probe.predictedGrossMm;
  const force = (typed: string) => fx.line.slope * mpa(typed) + fx.line.intercept;
  // Steps at 20/40/60/80/100 % of the final pressure, read from a mark 2 in out, as a perfect tendon
  // would read them (elongation proportional to force); the marks set at the first step.
  // (The lowest step stays inside the calibrated range.)
  const lowest = Math.ceil(cal!.min_pressure_mpa / MPA_PER_PSI / 50) * 50;
  const stepPsi = [0.2, 0.4, 0.6, 0.8]
    .map((f) => String(Math.max(lowest, Math.round((Number(psi) * f) / 50) * 50)))
    .concat(psi);
  const inches = (mm: number) => formatLength(mm, "1/8 in").replace(/ in$/, "");
  const stepReadings = stepPsi.map((p) => inches(2 * IN + (G * force(p)) / force(psi)));
  const after = inches(2 * IN + (G * (force(psi) - force(stepPsi[0]!))) / force(psi) - probe.setMm);

  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 }, hasTouch: true });
  const page = await ctx.newPage();
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home/);
  await page.goto("/field");
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
  await page.getByTestId("available-pour").filter({ hasText: fx.pourName }).getByRole("button").click();
  const ready = page.getByTestId("ready-pour").filter({ hasText: fx.pourName });
  await expect(ready.getByTestId("ready-offline")).toBeVisible();
  await ctx.setOffline(true);
  await ready.getByRole("link", { name: "Open tendon list" }).click();
  await expect(page.getByTestId("connection")).toHaveText("No signal");
  await page.getByTestId("tendon-row").filter({ hasText: tendon.tag }).click();

  const form = page.getByTestId("record-form");
  const save = page.getByRole("button", { name: "Save record" });
  const toggle = form.getByRole("button", { name: "Gauge steps…" });
  // Folded away, the steps keep Save on the screen in both orientations.
  await expect(toggle).toHaveAttribute("aria-expanded", "false");
  for (const size of [
    { width: 1280, height: 800 },
    { width: 800, height: 1280 },
  ]) {
    await page.setViewportSize(size);
    await expectOnScreen(page, save, "Save with the steps folded");
  }
  await page.setViewportSize({ width: 1280, height: 800 });

  await page.getByRole("radio", { name: new RegExp(set!.name) }).check();
  await page.getByLabel(/Initial gauge pressure/).fill(stepPsi[0]!);
  await page.getByLabel(/Final gauge pressure/).fill(psi);
  await page.getByLabel(/Mark before/).fill("2");
  await page.getByLabel(/Mark after lock-off/).fill(after);
  await toggle.click();
  const steps = page.getByTestId("gauge-steps");
  await expect(steps.getByLabel(/Step \d pressure/)).toHaveCount(2);
  for (let i = 2; i < 5; i++) await steps.getByRole("button", { name: "Add a step" }).click();
  for (const [i, p] of stepPsi.entries()) {
    await steps.getByLabel(`Step ${i + 1} pressure`).fill(p);
    await steps.getByLabel(`Step ${i + 1} reading`).fill(stepReadings[i]!);
  }
  await expect(steps.getByLabel("Step 3 reading")).toHaveAttribute("inputmode", "decimal");

  // A step pressure past the calibration is refused, naming the step and the range in psi; nothing is saved.
  const tooHigh = String(Math.ceil((cal!.max_pressure_mpa / MPA_PER_PSI + 500) / 100) * 100);
  await steps.getByLabel("Step 5 pressure").fill(tooHigh);
  await save.click();
  await expect(steps.getByText(/Step 5 pressure outside the calibrated range .* psi to .* psi/)).toBeVisible();
  // The message is tied to its box, so a screen reader reads it with the box.
  await expect(steps.getByLabel("Step 5 pressure")).toHaveAttribute("aria-invalid", "true");
  await expect(steps.getByLabel("Step 5 pressure")).toHaveAccessibleDescription(/outside the calibrated range/);
  await expect(page.getByTestId("verdict")).toHaveCount(0);
  await steps.getByLabel("Step 5 pressure").fill(psi);
  await steps.scrollIntoViewIfNeeded();
  await screenshot(page, "record-gauge-steps-open-landscape");

  await save.click();
  await expect(page.getByTestId("verdict").locator("[data-verdict]").first()).toContainText("In band");
  await expect(page.getByTestId("pending-count")).toContainText("1");

  // Signal back: the record goes with its steps, and the server judges it the same way.
  await ctx.setOffline(false);
  await page.getByRole("button", { name: "Sync now" }).click();
  await expect(page.getByTestId("pending-count")).toContainText("0 records", { timeout: 20_000 });
  await expect(page.getByTestId("server-verdict")).toContainText("In band");
  const [row] = await queryDemo<{ entered: { gaugeSteps: { pressure: string; readingMm: number }[] } }>(
    "select entered from records where tendon_id = $1",
    [tendon.id],
  );
  expect(row!.entered.gaugeSteps.map((s) => s.pressure)).toEqual(stepPsi);
  const [evaluation] = await queryDemo<{ verdict: string; inputs: { readings: { stepFit: { r2: number } }[] } }>(
    "select verdict, inputs from evaluations where tendon_id = $1 order by created_at desc limit 1",
    [tendon.id],
  );
  expect(evaluation!.verdict).toBe("in band");
  expect(evaluation!.inputs.readings[0]!.stepFit.r2).toBeGreaterThan(0.99);
  await ctx.close();
});
