import { expect, test } from "@playwright/test";
import { tendonBody } from "../support/api-routes";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";
import { makePourFixture, pushEndA } from "./pour-fixture";

/**
 * A pour's release is the engineer's act: an admin cannot release, a released pour takes no new
 * record (server and tablet) and no new tendon, and only the engineer's reopening, with a reason,
 * lets work go on. The pour is made for this spec.
 */

const stamp = Date.now().toString(36);
const POUR = `Sign-off pour ${stamp}`;

test("an admin cannot release a pour, and the pour form offers no status", async ({ page }) => {
  const fx = await makePourFixture(`Admin check ${stamp}`, [`AD-${stamp}`]);
  const crew = await apiAs(PEOPLE.crew);
  expect((await pushEndA(crew, fx, fx.tendons[0]!.id, 1.0)).result).toMatchObject({ status: "applied" });
  const admin = await apiAs(PEOPLE.admin);
  const refused = await admin.post(`/api/projects/${fx.projectId}/pours/${fx.pourId}/release`, {
    data: {
      statement: "The admin tries to release this pour.",
      signerName: "Site Admin",
      licence: "none (admin)",
      confirmed: true,
    },
  });
  expect(refused.status()).toBe(403);
  const status = await admin.patch(`/api/projects/${fx.projectId}/pours/${fx.pourId}`, {
    data: { name: fx.pourName, level: null, areaM2: null, plannedStressingDate: null, status: "released" },
  });
  expect(status.status()).toBe(422);
  expect(((await status.json()) as { error: { fields: Record<string, string[]> } }).error.fields.status?.[0]).toMatch(
    /follows from its records/,
  );
  const [state] = await queryDemo<{ status: string }>("select status from pour_states where pour_id = $1", [fx.pourId]);
  expect(state!.status).toBe("stressed");

  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/home/);
  await page.goto(`/projects/${fx.projectId}/pours`);
  const form = page.locator("form").filter({ hasText: "Add a pour" });
  await expect(form).toContainText("released only by the release the engineer signs");
  await expect(form.getByLabel("Status")).toHaveCount(0);
  await expect(page.getByRole("row").filter({ hasText: fx.pourName })).toContainText("stressed");
  await screenshot(page, "pours-status-derived");
  await crew.dispose();
  await admin.dispose();
});

