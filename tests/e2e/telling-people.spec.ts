import { expect, test } from "@playwright/test";
import { PEOPLE, apiAs, lastMailId, latestMailTo, queryDemo, signInWithPassword } from "./people";
import { makePourFixture, pushReadings } from "./pour-fixture";
import { screenshot } from "./support";
import { openPourAsCrew } from "./field-steps";

/**
 * Telling people during the shift. The drift alarm: on a pour made for this spec, five tendons stressed with the
 * demo's first set come out close to the prediction and five stressed with its second set come out
 * about 5 % long. The crew's tablet (landscape 1280 × 800, then portrait) shows "check this gauge
 * against the master gauge" with the second set's figures at the top of the pour, and the
 * inspector gets one e-mail about it. The flag e-mail choice: an engineer sets a digest per shift
 * for themself on their own screen.
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
  await pushReadings(
    crewApi,
    fx,
    NEAR.map((factor, i) => [fx.tendons[i]!.id, factor] as const),
  );
  await pushReadings(
    crewApi,
    onSecond,
    LONG.map((factor, i) => [fx.tendons[NEAR.length + i]!.id, factor] as const),
  );

  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 }, hasTouch: true });
  const crew = await ctx.newPage();
  await openPourAsCrew(crew, POUR);

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

test("an engineer chooses a digest per shift for themself on the project, on their own screen", async ({ browser }) => {
  test.setTimeout(90_000);
  // An engineer of our own, so the demo engineer's flag e-mails stay as they are for other specs.
  const email = `digest-${stamp}@demo.tautline.test`;
  const [user] = await queryDemo<{ id: string }>(
    `insert into users (email, name, password_hash, email_verified)
     select $1, 'Dana Digest', password_hash, now() from users where email = $2 returning id`,
    [email, PEOPLE.engineer],
  );
  const [project] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  await queryDemo("insert into project_members (project_id, user_id, role) values ($1, $2, 'engineer')", [
    project!.id,
    user!.id,
  ]);

  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const page = await ctx.newPage();
  await signInWithPassword(page, email);
  await page.waitForURL(/\/home/);
  await page
    .getByRole("link", { name: /your flag e-mails on/ })
    .first()
    .click();
  await expect(page.getByRole("heading", { name: "Your flag e-mails" })).toBeVisible();
  await expect(page.getByText(/shifts end at 18:00/)).toBeVisible();
  // Dana is not on the project's list of flag addresses, and the page says so.
  await expect(page.getByTestId("flag-mail-unlisted")).toBeVisible();
  const each = page.getByRole("radio", { name: /One e-mail per flag/ });
  const digest = page.getByRole("radio", { name: /One digest per shift/ });
  await expect(each).toBeChecked();
  await expect(page.getByRole("button", { name: "Save my choice" })).toBeDisabled();
  await digest.check();
  await page.getByRole("button", { name: "Save my choice" }).click();
  await expect(page.getByRole("status")).toContainText("Your first digest comes after the shift that ends");
  await screenshot(page, "flag-mail-digest");
  const [member] = await queryDemo<{ flag_mail: string; digest_from: Date | null }>(
    "select flag_mail, digest_from from project_members where project_id = $1 and user_id = $2",
    [project!.id, user!.id],
  );
  expect(member!.flag_mail).toBe("digest");
  expect(member!.digest_from).not.toBeNull();
  await page.reload();
  await expect(digest).toBeChecked();
  await ctx.close();
});
