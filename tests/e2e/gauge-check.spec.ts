import { expect, test } from "@playwright/test";
import { PEOPLE, apiAs, lastMailId, latestMailTo, queryDemo, signInWithPassword } from "./people";
import { makePourFixture, pushEndA } from "./pour-fixture";
import { screenshot } from "./support";

/**
 * The drift alarm during the shift: on a pour made for this spec, five tendons stressed with the
 * demo's first set come out close to the prediction and five stressed with its second set come out
 * about 5 % long. The crew's tablet (landscape 1280 × 800, then portrait) shows "check this gauge
 * against the master gauge" with the second set's figures at the top of the pour, and the
 * inspector gets one e-mail about it.
 */

const stamp = Date.now().toString(36);
const POUR = `Gauge check ${stamp}`;
const NEAR = [1.0, 1.012, 0.988, 1.006, 0.994];
const LONG = [1.05, 1.062, 1.038, 1.056, 1.044];

test("a set that reads long on the pour raises the gauge check on the tablet and tells the inspector", async ({
  browser,
}) => {
  test.setTimeout(150_000);
  const tags = [...NEAR, ...LONG].map((_, i) => `GC-${stamp}-${String(i + 1).padStart(2, "0")}`);
  const fx = await makePourFixture(POUR, tags);
  const [second] = await queryDemo<{
    id: string;
    name: string;
    calibration_id: string;
    slope: number;
    intercept: number;
  }>(
    `select s.id, s.name, c.id as calibration_id, c.slope_n_per_mpa as slope, c.intercept_n as intercept
     from equipment_sets s join calibrations c on c.equipment_set_id = s.id
     where s.project_id = $1 and s.id <> $2 and c.retired_at is null order by s.name, c.calibrated_on desc limit 1`,
    [fx.projectId, fx.setId],
  );
  expect(second).toBeTruthy();
  const onSecond = {
    ...fx,
    setId: second!.id,
    calibrationId: second!.calibration_id,
    line: { slope: second!.slope, intercept: second!.intercept },
  };
  const mailsBefore = await lastMailId();
  const crewApi = await apiAs(PEOPLE.crew);
  for (const [i, factor] of NEAR.entries())
    expect((await pushEndA(crewApi, fx, fx.tendons[i]!.id, factor)).result.status).toBe("applied");
  for (const [i, factor] of LONG.entries())
    expect((await pushEndA(crewApi, onSecond, fx.tendons[NEAR.length + i]!.id, factor)).result.status).toBe("applied");

  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 }, hasTouch: true });
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

  const alarm = crew.getByTestId("gauge-check");
  await expect(alarm).toBeVisible({ timeout: 15_000 });
  await expect(alarm.getByRole("heading")).toHaveText("Check this gauge against the master gauge");
  const sets = alarm.getByTestId("gauge-check-set");
  await expect(sets).toHaveCount(1);
  await expect(sets).toContainText(`${second!.name}: mean deviation +`);
  await expect(sets).toContainText("over 5 tendons, against");
  await expect(sets).toContainText("points long");
  // Above the tendon list, where the crew looks before the next tendon.
  expect((await alarm.boundingBox())!.y).toBeLessThan((await crew.getByTestId("tendon-list").boundingBox())!.y);
  await screenshot(crew, "field-gauge-check-landscape");

  await crew.setViewportSize({ width: 800, height: 1280 });
  await expect(alarm).toBeVisible();
  await screenshot(crew, "field-gauge-check-portrait");

  const mail = await latestMailTo(PEOPLE.inspector, mailsBefore, 30_000, (m) => m.subject.includes(POUR));
  expect(mail.subject).toBe(`Tautline gauge check: ${second!.name}, ${POUR}`);
  expect(mail.text).toContain(`${second!.name}: mean deviation +`);
  expect(mail.text).not.toMatch(/MPa/);
  await ctx.close();
});