test("a released pour refuses a new record and a new tendon until the engineer reopens it", async ({ browser }) => {
  test.setTimeout(120_000);
  const fx = await makePourFixture(POUR, [`RL-${stamp}-1`, `RL-${stamp}-2`]);
  const crewApi = await apiAs(PEOPLE.crew);
  for (const t of fx.tendons)
    expect((await pushEndA(crewApi, fx, t.id, 1.0)).result).toMatchObject({ status: "applied" });

  // The engineer releases: the statement must be ticked as their own, then confirmed.
  const engineerCtx = await browser.newContext();
  const engineer = await engineerCtx.newPage();
  await signInWithPassword(engineer, PEOPLE.engineer);
  await engineer.waitForURL(/\/home/);
  await engineer.goto("/decisions");
  const card = engineer.locator(`[data-pour="${POUR}"]`);
  await expect(card.getByTestId("pour-status")).toHaveText("Stressed: every end recorded");
  await card.getByRole("button", { name: `Release ${POUR}` }).click();
  await expect(card.getByRole("button", { name: `Yes, release ${POUR}` })).toBeDisabled();
  await card.getByLabel(/Release statement/).fill(`Both tendons of ${POUR} in band on the day; tails may be cut.`);
  await card.getByLabel("Your name, as you sign").fill("Priya Raman");
  await card.getByLabel("Licence number").fill("PE 000000 (invented)");
  await card.getByRole("checkbox", { name: /it is my own/ }).check();
  await card.getByRole("button", { name: `Release ${POUR}` }).click();
  await screenshot(engineer, "release-confirm");
  await card.getByRole("button", { name: `Yes, release ${POUR}` }).click();
  await expect(card).toContainText("Released by Priya Raman, P.E.");
  await expect(card).toContainText("in band on the day");
  await expect(card.getByTestId("release-signature")).toContainText(
    /Signed by Priya Raman, licence PE 000000 \(invented\)\. Report sha256 at signing: [0-9a-f]{64}/,
  );
  await screenshot(engineer, "release-signed");

  // The server refuses a record and a tendon for the released pour.
  const [{ n: before }] = (await queryDemo<{ n: string }>("select count(*) as n from records where pour_id = $1", [
    fx.pourId,
  ])) as [{ n: string }];
  const late = await pushEndA(crewApi, fx, fx.tendons[0]!.id, 1.0);
  expect(late.httpStatus).toBe(200);
  expect(late.result).toMatchObject({
    status: "rejected",
    error: { code: "RELEASED", message: expect.stringMatching(/released: it takes no new record/) },
  });
  const [{ n: after }] = (await queryDemo<{ n: string }>("select count(*) as n from records where pour_id = $1", [
    fx.pourId,
  ])) as [{ n: string }];
  expect(after).toBe(before);
  const admin = await apiAs(PEOPLE.admin);
  const tendon = await admin.post(`/api/projects/${fx.projectId}/pours/${fx.pourId}/tendons`, {
    data: tendonBody(`RL-${stamp}-3`),
  });
  expect(tendon.status()).toBe(409);
  expect(((await tendon.json()) as { error: { message: string } }).error.message).toMatch(/released/);

  // The crew's tablet shows the release and offers no record form.
  const crewCtx = await browser.newContext();
  const crew = await crewCtx.newPage();
  await signInWithPassword(crew, PEOPLE.crew);
  await crew.waitForURL(/\/home/);
  await crew.goto("/field");
  await crew.getByTestId("available-pour").filter({ hasText: POUR }).getByRole("button").click();
  const ready = crew.getByTestId("ready-pour").filter({ hasText: POUR });
  await expect(ready.getByTestId("pour-released")).toBeVisible();
  await ready.getByRole("link", { name: "Open tendon list" }).click();
  await expect(crew.getByTestId("pour-frozen")).toContainText("Released by Priya Raman, P.E.");
  await crew.getByTestId("tendon-row").filter({ hasText: fx.tendons[0]!.tag }).click();
  await expect(crew.getByTestId("record-refused")).toBeVisible();
  await expect(crew.getByRole("form", { name: "New record" })).toHaveCount(0);
  await expect(crew.getByRole("button", { name: "Record a restress" })).toHaveCount(0);
  await expect(crew.getByRole("button", { name: "Correct" })).toHaveCount(0);
  await screenshot(crew, "field-pour-released");

  // The engineer reopens it with a reason; the tablet shows it reopened and records again.
  await engineer.reload();
  await card.getByText("Reopen this pour…").click();
  await card
    .getByLabel("Why the pour is reopened")
    .fill("Lift-off check wanted on the first tendon after the site visit.");
  await card.getByRole("checkbox", { name: /it is my own/ }).check();
  await card.getByRole("button", { name: `Reopen ${POUR}` }).click();
  await card.getByRole("button", { name: `Yes, reopen ${POUR}` }).click();
  await expect(card.getByTestId("pour-reopened")).toContainText("Lift-off check wanted");
  await expect(card.getByTestId("pour-status")).toHaveText("Stressed: every end recorded");
  await screenshot(engineer, "decisions-reopened");
  const [audit] = await queryDemo<{ n: string }>(
    "select count(*) as n from audit_events where action = 'pour.reopen' and target = $1",
    [fx.pourId],
  );
  expect(Number(audit!.n)).toBe(1);

  await crew.goto("/field");
  await ready.getByRole("button", { name: "Refresh now" }).click();
  await expect(ready.getByTestId("pour-reopened")).toContainText("Lift-off check wanted");
  await expect(ready.getByTestId("pour-released")).toHaveCount(0);
  await ready.getByRole("link", { name: "Open tendon list" }).click();
  await expect(crew.getByTestId("pour-reopened")).toContainText("Reopened by Priya Raman, P.E.");
  await crew.getByTestId("tendon-row").filter({ hasText: fx.tendons[0]!.tag }).click();
  await expect(crew.getByRole("button", { name: "Record a restress" })).toBeVisible();
  await screenshot(crew, "field-pour-reopened");

  await engineerCtx.close();
  await crewCtx.close();
  await crewApi.dispose();
  await admin.dispose();
});
