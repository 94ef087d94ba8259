import { expect, test } from "@playwright/test";
import Papa from "papaparse";
import { randomUUID } from "node:crypto";
import { uuidv7 } from "uuidv7";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";
import { makePourFixture, pushEndA, typedReading } from "./pour-fixture";
import { screenshot } from "./support";

// The spec stresses a pour of its own today and has a lift-off check made on it through the API
// (the engineer's order, the crew's push), so the day lists one.
// The inspector opens the day of the demo project's latest stressing, reads the summary, writes
// remarks and signs, then downloads the signed PDF, the PDF as it stands and the CSV. Then the
// remarks change and the day is signed again as revision 2. Writes two signed revisions of that day,
// today (the demo stresses L2 Pour 2 today): no other spec signs it (field-signing.spec.ts signs
// last week's day), so this passes alone and in any order; the day's counts are read here.

test("the inspector signs a day's special-inspection report and downloads its PDF and CSV", async ({ page }) => {
  test.setTimeout(300_000);
  // A pour of this spec's own, stressed today and read short: the engineer orders a lift-off check
  // and the crew's tablet sends it, so today's report has a lift-off check to list.
  const stamp = Date.now().toString(36);
  const fx = await makePourFixture(`Daily lift-off ${stamp}`, [`DL-${stamp}`]);
  const crewApi = await apiAs(PEOPLE.crew);
  expect((await pushEndA(crewApi, fx, fx.tendons[0]!.id, 0.85)).result).toMatchObject({ status: "applied" });
  const [flag] = await queryDemo<{ id: string }>("select id from flags where tendon_id = $1 and kind = 'out_of_band'", [
    fx.tendons[0]!.id,
  ]);
  const ordered = await (
    await apiAs(PEOPLE.engineer)
  ).post(`/api/projects/${fx.projectId}/flags/${flag!.id}/dispositions`, {
    data: {
      decision: "liftoff_check",
      reasons: "Short: check the force at the live end by lift-off and report the gauge pressure.",
      licenceStatement: "Licensed professional engineer (test)",
    },
  });
  expect(ordered.status()).toBe(201);
  const { dispositionId } = (await ordered.json()) as { dispositionId: string };
  const pushed = await crewApi.post("/api/sync/push", {
    data: {
      deviceId: "daily-report-tablet",
      ops: [
        {
          opId: randomUUID(),
          kind: "liftoff_check",
          recordId: uuidv7(),
          payload: {
            projectId: fx.projectId,
            pourId: fx.pourId,
            tendonId: fx.tendons[0]!.id,
            dispositionId,
            tendonEnd: "A",
            equipmentSetId: fx.setId,
            // The gauge pressure of the stressing itself: within the calibrated range.
            pressure: typedReading(fx, 1).psi,
            pressureUnit: "psi",
            checkedAt: new Date().toISOString(),
            authorUserId: fx.crewId,
          },
        },
      ],
    },
  });
  expect(((await pushed.json()) as { results: { status: string }[] }).results[0]).toMatchObject({ status: "applied" });

  const [row] = await queryDemo<{ projectId: string; day: string; tags: string }>(
    `select p.id as "projectId",
            to_char(r.device_time at time zone p.time_zone, 'YYYY-MM-DD') as day,
            count(*)::text as tags
       from records r join projects p on p.id = r.project_id
      where p.code = 'AYP'
      group by p.id, 2
      order by 2 desc
      limit 1`,
  );
  const { projectId, day } = row!;
  // The lift-off checks and detensions made that day (other specs may make some today): the CSV
  // lists them among the stressing rows, in the stressing report's words.
  const [events] = await queryDemo<{ liftoffs: string; detensions: string }>(
    `select (select count(*) from liftoff_checks l
              where l.project_id = p.id
                and to_char(l.checked_at at time zone p.time_zone, 'YYYY-MM-DD') = $2)::text as liftoffs,
            (select count(*) from detensions d
              where d.project_id = p.id
                and to_char(d.detensioned_at at time zone p.time_zone, 'YYYY-MM-DD') = $2)::text as detensions
       from projects p where p.id = $1`,
    [projectId, day],
  );
  await page.setViewportSize({ width: 1440, height: 900 });
  await signInWithPassword(page, PEOPLE.inspector);
  await page.waitForURL(/\/home/);
  await page
    .getByRole("link", { name: /write and sign the day's report/ })
    .first()
    .click();
  await page.waitForURL(/\/daily/);

  // A day not yet begun is refused with the field named, and nothing is shown for it.
  await page.goto(`/projects/${projectId}/daily?day=2999-01-01`);
  await expect(page.locator("#report-day-error")).toContainText("That day has not begun yet");

  await page.getByLabel("Day", { exact: true }).fill(day);
  await page.getByRole("button", { name: "Show the day" }).click();
  // The page draws every pour worked that day, and other specs stress pours of their own today:
  // after a whole run it takes several seconds on a busy machine.
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Daily special-inspection report: ${day}`, {
    timeout: 30_000,
  });
  await expect(page.getByTestId("daily-summary")).toContainText(`${row!.tags} stressing record`);
  await expect(page.getByRole("table")).toContainText("marks on the strand");
  // Every column, the verdict last, stands in the page's width: each pour heads its own rows and the
  // time is shown without the day the page is about.
  const fits = await page
    .getByRole("table")
    .evaluate((table) => ({ table: table.scrollWidth, box: table.parentElement!.clientWidth }));
  expect(fits.table, "the day's table is no wider than its box").toBeLessThanOrEqual(fits.box);
  await expect(page.locator('th[scope="rowgroup"]').first()).toBeVisible();
  await expect(page.getByRole("table")).not.toContainText(`${day} `);
  // This spec's lift-off check, in the stressing report's words, in its pour's rows.
  const liftoffRow = page
    .getByRole("row")
    .filter({ hasText: `DL-${stamp}` })
    .filter({ hasText: "Lift-off check" });
  await expect(liftoffRow).toContainText(/Lift-off check \(ordered by disposition D-\d{4}\)/);
  await expect(liftoffRow).toContainText(/Lift-off (within|outside) the ±\d+ % band/);
  await expect(page.getByTestId("daily-summary")).toContainText(/\d+ lift-off checks? \(/);
  await liftoffRow.scrollIntoViewIfNeeded();
  await screenshot(page, "daily-report-liftoff");
  await expect(page.getByRole("note", { name: "Caution" })).toContainText("engineer of record");
  await expect(page.getByTestId("daily-signature-state")).toHaveText(`The report of ${day} is not signed yet.`);

  const form = page.getByRole("form", { name: `Sign the daily inspection report of ${day}` });
  const confirm = async () => {
    const dialog = page.getByRole("dialog", { name: /^Sign revision/ });
    await expect(dialog).toBeVisible();
    await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  };
  await form
    .getByLabel("Your remarks for the day")
    .fill("Witnessed the stressing from the east slab edge; barricades up.");
  // Without a licence number, a statement of conformance or what was witnessed, the server names
  // each field and signs nothing.
  await form.getByRole("button", { name: `Sign revision 1 of ${day}` }).click();
  await confirm();
  await expect(form.locator("#daily-sign-licence-error")).toContainText("licence or certification number");
  await expect(form.locator("#daily-conformance-error")).toContainText("Choose whether the work was in conformance");
  await expect(form.locator("#daily-witness-0-extent-error")).toContainText("Choose witnessed in full");
  await expect(page.getByTestId("daily-signature-state")).toHaveText(`The report of ${day} is not signed yet.`);

  await form.getByLabel("Licence or certification number").fill("ICC special inspector 5551234 (demo)");
  const groups = form.locator("[data-witness-group]");
  const groupCount = await groups.count();
  expect(groupCount).toBeGreaterThan(0);
  for (let i = 0; i < groupCount; i++) await groups.nth(i).getByLabel("In full").check();
  await form.getByLabel("The work was not in conformance").check();
  await screenshot(page, "daily-report-form");
  await form.getByRole("button", { name: `Sign revision 1 of ${day}` }).click();
  await screenshot(page, "daily-report-confirm");
  await confirm();
  await expect(page.getByTestId("daily-signature-state")).toHaveText(
    `The report of ${day} as it stands is signed: revision 1.`,
    { timeout: 30_000 },
  );
  await expect(page.getByTestId("daily-conformance")).toContainText("WAS NOT IN CONFORMANCE");
  await screenshot(page, "daily-report-signed");

  const signedHref = await page.getByRole("link", { name: "Signed PDF, revision 1" }).getAttribute("href");
  const signed = await page.request.get(signedHref!);
  expect(signed.status()).toBe(200);
  expect((await signed.body()).subarray(0, 5).toString()).toBe("%PDF-");

  const pdf = await page.request.get(`/api/projects/${projectId}/daily-reports/${day}/pdf`);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-disposition"]).toContain(`${day}-daily-inspection.pdf`);
  expect((await pdf.body()).subarray(0, 5).toString()).toBe("%PDF-");

  const csv = await page.request.get(`/api/projects/${projectId}/daily-reports/${day}/csv`);
  expect(csv.status()).toBe(200);
  const table = Papa.parse<Record<string, string>>(await csv.text(), { header: true, skipEmptyLines: true });
  expect(table.errors).toEqual([]);
  const stressing = table.data.filter((r) => r.Section === "stressing");
  expect(stressing).toHaveLength(Number(row!.tags) + Number(events!.liftoffs) + Number(events!.detensions));
  expect(stressing.filter((r) => r.Stressing?.startsWith("Lift-off check (ordered by disposition D-"))).toHaveLength(
    Number(events!.liftoffs),
  );
  expect(stressing.filter((r) => r.Stressing?.startsWith("Detension (ordered by disposition D-"))).toHaveLength(
    Number(events!.detensions),
  );
  expect(table.data.find((r) => r.Section === "remarks")?.Details).toBe(
    "Witnessed the stressing from the east slab edge; barricades up.",
  );
  const witness = table.data.filter((r) => r.Section === "witness");
  expect(witness).toHaveLength(groupCount);
  for (const w of witness) expect(w.Details).toContain("witnessed in full by Mei Lindqvist");
  expect(table.data.find((r) => r.Section === "conformance")?.Details).toMatch(/WAS NOT IN CONFORMANCE/);
  // The CSV of the signed content carries its signature: the content hash and the revision.
  const signature = table.data.filter((r) => r.Section === "signature").map((r) => r.Details);
  expect(signature).toContain("Revision: 1");
  expect(signature.join("\n")).toMatch(/^Content sha256: [0-9a-f]{64}$/m);

  // New remarks are a change: revision 2, which says what changed.
  await form
    .getByLabel("Your remarks for the day")
    .fill("Witnessed the stressing from the east slab edge; rain after noon.");
  await form.getByLabel("Licence or certification number").fill("ICC special inspector 5551234 (demo)");
  await form.getByLabel("The work was not in conformance").check();
  await form.getByRole("button", { name: `Sign revision 2 of ${day}` }).click();
  await confirm();
  await expect(page.getByTestId("daily-signature-state")).toHaveText(
    `The report of ${day} as it stands is signed: revision 2.`,
    { timeout: 30_000 },
  );
  await expect(page.getByRole("list", { name: "Signed revisions" })).toContainText("remarks:");
});

test("the crew cannot open the day's report", async ({ page }) => {
  const [row] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home/);
  const response = await page.goto(`/projects/${row!.id}/daily`);
  expect(response?.status()).toBe(404);
  const pdf = await page.request.get(`/api/projects/${row!.id}/daily-reports/2026-12-01/pdf`);
  expect(pdf.status()).toBe(403);
});
