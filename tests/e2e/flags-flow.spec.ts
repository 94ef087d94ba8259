import { expect, test, type APIRequestContext } from "@playwright/test";
import { screenshot } from "./support";
import { MM_PER_INCH } from "@/lib/units";
import { makePourFixture, pushEndA, type PourFixture } from "./pour-fixture";
import { PEOPLE, apiAs, lastMailId, latestMailTo, queryDemo, signInWithPassword } from "./people";

/**
 * The path that protects the structure: a crew record out of band reaches the server, the
 * engineer of record is e-mailed, the inspector reviews, the engineer orders a restress, the
 * restress comes back in band and the pour is released. The pour and its tendon are made for
 * this test so the demo's own flags stay as they are.
 */

const stamp = Date.now().toString(36);
const TAG = `FLOW-${stamp}`;
const POUR = `Flow check ${stamp}`;

/** Pushes one record of the flow's tendon, typed as the crew would type it, through the tablet's sync route. */
async function pushRecord(crew: APIRequestContext, fx: PourFixture, factor: number, minutesAgo: number) {
  const pushed = await pushEndA(crew, fx, fx.tendons[0]!.id, factor, {
    deviceTime: new Date(Date.now() - minutesAgo * 60_000),
  });
  expect(pushed.httpStatus).toBe(200);
  expect(pushed.result, JSON.stringify(pushed.result)).toMatchObject({ status: "applied" });
  return pushed.recordId;
}

