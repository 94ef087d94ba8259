import { expect, test } from "@playwright/test";
import { PEOPLE, pourIdByName, queryDemo, signInWithPassword } from "./people";
import { screenshot } from "./support";

// The engineer opens a stressed pour's insight page from the decisions page, sees the charts and
// the per-set table, and downloads the stressing report as PDF and CSV. Reads the demo seed's
// records on "L2 Pour 1"; writes nothing.

test("the engineer reads a pour's insight and downloads its stressing report", async ({ page }) => {
  const pourId = await pourIdByName("L2 Pour 1");
  const [evaluated] = await queryDemo<{ n: string }>(
    "select count(distinct evaluations.tendon_id) as n from evaluations join tendons on tendons.id = evaluations.tendon_id where tendons.pour_id = $1",
    [pourId],
  );
  expect(Number(evaluated?.n), "the demo seed stresses L2 Pour 1").toBeGreaterThan(0);

  await signInWithPassword(page, PEOPLE.engineer);
  await page.waitForURL(/\/home/);
  await page.goto("/decisions");
  await page.locator('[data-pour="L2 Pour 1"]').getByRole("link", { name: "Charts, insight and report" }).click();
  await page.waitForURL(new RegExp(`/pours/${pourId}/insight$`));

  await expect(page.getByRole("heading", { name: /L2 Pour 1: what the records show/ })).toBeVisible();
  for (const chart of ["deviation", "measured-predicted", "progress"]) {
    await expect(page.locator(`[data-chart="${chart}"] svg.recharts-surface`).first()).toBeVisible();
  }
  // Marks drawn for the tendons, the band lines, and verdict shapes named in the legend.
  await expect(page.locator('[data-chart="deviation"] .recharts-scatter-symbol').first()).toBeVisible();
  await expect(page.locator('[data-chart="deviation"]').getByText("In band (circle)")).toBeVisible();
  await expect(page.getByRole("table").filter({ hasText: "Equipment set" }).first()).toBeVisible();
  await expect(page.getByRole("note", { name: "Caution" })).toBeVisible();
  // The demo job is a US one: the apparent and mill moduli read in ksi (its B01–B06 were read at gauge steps).
  const moduli = page.locator('[data-table="modulus"]');
  await expect(moduli).toContainText(/\d{2},\d{3} ksi/);
  await expect(moduli).not.toContainText("MPa");
  await screenshot(page, "report-insight-landscape");
  await page.setViewportSize({ width: 800, height: 1280 });
  await page.waitForTimeout(300);
  await screenshot(page, "report-insight-portrait");
  await page.setViewportSize({ width: 1280, height: 800 });

  const pdfLink = page.getByRole("link", { name: "Stressing report (PDF)" });
  const csvLink = page.getByRole("link", { name: "Records as CSV" });
  const pdf = await page.request.get((await pdfLink.getAttribute("href"))!);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  expect(pdf.headers()["content-disposition"]).toMatch(/attachment; filename="AYP-L2-Pour-1-stressing-report\.pdf"/);
  expect((await pdf.body()).subarray(0, 4).toString()).toBe("%PDF");

  const csv = await page.request.get((await csvLink.getAttribute("href"))!);
  expect(csv.status()).toBe(200);
  expect(csv.headers()["content-type"]).toMatch(/^text\/csv/);
  expect(csv.headers()["content-disposition"]).toMatch(/filename="AYP-L2-Pour-1-stressing-report\.csv"/);
  expect(await csv.text()).toMatch(/^Project,Pour,Section,Tendon,/);

  const unknown = await page.request.get(
    pdfLink &&
      `/api/projects/${page.url().split("/projects/")[1]!.split("/")[0]}/pours/00000000-0000-4000-8000-000000000000/report/csv`,
  );
  expect(unknown.status()).toBe(404);

  // The browser's own download through the button carries the same file name.
  const [download] = await Promise.all([page.waitForEvent("download"), csvLink.click()]);
  expect(download.suggestedFilename()).toBe("AYP-L2-Pour-1-stressing-report.csv");
});

test("the crew sees the insight but no report buttons and may not download it; an unknown pour is not found", async ({
  page,
}) => {
  const pourId = await pourIdByName("L2 Pour 1");
  const [project] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/(home|field)/);
  await page.goto(`/projects/${project!.id}/pours/${pourId}/insight`);
  await expect(page.getByRole("heading", { name: /L2 Pour 1: what the records show/ })).toBeVisible();
  await expect(page.getByRole("link", { name: "Stressing report (PDF)" })).toHaveCount(0);
  // The crew may not download the report at all.
  const refused = await page.request.get(`/api/projects/${project!.id}/pours/${pourId}/report/pdf`);
  expect(refused.status()).toBe(403);
  // The pour is checked above the page's loading state, so the answer is a real 404 inside the navigation.
  const missing = await page.goto(`/projects/${project!.id}/pours/00000000-0000-4000-8000-000000000000/insight`);
  expect(missing?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: /^There is no .+ at this address\.$/ })).toBeVisible();
});
