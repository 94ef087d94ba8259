import { expect, test } from "@playwright/test";
import { PEOPLE, queryDemo, signInWithPassword } from "./people";
import { screenshot } from "./support";

// The inspector signs from the tablet, in portrait (800×1280) and landscape (1280×800): without
// signal the page says signing waits for it; with signal the day's special-inspection report is
// signed (what was witnessed per pour or member, not in conformance with the open exceptions, the
// typed name, licence and statement, one confirmation), then a pour's stressing report of that day.
// Signs the demo's day of last week, when only L2 Pour 1 was stressed, and that pour's stressing
// report: no other spec signs either (daily-report.spec.ts signs the latest day, signed-report.spec.ts
// a pour of its own), so this passes alone and in any order.

test("the inspector signs the day's report and a pour's stressing report on the tablet, online only", async ({
  page,
  context,
}) => {
  test.setTimeout(150_000);
  // The day the demo's L2 Pour 1 was stressed, in the project's zone.
  const [row] = await queryDemo<{ day: string; pourName: string; pourId: string }>(
    `select distinct to_char(r.device_time at time zone p.time_zone, 'YYYY-MM-DD') as day, po.name as "pourName", po.id as "pourId"
       from records r join projects p on p.id = r.project_id join pours po on po.id = r.pour_id
      where p.code = 'AYP' and po.name = 'L2 Pour 1'`,
  );
  expect(row).toBeTruthy();
  const { day, pourName } = row!;
  const [signedBefore] = await queryDemo<{ n: string }>(
    `select coalesce(max(revision), 0)::text as n from report_revisions v join projects p on p.id = v.project_id
      where p.code = 'AYP' and v.report_day = $1`,
    [day],
  );
  const next = Number(signedBefore!.n) + 1;

  await page.setViewportSize({ width: 800, height: 1280 });
  await signInWithPassword(page, PEOPLE.inspector);
  await page.waitForURL(/\/home/);
  await page.goto("/field");
  await page.getByRole("link", { name: /Sign reports/ }).click();
  await page.waitForURL(/\/field\/sign/);

  // The screen itself is loaded before the signal goes: its code arrives after the page's first
  // paint (the placeholder has the same heading), and this first visit has no offline worker yet.
  await expect(page.getByTestId("field-daily-state")).toBeVisible({ timeout: 30_000 });
  // No signal: a clear word, no form.
  await context.setOffline(true);
  await expect(page.getByTestId("sign-offline")).toContainText("No connection: signing needs the server");
  await expect(page.getByRole("form")).toHaveCount(0);
  await screenshot(page, "field-sign-offline-portrait");
  await context.setOffline(false);

  await page.getByLabel(/^Day/).fill(day);
  await expect(page.getByRole("heading", { name: `Daily special-inspection report: ${day}` })).toBeVisible();
  const form = page.getByRole("form", { name: `Sign the daily inspection report of ${day}` });
  const groups = form.locator("[data-witness-group]");
  await expect(groups.first()).toBeVisible();
  const count = await groups.count();
  await groups.first().getByLabel("In part").check();
  await groups
    .first()
    .getByLabel("Which part, or why not")
    .fill("From the east edge only; west ends seen after lock-off");
  for (let i = 1; i < count; i++) await groups.nth(i).getByLabel("In full").check();
  await form.getByLabel("The work was not in conformance").check();
  await form.getByLabel("Your remarks for the day").fill("Signed on the tablet at the slab edge.");
  await form.getByLabel("Licence or certification number").fill("ICC special inspector 5551234 (demo)");
  await screenshot(page, "field-sign-daily-portrait");
  await form.getByRole("button", { name: `Sign revision ${next} of ${day}` }).click();
  const dialog = page.getByRole("dialog", { name: `Sign revision ${next} of ${day}?` });
  await expect(dialog).toContainText("that the work was NOT in conformance");
  await screenshot(page, "field-sign-confirm-portrait");
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(page.getByTestId("field-daily-state")).toHaveText(
    `The report as it stands is signed: revision ${next}.`,
    {
      timeout: 30_000,
    },
  );
  const [stored] = await queryDemo<{ attestation: { conformance: string; witness: { extent: string }[] } }>(
    `select attestation from report_revisions v join projects p on p.id = v.project_id
      where p.code = 'AYP' and v.report_day = $1 and v.revision = $2`,
    [day, next],
  );
  expect(stored!.attestation.conformance).toBe("not_conforming");
  expect(stored!.attestation.witness.map((w) => w.extent)).toEqual(["part", ...Array(count - 1).fill("full")]);

  // The pour's stressing report, in landscape.
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.getByRole("group", { name: "Pours worked that day" }).getByRole("button", { name: pourName }).click();
  await expect(page.getByTestId("field-pour-state")).toHaveText(
    `The stressing report of ${pourName} is not signed yet.`,
  );
  const pourForm = page.getByRole("form", { name: `Sign the stressing report of ${pourName}` });
  await pourForm.getByLabel("Licence or certification number").fill("ICC special inspector 5551234 (demo)");
  await pourForm.scrollIntoViewIfNeeded();
  await screenshot(page, "field-sign-pour-landscape");
  await pourForm.getByRole("button", { name: "Sign revision 1" }).click();
  await page
    .getByRole("dialog", { name: `Sign revision 1 of the stressing report of ${pourName}?` })
    .getByRole("button", { name: "Sign", exact: true })
    .click();
  await expect(page.getByTestId("field-pour-state")).toHaveText(
    `The stressing report of ${pourName} as it stands is signed: revision 1.`,
    {
      timeout: 30_000,
    },
  );
  await expect(pourForm).toHaveCount(0);
  await screenshot(page, "field-sign-pour-signed-landscape");
});

test("the crew is told only the inspector signs", async ({ page }) => {
  await page.setViewportSize({ width: 800, height: 1280 });
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home/);
  await page.goto("/field/sign");
  await expect(page.getByText("Only the special inspector signs reports")).toBeVisible();
  await expect(page.getByRole("form")).toHaveCount(0);
});
