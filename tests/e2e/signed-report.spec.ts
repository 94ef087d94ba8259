import { expect, test } from "@playwright/test";
import { PEOPLE, apiAs, signInWithPassword } from "./people";
import { makePourFixture, pushEndA } from "./pour-fixture";
import { screenshot } from "./support";

// The inspector signs the stressing report of a pour from its page, downloads the signed PDF, and a
// building official with no account checks the file on /verify: the signed file matches, an altered
// copy does not. The pour, two tendons stressed in band, is made for this spec.

const stamp = Date.now().toString(36);
const POUR = `Signed report ${stamp}`;

test("the inspector signs a pour's stressing report and anyone can check the signed file", async ({
  page,
  browser,
}) => {
  const fx = await makePourFixture(POUR, [`SR-${stamp}-1`, `SR-${stamp}-2`]);
  const crew = await apiAs(PEOPLE.crew);
  for (const t of fx.tendons) expect((await pushEndA(crew, fx, t.id, 1.0)).result).toMatchObject({ status: "applied" });
  await crew.dispose();
  await signInWithPassword(page, PEOPLE.inspector);
  await page.waitForURL(/\/home/);
  await page.goto(`/projects/${fx.projectId}/pours/${fx.pourId}/insight`);
  await expect(page.getByTestId("signature-state")).toHaveText("The report is not signed yet.");

  const form = page.getByRole("form", { name: `Sign the stressing report of ${POUR}` });
  // Without a licence number the server names the field and signs nothing.
  await form.getByLabel("Licence or certification number").fill("");
  const confirm = () =>
    page
      .getByRole("dialog", { name: /^Sign revision 1 of the stressing report/ })
      .getByRole("button", { name: "Sign", exact: true })
      .click();
  await form.getByRole("button", { name: "Sign revision 1" }).click();
  await confirm();
  await expect(form.locator("#sign-licence-error")).toContainText("licence or certification number");
  await form.getByLabel("Licence or certification number").fill("ICC special inspector 5551234 (demo)");
  await screenshot(page, "report-sign-form");
  await form.getByRole("button", { name: "Sign revision 1" }).click();
  await confirm();
  await expect(page.getByTestId("signature-state")).toHaveText("The report as it stands is signed: revision 1.", {
    // Signing draws the report twice and stores it; on a busy CI machine that takes a while.
    timeout: 30_000,
  });
  await expect(page.getByRole("list", { name: "Signed revisions" })).toContainText(
    "ICC special inspector 5551234 (demo)",
  );
  await screenshot(page, "report-signed");

  const href = await page.getByRole("link", { name: "Signed PDF, revision 1" }).getAttribute("href");
  const signed = await page.request.get(href!);
  expect(signed.status()).toBe(200);
  const bytes = await signed.body();
  expect(bytes.subarray(0, 5).toString()).toBe("%PDF-");

  // A reader with no account checks the file.
  const visitor = await browser.newContext();
  const check = await visitor.newPage();
  await check.goto("/verify");
  await check
    .getByLabel("Report file (PDF)")
    .setInputFiles({ name: "report.pdf", mimeType: "application/pdf", buffer: bytes });
  await expect(check.getByRole("status")).toContainText(`Matches revision 1 of the stressing report of ${POUR}`);
  await expect(check.getByRole("status")).toContainText("It is the latest signed revision.");
  await screenshot(check, "report-verify-match");
  const altered = Buffer.from(bytes);
  altered[altered.length - 20] = altered[altered.length - 20]! ^ 1;
  await check
    .getByLabel("Report file (PDF)")
    .setInputFiles({ name: "altered.pdf", mimeType: "application/pdf", buffer: altered });
  await expect(check.getByRole("alert").filter({ hasText: "Not a signed revision." })).toBeVisible();
  await screenshot(check, "report-verify-no-match");

  // A second stressing of the first tendon changes the report; once revision 2 is signed, the
  // revision 1 file still matches but is said to be superseded by revision 2.
  const crewAgain = await apiAs(PEOPLE.crew);
  expect((await pushEndA(crewAgain, fx, fx.tendons[0]!.id, 1.0)).result).toMatchObject({ status: "applied" });
  await crewAgain.dispose();
  const inspector = await apiAs(PEOPLE.inspector);
  const second = await inspector.post(`/api/projects/${fx.projectId}/pours/${fx.pourId}/report/signatures`, {
    data: {
      signerName: "Mei Lindqvist",
      licence: "ICC special inspector 5551234 (demo)",
      statement: "I inspected the stressing of the tendons listed in this report.",
    },
  });
  expect(second.status()).toBe(201);
  expect(await second.json()).toMatchObject({ revision: 2 });
  await inspector.dispose();
  await check
    .getByLabel("Report file (PDF)")
    .setInputFiles({ name: "report.pdf", mimeType: "application/pdf", buffer: bytes });
  const superseded = check.getByRole("alert").filter({ hasText: "Matches revision 1" });
  await expect(superseded).toContainText(`Matches revision 1 of the stressing report of ${POUR}`);
  await expect(superseded).toContainText("Superseded: revision 2 has been signed since");
  await screenshot(check, "report-verify-superseded");
  await visitor.close();
});
