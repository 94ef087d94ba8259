import { expect, test, type APIRequestContext } from "@playwright/test";
import { randomUUID } from "node:crypto";
import { uuidv7 } from "uuidv7";
import { pressureForForce } from "@/lib/elongation";
import { predictTendon, type ProjectBasis, type TendonBasis } from "@/lib/stressing/basis";
import { formatLength, MM_PER_INCH, MPA_PER_PSI, parseLength, parsePressure } from "@/lib/units";
import { screenshot } from "./support";
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
const PSI_PER_MPA = 1 / MPA_PER_PSI;

interface Fixture {
  projectId: string;
  pourId: string;
  tendonId: string;
  crewId: string;
  setId: string;
  calibrationId: string;
  line: { slope: number; intercept: number };
  project: ProjectBasis;
  tendon: TendonBasis;
  lot: { areaMm2: number; modulusMPa: number; breakingLoadN: number } | null;
}

async function makeFixture(): Promise<Fixture> {
  const [project] = await queryDemo<Record<string, never>>("select * from projects where code = 'AYP'");
  const p = project as unknown as Record<string, unknown>;
  const [template] = await queryDemo<Record<string, unknown>>(
    "select * from tendons where project_id = $1 and tag = '2-1-U01'",
    [p.id],
  );
  const [pour] = await queryDemo<{ id: string }>(
    "insert into pours (project_id, name, level, concrete_strength_mpa, concrete_confirmed_at, planned_stressing_date) values ($1, $2, 'Level 2', 25, now(), current_date) returning id",
    [p.id, POUR],
  );
  const [tendon] = await queryDemo<{ id: string }>(
    `insert into tendons (project_id, pour_id, tag, kind, strand_size, strand_count, segments, ends, jack_grip_mm, strand_lot_id)
     values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10) returning id`,
    [
      p.id,
      pour!.id,
      TAG,
      template!.kind,
      template!.strand_size,
      template!.strand_count,
      JSON.stringify(template!.segments),
      template!.ends,
      template!.jack_grip_mm,
      template!.strand_lot_id,
    ],
  );
  const [lot] = await queryDemo<{ area_mm2: number; modulus_mpa: number; breaking_load_n: number }>(
    "select * from strand_lots where id = $1",
    [template!.strand_lot_id],
  );
  const [set] = await queryDemo<{ id: string; calibration_id: string; slope_n_per_mpa: number; intercept_n: number }>(
    `select s.id, c.id as calibration_id, c.slope_n_per_mpa, c.intercept_n from equipment_sets s join calibrations c on c.equipment_set_id = s.id
     where s.project_id = $1 order by s.name limit 1`,
    [p.id],
  );
  const [crew] = await queryDemo<{ id: string }>("select id from users where email = $1", [PEOPLE.crew]);
  return {
    projectId: p.id as string,
    pourId: pour!.id,
    tendonId: tendon!.id,
    crewId: crew!.id,
    setId: set!.id,
    calibrationId: set!.calibration_id,
    line: { slope: set!.slope_n_per_mpa, intercept: set!.intercept_n },
    project: {
      tolerancePct: p.tolerance_pct as number,
      shortTendonFloorMm: p.short_tendon_floor_mm as number | null,
      comparisonBasis: p.comparison_basis as "gross" | "net",
      countJackGrip: p.count_jack_grip as boolean,
      frictionMu: p.friction_mu as number,
      wobblePerM: p.wobble_per_m as number,
      anchorSetMm: p.anchor_set_mm as number,
    },
    tendon: {
      strandSize: template!.strand_size as string,
      strandCount: template!.strand_count as number,
      segments: template!.segments as TendonBasis["segments"],
      ends: template!.ends as TendonBasis["ends"],
      jackGripMm: template!.jack_grip_mm as number | null,
    },
    lot: lot ? { areaMm2: lot.area_mm2, modulusMPa: lot.modulus_mpa, breakingLoadN: lot.breaking_load_n } : null,
  };
}

/** Pushes one record, typed as the crew would type it, through the tablet's sync route. */
async function pushRecord(crew: APIRequestContext, fx: Fixture, factor: number, minutesAgo: number) {
  const predicted = predictTendon({ project: fx.project, tendon: fx.tendon, lot: fx.lot });
  const psi = String(Math.floor((pressureForForce(fx.line, predicted.jackingForceN) * PSI_PER_MPA) / 50) * 50);
  const after = formatLength(2 * MM_PER_INCH + predicted.predictedMm * factor, "1/8 in").replace(/ in$/, "");
  const measuredMm =
    parseLength(after, { field: "marksAfter", system: "US", defaultUnit: "in" }) -
    parseLength("2", { field: "marksBefore", system: "US", defaultUnit: "in" });
  const id = uuidv7();
  const payload = {
    projectId: fx.projectId,
    pourId: fx.pourId,
    tendonId: fx.tendonId,
    tendonEnd: "A",
    chainId: id,
    revision: 1,
    baseRecordId: null,
    revisionReason: null,
    equipmentSetId: fx.setId,
    calibrationId: fx.calibrationId,
    expiredCalibrationReason: null,
    initialPressureMPa: null,
    finalPressureMPa: parsePressure(psi, { field: "finalPressure", system: "SI", defaultUnit: "psi" }),
    readingMethod: "marks",
    entered: {
      units: { length: "in", pressure: "psi" },
      initialPressure: null,
      finalPressure: psi,
      marks: { before: "2", after },
      strokes: null,
      seating: null,
    },
    measuredMm,
    seatingMm: null,
    wireBreaks: 0,
    remarks: null,
    deviceTime: new Date(Date.now() - minutesAgo * 60_000).toISOString(),
    deviceTimeZone: "America/Chicago",
    authorUserId: fx.crewId,
  };
  const res = await crew.post("/api/sync/push", {
    data: { deviceId: "flow-check-tablet", ops: [{ opId: randomUUID(), kind: "create", recordId: id, payload }] },
  });
  expect(res.status()).toBe(200);
  const body = (await res.json()) as { results: { status: string; error?: unknown }[] };
  expect(body.results[0], JSON.stringify(body)).toMatchObject({ status: "applied" });
  return id;
}

test("an out-of-band tendon is flagged, mailed, reviewed, restressed and only then released", async ({ browser }) => {
  test.setTimeout(180_000);
  const fx = await makeFixture();
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
    [fx.tendonId],
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
    [fx.tendonId],
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