test("an out-of-band tendon is flagged, mailed, reviewed, restressed and only then released", async ({ browser }) => {
  test.setTimeout(180_000);
  const fx = await makePourFixture(POUR, [TAG]);
  const crew = await apiAs(PEOPLE.crew);

  // 1. The crew's record comes in 12 % short.
  const before = await lastMailId();
  await pushRecord(crew, fx, 0.88, 30);

  // 2. The engineer of record has the e-mail within a minute, the inspector a copy.
  const mail = await latestMailTo(PEOPLE.engineer, before, 60_000, (m) => m.subject.includes(TAG));
  expect(mail.subject).toContain(TAG);
  expect(mail.text).toMatch(/short/);
  expect(mail.text).toContain("Caution");
  expect(mail.to).toContain(PEOPLE.inspector);
  const link = /https?:\/\/\S+\/flags\?flag=[0-9a-f-]{36}/.exec(mail.text)?.[0];
  expect(link, "the e-mail links to the tendon's flags and names the flag").toBeTruthy();
  const linkPath = `${new URL(link!).pathname}${new URL(link!).search}`;

  // 3. The inspector reviews and sends it on.
  for (const viewport of [
    { width: 1280, height: 800, name: "tablet" },
    { width: 1600, height: 1000, name: "desktop" },
  ]) {
    const ctx = await browser.newContext({ viewport });
    const page = await ctx.newPage();
    await signInWithPassword(page, PEOPLE.inspector);
    await page.waitForURL(/\/home$/);
    await page.goto("/review");
    // The record's tablet time is 30 minutes before the server got it: beyond the default 10 minutes.
    // The flag's card says so, and the list of times to check names the record too.
    const card = page.getByRole("listitem").filter({ has: page.getByRole("link", { name: `Tendon ${TAG}` }) });
    await expect(card).toBeVisible();
    await expect(
      page.getByRole("region", { name: /Times to check/ }).getByRole("link", { name: `Tendon ${TAG}` }),
    ).toBeVisible();
    await expect(card.locator("[data-clock-skew]")).toContainText("Check the time");
    await expect(card).toContainText("Latest verdict");
    await screenshot(page, `review-queue-${viewport.name}`);
    await ctx.close();
  }
  const inspectorCtx = await browser.newContext();
  const inspector = await inspectorCtx.newPage();
  await signInWithPassword(inspector, PEOPLE.inspector);
  await inspector.waitForURL(/\/home$/);
  await inspector.goto(linkPath);
  await expect(inspector.getByRole("heading", { name: `Tendon ${TAG}`, level: 1 })).toBeVisible();
  // Both times are shown on the record whose tablet clock is off.
  await expect(inspector.locator("[data-clock-skew]").first()).toContainText("Server received:");
  await expect(inspector.locator("[data-verdict=short]").first()).toBeVisible();
  await expect(inspector.getByRole("note", { name: "Caution" }).first()).toBeVisible();
  // The re-measured reading takes what the field log takes: "7 1/8", typed or with a fraction key.
  await inspector.getByLabel("Re-measured reading").check();
  const remeasured = inspector.getByLabel("Re-measured elongation (in)");
  await remeasured.fill("7 1/8");
  await inspector.getByRole("button", { name: "Add to the trail" }).click();
  // Two faults at once: no note, and (below) a reading that cannot be read, each beside its box.
  await expect(inspector.locator("#review-body-error")).toBeVisible();
  await expect(inspector.locator("#remeasured-error")).toHaveCount(0);
  await remeasured.fill("seven");
  await inspector.getByRole("button", { name: "Add to the trail" }).click();
  await expect(inspector.locator("#remeasured-error")).toBeVisible();
  await expect(remeasured).toHaveAttribute("aria-describedby", /\bremeasured-error\b/);
  await expect(inspector.locator("#review-body-error")).toBeVisible();
  await remeasured.fill("7 3/8");
  await inspector
    .getByRole("group", { name: "Fraction keys" })
    .getByRole("button", { name: "1/8", exact: true })
    .click();
  await expect(remeasured).toHaveValue("7 1/8");
  await inspector.getByLabel("What you found").fill("Mark re-measured with a steel tape from the plate.");
  await inspector.getByRole("button", { name: "Add to the trail" }).click();
  await expect(inspector.getByText("Finding added to the flag's trail.")).toBeVisible();
  const [review] = await queryDemo<{ remeasured_mm: string }>(
    "select r.remeasured_mm from reviews r join flags f on f.id = r.flag_id where f.tendon_id = $1 and r.kind = 'remeasured'",
    [fx.tendons[0]!.id],
  );
  // 7 1/8 in, at 25.4 mm to the inch (lib/units).
  expect(Number(review!.remeasured_mm)).toBeCloseTo(7.125 * MM_PER_INCH, 3);
  await screenshot(inspector, "flag-inspector-remeasured");

  await inspector.getByLabel("Send to the engineer").check();
  await inspector
    .getByLabel("Note for the engineer")
    .fill("Mark re-checked with a steel tape; the reading stands. Please decide.");
  await inspector.getByRole("button", { name: "Add to the trail" }).click();
  await expect(inspector.getByText("Out of band · With the engineer").first()).toBeVisible();
  await screenshot(inspector, "flag-inspector");
  await inspectorCtx.close();

  // 4. The engineer reads the calculation and orders a restress; the pour cannot be released.
  for (const viewport of [
    { width: 1280, height: 800, name: "tablet" },
    { width: 1600, height: 1000, name: "desktop" },
  ]) {
    const ctx = await browser.newContext({ viewport });
    const page = await ctx.newPage();
    await signInWithPassword(page, PEOPLE.engineer);
    await page.waitForURL(/\/home$/);
    await page.goto(linkPath);
    await expect(page.getByRole("heading", { name: "1. Inputs" })).toBeVisible();
    await screenshot(page, `flag-engineer-${viewport.name}`);
    await ctx.close();
  }
  const engineerCtx = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const engineer = await engineerCtx.newPage();
  await signInWithPassword(engineer, PEOPLE.engineer);
  await engineer.waitForURL(/\/home$/);
  await engineer.goto(linkPath);
  await engineer.getByRole("button", { name: "Record the disposition" }).click();
  await expect(engineer.locator("#reasons-error")).toContainText("at least 10 characters");
  await engineer.getByLabel("Restress", { exact: true }).check();
  await engineer
    .getByLabel("Reasons")
    .fill("Short by 12 %: restress to the same gauge pressure and read the mark again before the tail is cut.");
  await engineer.getByLabel(/Licence statement/).fill("Licensed professional engineer (demo licence, invented)");
  await engineer.getByRole("button", { name: "Record the disposition" }).click();
  await expect(engineer.getByText("Disposition: Restress")).toBeVisible();

  await engineer.goto("/decisions");
  const card = engineer.locator(`[data-pour="${POUR}"]`);
  await expect(card).toContainText("1 with open flags");
  await expect(card).toContainText("Cannot be released yet.");
  const refused = await (
    await apiAs(PEOPLE.engineer)
  ).post(`/api/projects/${fx.projectId}/pours/${fx.pourId}/release`, {
    data: {
      statement: "Trying too early, should be refused.",
      signerName: "Priya Raman",
      licence: "PE 000000 (invented)",
      confirmed: true,
    },
  });
  expect(refused.status()).toBe(409);

  // 5. The crew restresses; the new record comes back in band and closes the flag.
  await pushRecord(crew, fx, 1.0, 0);
  const [flag] = await queryDemo<{ status: string; close_reason: string }>(
    "select status, close_reason from flags where tendon_id = $1",
    [fx.tendons[0]!.id],
  );
  expect(flag).toMatchObject({ status: "closed" });
  expect(flag!.close_reason).toMatch(/Restressed as ordered by disposition/);

  // 6. Nothing is open: the engineer releases the pour.
  await engineer.goto("/decisions");
  await expect(card).toContainText("0 with open flags");
  await card.getByRole("button", { name: `Release ${POUR}` }).click();
  // The statement must be read and owned before the release is confirmed.
  await expect(card.getByRole("alertdialog")).toContainText("Tick the box above first");
  await expect(card.getByRole("button", { name: `Yes, release ${POUR}` })).toBeDisabled();
  await card.getByRole("checkbox", { name: /it is my own/ }).check();
  // The release is signed: without the typed name and licence the server names the fields.
  await card.getByRole("button", { name: `Release ${POUR}` }).click();
  await card.getByRole("button", { name: `Yes, release ${POUR}` }).click();
  await expect(card).toContainText("Type your name as you sign.");
  await card.getByLabel("Your name, as you sign").fill("Priya Raman");
  await card.getByLabel("Licence number").fill("PE 000000 (invented)");
  await card.getByRole("button", { name: `Release ${POUR}` }).click();
  await card.getByRole("button", { name: `Yes, release ${POUR}` }).click();
  await expect(card).toContainText("Released by Priya Raman, P.E.");
  await expect(card.getByTestId("release-signature")).toContainText("licence PE 000000 (invented)");
  await screenshot(engineer, "decisions-released");
  const [pour] = await queryDemo<{ status: string }>("select status from pour_states where pour_id = $1", [fx.pourId]);
  expect(pour!.status).toBe("released");
  await engineerCtx.close();
  await crew.dispose();
});
