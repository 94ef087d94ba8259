import { createHash } from "node:crypto";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { CAUTION_TEXT } from "@/lib/cautions";
import { pourCsvTable, renderPourCsv } from "@/lib/reports/pour-csv";
import { pdfText, renderPourPdf } from "@/lib/reports/pour-pdf";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { getPourInsight } from "@/lib/server/get-pour-insight";
import { getPourReport } from "@/lib/server/get-pour-report";
import { recordDisposition } from "@/lib/server/record-disposition";
import { releasePour } from "@/lib/server/release-pour";
import {
  copyDemoTendons,
  demoPrediction,
  insertDemoRecord,
  insertRecord,
  seededDemo,
  type DemoFixture,
  demoPerson,
} from "../support/records";
import { MomentOld } from "@/db/moment-old";
import { pdfParsed } from "../support/pdf-text";
import { makePour } from "../support/factories";
import { type TestDatabase } from "../support/database";

let t: TestDatabase;
let fx: DemoFixture;
let pourId: string;
let tags: string[];
let engineer: { id: string; name: string };

// A pour of our own with the 50 tendons of the demo's "L2 Pour 2" schedule (tags prefixed R),
// so the report runs over several pages whatever the demo seed holds.
beforeAll(async () => {
  ({ t, fx } = await seededDemo());
  const source = await t.db
    .selectFrom("pours")
    .select("id")
    .where("project_id", "=", fx.projectId)
    .where("name", "=", "L2 Pour 2")
    .executeTakeFirstOrThrow();
  pourId = (await makePour(t.db, fx.projectId, { name: "Report pour", concreteStrengthMPa: 30 })).id;
  const template = await t.db
    .selectFrom("tendons")
    .select("tag")
    .where("project_id", "=", fx.projectId)
    .where("pour_id", "=", source.id)
    .orderBy("tag")
    .execute();
  expect(template).toHaveLength(50);
  tags = template.map((row) => `R${row.tag}`);
  for (const row of template) {
    await copyDemoTendons(t.db, { projectId: fx.projectId, pourId }, [`R${row.tag}`], { templateTag: row.tag });
  }
  engineer = await demoPerson(t.db, "engineer@demo.tautline.test");

  const calibration = async (setId: string) =>
    t.db
      .selectFrom("calibrations")
      .select(["slope_n_per_mpa", "intercept_n"])
      .where("equipment_set_id", "=", setId)
      .orderBy("calibrated_on", "desc")
      .executeTakeFirstOrThrow();
  const lines = { [fx.setA]: await calibration(fx.setA), [fx.setB]: await calibration(fx.setB) };
  const tendons = await t.db
    .selectFrom("tendons")
    .select(["id", "pour_id", "tag", "ends"])
    .where("pour_id", "=", pourId)
    .orderBy("tag")
    .execute();
  // Every tendon stressed; the first 20 by set B, which comes out 6 % long (invented); R2-2-U03 short, U07 long.
  for (const [i, tendon] of tendons.entries()) {
    if (tendon.tag === "R2-2-U04") continue; // read at gauge steps below
    const setId = i < 20 ? fx.setB : fx.setA;
    const line = lines[setId]!;
    const predicted = await demoPrediction(t.db, { projectId: fx.projectId, tendonId: tendon.id });
    const pressure = (predicted.jackingForceN - line.intercept_n) / line.slope_n_per_mpa;
    const wiggle = [0.6, -1.1, 0.3, -0.4, 1.0, -0.7, 0.2, 0.8, -0.9, 0.1][i % 10]! / 100;
    const factor =
      tendon.tag === "R2-2-U03" ? 0.88 : tendon.tag === "R2-2-U07" ? 1.12 : 1 + wiggle + (setId === fx.setB ? 0.06 : 0);
    const ends = tendon.ends === "both" ? (["A", "B"] as const) : ([tendon.ends] as const);
    for (const end of ends) {
      const share =
        tendon.ends === "both" ? (predicted.prediction.perEndMm[end] ?? 0) / predicted.prediction.grossMm : 1;
      await insertRecord(t.db, {
        projectId: fx.projectId,
        tendon,
        end,
        equipmentSetId: setId,
        authorId: fx.crewId,
        measuredMm: predicted.predictedMm * share * factor,
        finalPressureMPa: pressure,
      });
    }
    await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
  }
  // One end read at four gauge steps, with the steps kept beside the reading as the tablet types them.
  const stepped = tendons.find((x) => x.tag === "R2-2-U04")!;
  const predicted = await demoPrediction(t.db, { projectId: fx.projectId, tendonId: stepped.id });
  const line = lines[fx.setA]!;
  const steps = [0.25, 0.5, 0.75, 1].map((f) => ({
    pressureMPa: (f * predicted.jackingForceN - line.intercept_n) / line.slope_n_per_mpa,
    readingMm: 20 + f * predicted.predictedMm,
  }));
  await insertDemoRecord(t.db, fx, {
    tendon: stepped,
    finalPressureMPa: steps[3]!.pressureMPa,
    entered: { unit: "mm", gaugeSteps: steps },
    measuredMm: predicted.predictedMm,
    deviceTime: "2026-12-01T16:00:00Z",
  });
  await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: stepped.id, reason: "sync" });
}, 120_000);
afterAll(async () => {
  await t.drop();
});

describe("the pour's stressing report", () => {
  it("as a PDF lists every tendon with its verdict, the basis, the flags, the release and the caution, page by numbered page", async () => {
    // Settle the out-of-band flags so the pour can be released.
    const open = await t.db
      .selectFrom("flags")
      .select(["id", "kind"])
      .where("pour_id", "=", pourId)
      .where("status", "!=", "closed")
      .execute();
    expect(open.length).toBeGreaterThan(1);
    for (const f of open) {
      await recordDisposition(t.db, {
        projectId: fx.projectId,
        flagId: f.id,
        engineer,
        disposition: {
          decision: "accept",
          reasons: "Within the engineer's allowance for this slab; accepted as stressed.",
          licenceStatement: "Licensed professional engineer (test)",
        },
      });
    }
    // The engineer signs the release over the report as it stands: its content hash is kept.
    const beforeRelease = createHash("sha256")
      .update(await renderPourPdf(await getPourReport(t.db, { projectId: fx.projectId, pourId })))
      .digest("hex");
    const release = await releasePour(t.db, {
      projectId: fx.projectId,
      pourId,
      by: { ...engineer, role: "engineer" },
      statement: "All tendons stressed and accepted; tails may be cut.",
      signerName: "Dana Okafor",
      licence: "PE 048213 (invented)",
    });
    expect(release.contentSha256).toBe(beforeRelease);
    const stored = await t.db
      .selectFrom("releases")
      .selectAll()
      .where("id", "=", release.releaseId)
      .executeTakeFirstOrThrow();
    expect(stored).toMatchObject({
      signer_name: "Dana Okafor",
      licence: "PE 048213 (invented)",
      content_sha256: beforeRelease,
    });
    expect(new Date(stored.created_at).getTime()).toBe(release.signedAt.getTime());
    const signature = { signerName: "Dana Okafor", licence: "PE 048213 (invented)", contentSha256: beforeRelease };
    // The decisions page and the share board show the signature of the standing release.
    const { findReleaseCandidates } = await import("@/lib/server/find-release-candidates");
    const candidate = (await findReleaseCandidates(t.db, [fx.projectId])).find((c) => c.pourId === pourId);
    expect(candidate?.releaseSignature).toEqual(signature);
    const { createShareLink } = await import("@/lib/server/manage-share-links");
    const { getShareBoard } = await import("@/lib/server/get-share-board");
    const link = await createShareLink(t.db, {
      projectId: fx.projectId,
      by: { id: engineer.id },
      values: { label: "Contractor (test)", days: 7 },
    });
    const boardPour = (await getShareBoard(t.db, new MomentOld(t.db, null), { token: link.token })).pours.find(
      (p) => p.pourId === pourId,
    );
    expect(boardPour).toMatchObject({ status: "released", release: { ...signature, signedAt: release.signedAt } });

    const report = await getPourReport(t.db, { projectId: fx.projectId, pourId });
    const pdf = await renderPourPdf(report);
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const parsed = await pdfParsed(pdf);
    const text = parsed.text.replace(/\s+/g, " ");
    expect(parsed.total).toBeGreaterThan(2);
    for (let n = 1; n <= parsed.total; n++) expect(text).toContain(`Page ${n} of ${parsed.total}`);
    expect(text).toContain("Alder Yard Parking (AYP)");
    expect(text).toContain("Stressing report: Report pour");
    for (const tag of tags) expect(text, `tendon ${tag} in the PDF`).toContain(tag);
    expect(text).toMatch(/In band/);
    expect(text).toMatch(/Long/);
    expect(text).toMatch(/Short/);
    expect(text).toContain(pdfText(CAUTION_TEXT).replace(/\s+/g, " "));
    expect(text).toContain(`Released by ${engineer.name}`);
    expect(text).toContain("All tendons stressed and accepted; tails may be cut.");
    expect(text).toContain("Signed by Dana Okafor, licence PE 048213 (invented)");
    expect(text.replace(/\s/g, "")).toContain(beforeRelease);
    expect(text).toMatch(/Disposition D-\d{4}: Accept as stressed, by Priya Raman, P\.E\./);
    expect(text).toContain("Set A · Jack J-14");
    expect(text).toContain("AY-0871");
    expect(text).toMatch(/Curvature friction [µμ] 0\.07 \(project setting\)/);
    expect(text).toContain("Reading resolution 1/8 in");
    // The table header is drawn again on each page the tendons run onto.
    const headerPages = parsed.pages.filter((p) => /Tendon,\s+end,/.test(p.text)).length;
    expect(headerPages).toBeGreaterThan(1);
  }, 60_000);

  it("says plainly when a pour is not released and not stressed", async () => {
    const pour = await t.db
      .selectFrom("pours")
      .select("id")
      .where("project_id", "=", fx.projectId)
      .where("name", "=", "L3 Pour 1")
      .executeTakeFirstOrThrow();
    const report = await getPourReport(t.db, { projectId: fx.projectId, pourId: pour.id });
    const unstressed = report.tendons.filter((x) => !x.evaluation);
    expect(unstressed.length).toBeGreaterThan(0);
    const text = (await pdfParsed(await renderPourPdf(report))).text.replace(/\s+/g, " ");
    expect(text).toContain("Not released.");
    expect(text).toContain("Not stressed");
    expect(text).toContain(unstressed[0]!.tag);
  }, 60_000);

  it("refuses a pour of another project as not found", async () => {
    const other = await t.db
      .selectFrom("pours")
      .innerJoin("projects", "projects.id", "pours.project_id")
      .select("pours.id")
      .where("projects.code", "=", "QHM")
      .executeTakeFirst();
    const pourOfOther = other?.id ?? "00000000-0000-4000-8000-000000000000";
    await expect(getPourReport(t.db, { projectId: fx.projectId, pourId: pourOfOther })).rejects.toMatchObject({
      code: "NOT_FOUND",
    });
  });

  it("as CSV round-trips through papaparse with the same rows and columns as the report", async () => {
    const report = await getPourReport(t.db, { projectId: fx.projectId, pourId });
    const unsigned = { last: null, current: false };
    const table = pourCsvTable(report, unsigned);
    const parsed = Papa.parse<string[]>(renderPourCsv(report, unsigned), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data[0]).toEqual(table.fields);
    expect(parsed.data.slice(1)).toEqual(table.data);
    // One row per end read: 50 tendons, the two-end ones twice.
    const twoEnd = report.tendons.filter((x) => x.ends === "both").length;
    const column = (name: string) => table.fields.indexOf(name);
    const stressing = table.data.filter((r) => r[column("Section")] === "stressing");
    expect(stressing).toHaveLength(50 + twoEnd);
    expect(new Set(stressing.map((r) => r[column("Tendon")]))).toEqual(new Set(tags));
    const u03 = stressing.find((r) => r[column("Tendon")] === "R2-2-U03")!;
    expect(u03[table.fields.indexOf("Verdict")]).toBe("Short");
    expect(u03[table.fields.indexOf("Deviation")]).toMatch(/^−12\.0 %$/);
  });
});

describe("insight across the pour", () => {
  it("marks the set that comes out long, finds the gauge steps' modulus and counts verdicts the division could change", async () => {
    const insight = await getPourInsight(new MomentOld(t.db, null), { projectId: fx.projectId, pourId });
    expect(insight.progress).toMatchObject({ tendons: 50, stressed: 50, released: 50, flagged: 0 });
    const b = insight.driftOnPour.find((s) => s.setId === fx.setB)!;
    const a = insight.driftOnPour.find((s) => s.setId === fx.setA)!;
    expect(b.drifting).toBe(true);
    expect(b.differencePct).toBeGreaterThan(4);
    expect(a.drifting).toBe(false);
    expect(b.n + a.n).toBe(50);
    expect(insight.driftOnProject.find((s) => s.setId === fx.setB)!.drifting).toBe(true);
    const modulus = insight.moduli.find((m) => m.tag === "R2-2-U04");
    expect(modulus && "apparentModulusMPa" in modulus).toBe(true);
    expect(insight.resolution.all.n).toBe(50);
    expect(insight.points).toHaveLength(50);
  });
});
