import { mkdirSync, writeFileSync } from "node:fs";
import Papa from "papaparse";
import { uuidv7 } from "uuidv7";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MM_PER_INCH, MPA_PER_PSI } from "@/lib/units";
import { pourCsvTable, renderPourCsv } from "@/lib/reports/pour-csv";
import { renderPourPdf } from "@/lib/reports/pour-pdf";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { getPourCsv } from "@/lib/server/get-pour-csv";
import { getPourReport } from "@/lib/server/get-pour-report";
import { recordDisposition } from "@/lib/server/record-disposition";
import { createHash } from "node:crypto";
import { listReportRevisions } from "@/lib/server/list-report-revisions";
import { readSignedReport } from "@/lib/server/read-signed-report";
import { signPourReport } from "@/lib/server/sign-pour-report";
import { verifyReportFile } from "@/lib/server/verify-report-file";
import {
  copyDemoTendons,
  demoPrediction,
  flagIdOf,
  insertDemoRecord,
  openFlagIdOf,
  signatureRows,
  seededDemo,
  type DemoFixture,
  demoPerson,
} from "../support/records";
import { MomentOld } from "@/db/moment-old";
import { pdfParsed, pdfText } from "../support/pdf-text";
import { makePour } from "../support/factories";
import type { TestDatabase } from "../support/database";

// A pour of our own with two tendons copied from the demo schedule. Tendon S-01 is stressed short
// (invented: 85 % of the prediction), flagged, ordered restressed by the engineer and restressed in
// band; S-02 is not stressed. The report must show both stressings of S-01 with everything typed.

let t: TestDatabase;
let fx: DemoFixture;
let pourId: string;
let crewName: string;
let predicted: { predictedMm: number; jackingForceN: number };
const SHOP_MM = 5.5 * MM_PER_INCH; // the shop drawing's elongation for S-01 (invented, 5 1/2 in)

/** A record of end A of one of our pour's tendons, with what the crew typed in inches and psi. */
function insertTyped(values: {
  tendon: { id: string };
  measuredMm: number;
  typed: { before: string; after: string; seating: string; final: string; initial: string | null };
  finalPressureMPa: number;
  initialPressureMPa: number | null;
  deviceTime: string;
  remarks?: string;
  restressOf?: string;
}) {
  return insertDemoRecord(t.db, fx, {
    tendon: { id: values.tendon.id, pour_id: pourId },
    initialPressureMPa: values.initialPressureMPa,
    finalPressureMPa: values.finalPressureMPa,
    entered: {
      units: { length: "in", pressure: "psi" },
      initialPressure: values.typed.initial,
      finalPressure: values.typed.final,
      marks: { before: values.typed.before, after: values.typed.after },
      strokes: null,
      seating: values.typed.seating,
    },
    measuredMm: values.measuredMm,
    seatingMm: 0.25 * MM_PER_INCH,
    remarks: values.remarks ?? null,
    deviceTime: values.deviceTime,
    restressOfDispositionId: values.restressOf,
  });
}

beforeAll(async () => {
  mkdirSync("test-results/reports", { recursive: true });
  ({ t, fx } = await seededDemo());
  crewName = (await t.db.selectFrom("users").select("name").where("id", "=", fx.crewId).executeTakeFirstOrThrow()).name;
  pourId = (await makePour(t.db, fx.projectId, { name: "Signed pour", concreteStrengthMPa: 4000 * MPA_PER_PSI })).id;
  const where = { projectId: fx.projectId, pourId };
  const s01 = (await copyDemoTendons(t.db, where, ["S-01"], { shopElongationMm: SHOP_MM }))[0]!;
  await copyDemoTendons(t.db, where, ["S-02"]);
  predicted = await demoPrediction(t.db, { projectId: fx.projectId, tendonId: s01.id });

  // The original: 85 % of the prediction, out of band.
  await insertTyped({
    tendon: s01,
    measuredMm: 0.85 * predicted.predictedMm,
    typed: { before: "12", after: "16 1/4", seating: "1/4", final: "4150", initial: null },
    finalPressureMPa: 4150 * MPA_PER_PSI,
    initialPressureMPa: null,
    deviceTime: "2026-11-30T15:10:00Z",
    remarks: "Jack chattered near the end of the pull",
  });
  await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: s01.id, reason: "sync" });
  const flagId = await flagIdOf(t.db, s01.id, "out_of_band");
  const engineer = await demoPerson(t.db, "engineer@demo.tautline.test");
  const { dispositionId } = await recordDisposition(t.db, {
    projectId: fx.projectId,
    flagId,
    engineer,
    disposition: {
      decision: "restress",
      reasons: "Restress to the marked gauge pressure and read again.",
      licenceStatement: "Licensed professional engineer (test)",
    },
  });
  // The restress, in band, read from an initial pressure.
  // Read from 800 psi, the travel is about (4230 − 800)/4230 of the full elongation.
  await insertTyped({
    tendon: s01,
    measuredMm: (predicted.predictedMm * (4230 - 800)) / 4230,
    typed: { before: "12", after: "17 3/8", seating: "5/16", final: "4230", initial: "800" },
    finalPressureMPa: 4230 * MPA_PER_PSI,
    initialPressureMPa: 800 * MPA_PER_PSI,
    deviceTime: "2026-12-01T14:40:00Z",
    restressOf: dispositionId,
  });
  await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: s01.id, reason: "sync" });
}, 120_000);
afterAll(async () => {
  await t?.drop();
});

describe("the stressing report shows every stressing of every end", () => {
  it("keeps the original out-of-band record and the restress, each with operator, pressures, readings and both predictions", async () => {
    const report = await getPourReport(t.db, { projectId: fx.projectId, pourId });
    const s01 = report.records.filter((r) => r.tag === "S-01");
    expect(s01.map((r) => [r.stressing, r.restressOrdered])).toEqual([
      [1, false],
      [2, true],
    ]);
    expect(s01[0]!.evaluation).toMatchObject({ verdict: "short", current: false });
    expect(s01[1]!.evaluation).toMatchObject({ verdict: "in band", current: true });

    const pdf = await renderPourPdf(report);
    writeFileSync("test-results/reports/stressing-report.pdf", pdf);
    const parsed = await pdfParsed(pdf);
    const text = parsed.text.replace(/\s+/g, " ");
    expect(text).toContain("1 original");
    expect(text).toContain("2 restress (ordered)");
    expect(text).toContain(crewName);
    expect(text).toContain("marks 12 before, 16 1/4 after");
    expect(text).toContain("marks 12 before, 17 3/8 after");
    expect(text).toContain("final: 4150 psi");
    expect(text).toContain("initial: 800 psi");
    expect(text).toContain("seating: 5/16");
    expect(text).toContain("shop: 5.50 in");
    expect(text).toMatch(/Tautline: \d+\.\d\d in/);
    expect(text).toContain("Short (superseded)");
    expect(text).toContain("Jack chattered near the end of the pull");
    expect(text).toMatch(/2026-11-30 09:10 CST/);
    expect(text).toMatch(/flag F-\d{4}/i);
    expect(text).toMatch(/Disposition D-\d{4}: Restress/);
    expect(text).toContain("Concrete strength 4,000 psi confirmed");
    expect(text).toMatch(/Restressed as ordered by disposition D-\d{4}; the new evaluation/);
    // The rest of issue 14's list for each record: the set's serials and its calibration with the
    // certificate, the target pressure and the force from the calibration, the deviation, verdict
    // basis and wire breaks; a summary first page and page numbers.
    const e = s01[0]!.equipment;
    expect(text).toContain(`jack ${e.jackSerial}, gauge ${e.gaugeSerial}, pump ${e.pumpSerial ?? "not recorded"}`);
    const c = s01[0]!.calibration!;
    expect(text).toContain(`${c.calibratedOn} to ${c.validUntil}`);
    expect(text).toMatch(/certificate \S+|no certificate uploaded/);
    expect(text).toMatch(/target: \d,?\d{3} psi/);
    expect(text).toMatch(/\d+(\.\d+)? kip/);
    expect(text).toMatch(/[+−]\d+\.\d %/);
    expect(text).toContain("net of anchor set");
    expect(text).toMatch(/wire breaks: \d/);
    expect(text).toMatch(/Page 1 of \d+/);
    expect(text.indexOf("Summary")).toBeLessThan(text.indexOf("1 original"));
    expect(text).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/);
    expect(text).not.toMatch(/MPa|mm²|\d\.\d{6,}/);
    // The same content draws the same bytes: nothing in the file depends on when it was drawn.
    expect((await renderPourPdf(await getPourReport(t.db, { projectId: fx.projectId, pourId }))).equals(pdf)).toBe(
      true,
    );
  }, 60_000);

  it("as CSV has one row per stressing, in order, with the same strings", async () => {
    const report = await getPourReport(t.db, { projectId: fx.projectId, pourId });
    const csv = renderPourCsv(report, { last: null, current: false });
    writeFileSync("test-results/reports/stressing-report.csv", csv);
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const rows = parsed.data.filter((r) => r.Tendon === "S-01" && r.Section === "stressing");
    expect(rows.map((r) => r.Stressing)).toEqual(["1 original", "2 restress (ordered)"]);
    expect(rows[0]).toMatchObject({
      Operator: crewName,
      "Final pressure": "4150 psi",
      "Initial pressure": "none (from zero)",
      "Readings as entered": "marks 12 before, 16 1/4 after",
      Seating: "1/4",
      "Predicted (shop drawing)": "5.50 in",
      Governs: "Tautline",
      Verdict: "Short (superseded)",
      Basis: expect.stringMatching(/net|gross/),
    });
    expect(rows[1]).toMatchObject({ "Initial pressure": "800 psi", "Final pressure": "4230 psi", Verdict: "In band" });
    expect(rows[0]!["Predicted (Tautline)"]).toMatch(/^\d+\.\d\d in$/);
    expect(rows[1]!["Target pressure"]).toMatch(/^\d+ psi$/);
    expect(rows[1]!.Force).toMatch(/^\d+\.\d\d kip$/);
    expect(parsed.data.find((r) => r.Tendon === "S-02")).toMatchObject({ Verdict: "Not stressed", Stressing: "" });
    expect(pourCsvTable(report, { last: null, current: false }).data.filter((r) => r[2] === "stressing")).toHaveLength(
      3,
    );
    // Nothing signed yet: the CSV says so, in its own section.
    expect(parsed.data.filter((r) => r.Section === "signature").map((r) => r.Details)).toEqual([
      "Signature: Not signed: no revision of this report has been signed.",
    ]);
  }, 60_000);
});

describe("signing the stressing report", () => {
  const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
  const values = {
    signerName: "Dana Okafor",
    licence: "ICC special inspector 5551234 (invented)",
    statement:
      "I inspected the stressing of the tendons listed; the work was in conformance except as noted in the flags.",
  };

  it("freezes a signed revision; a correction makes a new revision that says what changed; verification follows the file", async () => {
    const inspector = await demoPerson(t.db, "inspector@demo.tautline.test");
    const first = await signPourReport(t.db, { projectId: fx.projectId, pourId, signer: inspector, values });
    expect(first).toMatchObject({ revision: 1, changes: [] });
    // Signing the same content again is refused: nothing changed.
    await expect(
      signPourReport(t.db, { projectId: fx.projectId, pourId, signer: inspector, values }),
    ).rejects.toMatchObject({ code: "CONFLICT" });

    const signed1 = await readSignedReport(t.db, { projectId: fx.projectId, pourId, revision: 1 });
    expect(sha(signed1.body)).toBe(first.fileSha256);
    writeFileSync("test-results/reports/stressing-report-signed-rev1.pdf", signed1.body);
    const text1 = await pdfText(Buffer.from(signed1.body));
    expect(text1).toContain("Signed by Dana Okafor, ICC special inspector 5551234 (invented)");
    expect(text1).toContain(`Content sha256 ${first.contentSha256}`);
    expect(text1).toContain("(revision 1)");
    expect(await verifyReportFile(t.db, { sha256: first.fileSha256 })).toMatchObject({
      match: true,
      revision: 1,
      latest: true,
      signerName: "Dana Okafor",
      pour: "Signed pour",
    });
    // The CSV as downloaded carries the signature of this content: who, licence, statement, when
    // (in the project's zone), the content hash and the revision.
    const signatureOf = async () =>
      Papa.parse<Record<string, string>>((await getPourCsv(t.db, { projectId: fx.projectId, pourId })).csv, {
        header: true,
        skipEmptyLines: true,
      })
        .data.filter((r) => r.Section === "signature")
        .map((r) => r.Details);
    const signedRows = await signatureOf();
    expect(signedRows).toEqual(signatureRows(values, first.contentSha256));

    // A paperwork correction of the restress: a new revision of that record, evaluated again.
    const s01 = await t.db
      .selectFrom("tendons")
      .select(["id", "pour_id"])
      .where("pour_id", "=", pourId)
      .where("tag", "=", "S-01")
      .executeTakeFirstOrThrow();
    const restress = await t.db
      .selectFrom("records")
      .selectAll()
      .where("tendon_id", "=", s01.id)
      .where("restress_of_disposition_id", "is not", null)
      .executeTakeFirstOrThrow();
    const rest: Partial<typeof restress> = { ...restress };
    delete rest.id;
    delete rest.received_at;
    await t.db
      .insertInto("records")
      .values({
        ...(rest as Omit<typeof restress, "id" | "received_at">),
        wire_break_details: null,
        id: uuidv7(),
        revision: 2,
        base_record_id: restress.id,
        revision_reason: "Mark after was 17 1/2, not 17 3/8 (photo checked)",
        measured_mm: restress.measured_mm + 3.175,
        entered: JSON.stringify(restress.entered),
      })
      .execute();
    await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: s01.id, reason: "correction" });

    const pending = await listReportRevisions(t.db, { projectId: fx.projectId, pourId });
    expect(pending.current.signed).toBe(false);
    // The CSV of the changed content is not signed: revision 1 no longer matches it.
    const changedRows = await signatureOf();
    expect(changedRows).toHaveLength(1);
    expect(changedRows[0]).toMatch(
      /^Signature: Not signed: the content changed after revision 1 was signed by Dana Okafor on .*; the signed revision no longer matches this content/,
    );
    expect(changedRows.join(" ")).not.toContain(first.contentSha256);
    expect(pending.current.changesSinceSigned.join("\n")).toMatch(
      /record S-01 end A stressing 2: revision 1, .* → revision 2/,
    );

    const second = await signPourReport(t.db, { projectId: fx.projectId, pourId, signer: inspector, values });
    expect(second.revision).toBe(2);
    expect(second.changes.join("\n")).toMatch(/record S-01 end A stressing 2: revision 1, .* → revision 2/);
    const signed2 = await readSignedReport(t.db, { projectId: fx.projectId, pourId, revision: 2 });
    writeFileSync("test-results/reports/stressing-report-signed-rev2.pdf", signed2.body);
    const text2 = await pdfText(Buffer.from(signed2.body));
    expect(text2).toContain("corrected to revision 2: Mark after was 17 1/2, not 17 3/8 (photo checked)");
    expect(text2).toMatch(/What changed record S-01 end A stressing 2: revision 1/);

    // The old file is no longer the report: revision 1, superseded. The new one is current. An
    // altered copy matches nothing.
    expect(await verifyReportFile(t.db, { sha256: first.fileSha256 })).toMatchObject({
      match: true,
      revision: 1,
      latest: false,
    });
    expect(await verifyReportFile(t.db, { sha256: sha(signed2.body) })).toMatchObject({
      match: true,
      revision: 2,
      latest: true,
    });
    const altered = Buffer.from(signed2.body);
    altered[altered.length - 10] = altered[altered.length - 10]! ^ 1;
    expect(await verifyReportFile(t.db, { sha256: sha(altered) })).toEqual({ match: false });
    const listed = await listReportRevisions(t.db, { projectId: fx.projectId, pourId });
    expect(listed.current.signed).toBe(true);
    expect(listed.revisions.map((r) => r.revision)).toEqual([2, 1]);
    // Stored revisions are append-only.
    await expect(
      t.db
        .updateTable("report_revisions")
        .set({ signer_name: "Someone else" })
        .where("project_id", "=", fx.projectId)
        .execute(),
    ).rejects.toThrow(/append-only/);
  }, 120_000);
});

describe("the read-only status board", () => {
  it("shows each pour's state and signed reports, and ends at expiry or revocation, auditing every view", async () => {
    const { createShareLink, revokeShareLink } = await import("@/lib/server/manage-share-links");
    const { getShareBoard, readSharedReport } = await import("@/lib/server/get-share-board");
    const engineer = await demoPerson(t.db, "engineer@demo.tautline.test");
    const now = new Date("2026-12-02T12:00:00Z");
    const link = await createShareLink(t.db, {
      projectId: fx.projectId,
      by: engineer,
      values: { label: "Building official (test)", days: 7 },
      now,
    });
    const board = await getShareBoard(t.db, new MomentOld(t.db, null), { token: link.token, now });
    const signedPour = board.pours.find((p) => p.name === "Signed pour")!;
    // S-01 still has an open jacking-force flag; S-02 is not stressed.
    expect(signedPour).toMatchObject({ status: "held", held: 1, tendons: 2, complete: 1 });
    expect(signedPour.signed.map((s) => s.revision)).toEqual([2, 1]);
    expect(JSON.stringify(board)).not.toContain(crewName);
    // The board shows its moments in the project's zone, as the reports do (the demo's: scripts/seed/demo-site.ts).
    expect(board.project.timeZone).toBe("America/Chicago");
    const file = await readSharedReport(t.db, { token: link.token, pourId, revision: 2, now });
    expect(Buffer.from(file.body.subarray(0, 5)).toString()).toBe("%PDF-");

    // A token never issued is not found, unlike one that ended.
    await expect(getShareBoard(t.db, new MomentOld(t.db, null), { token: "A".repeat(43), now })).rejects.toMatchObject({
      code: "NOT_FOUND",
    });
    // Expired a moment after its last day.
    await expect(
      getShareBoard(t.db, new MomentOld(t.db, null), {
        token: link.token,
        now: new Date(link.expiresAt.getTime() + 1000),
      }),
    ).rejects.toMatchObject({ code: "GONE" });
    // Revoked: gone at once.
    await revokeShareLink(t.db, { projectId: fx.projectId, linkId: link.linkId, by: engineer });
    await expect(getShareBoard(t.db, new MomentOld(t.db, null), { token: link.token, now })).rejects.toMatchObject({
      code: "GONE",
    });
    await expect(readSharedReport(t.db, { token: link.token, pourId, revision: 2, now })).rejects.toMatchObject({
      code: "GONE",
    });
    await expect(
      revokeShareLink(t.db, { projectId: fx.projectId, linkId: link.linkId, by: engineer }),
    ).rejects.toMatchObject({ code: "CONFLICT" });
    const audits = await t.db
      .selectFrom("audit_events")
      .select(["action", "outcome"])
      .where("target", "=", `share:${link.linkId}`)
      .orderBy("at")
      .execute();
    expect(audits.map((a) => `${a.action}/${a.outcome}`)).toEqual([
      "share.create/success",
      "share.view/success",
      "share.download/success",
      "share.view/denied",
      "share.revoke/success",
      "share.view/denied",
      "share.download/denied",
    ]);
  }, 60_000);
});

describe("lift-off checks and concrete results on the stressing report", () => {
  it("places each lift-off check in its tendon's sequence and lists the pour's concrete results, on the PDF and the CSV", async () => {
    const { recordLiftoffCheck } = await import("@/lib/server/record-liftoff-check");
    const { addConcreteResult } = await import("@/lib/server/add-concrete-result");
    const { showForce, showPct } = await import("@/lib/format/quantities");
    const person = (email: string) =>
      t.db.selectFrom("users").select(["id", "name"]).where("email", "=", email).executeTakeFirstOrThrow();
    const engineer = await person("engineer@demo.tautline.test");
    const inspector = await person("inspector@demo.tautline.test");
    const s01 = await t.db
      .selectFrom("tendons")
      .select("id")
      .where("pour_id", "=", pourId)
      .where("tag", "=", "S-01")
      .executeTakeFirstOrThrow();
    // The engineer orders a lift-off check on S-01's open flag; the crew reads 3,900 psi at lift-off.
    const { dispositionId } = await recordDisposition(t.db, {
      projectId: fx.projectId,
      flagId: await openFlagIdOf(t.db, s01.id),
      engineer,
      disposition: {
        decision: "liftoff_check",
        reasons: "Check the force at the live end by lift-off before deciding.",
        licenceStatement: "Licensed professional engineer (test)",
      },
    });
    const disposition = await t.db
      .selectFrom("dispositions")
      .select("number")
      .where("id", "=", dispositionId)
      .executeTakeFirstOrThrow();
    const dRef = `D-${String(disposition.number).padStart(4, "0")}`;
    const checked = await recordLiftoffCheck(
      t.db,
      { user: { id: fx.crewId, memberships: [{ projectId: fx.projectId, role: "crew" }] }, deviceId: "test-device" },
      {
        opId: uuidv7(),
        kind: "liftoff_check",
        recordId: uuidv7(),
        payload: {
          projectId: fx.projectId,
          pourId,
          tendonId: s01.id,
          dispositionId,
          tendonEnd: "A",
          equipmentSetId: fx.setA,
          pressure: "3900",
          pressureUnit: "psi",
          checkedAt: "2026-12-02T16:20:00Z",
          authorUserId: fx.crewId,
        },
      },
    );
    expect(checked.status).toBe("applied");
    const stored = await t.db
      .selectFrom("liftoff_checks")
      .selectAll()
      .where("tendon_id", "=", s01.id)
      .executeTakeFirstOrThrow();

    // Two concrete results: a 7-day set with no lab report, then a 28-day set with the lab's report.
    const lab = await t.db
      .insertInto("attachments")
      .values({
        project_id: fx.projectId,
        purpose: "lab_report",
        object_key: `test/${uuidv7()}.pdf`,
        content_type: "application/pdf",
        size_bytes: 1024,
        sha256: "0".repeat(64),
        original_name: "Signed-pour-cylinders-28-day.pdf",
        status: "stored",
        uploaded_by: inspector.id,
        created_at: new Date(),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await addConcreteResult(t.db, {
      projectId: fx.projectId,
      pourId,
      by: inspector,
      result: { specimen: "cylinder", strengthMPa: 3100 * MPA_PER_PSI, ageDays: 7, specimenCount: 2 },
    });
    await addConcreteResult(t.db, {
      projectId: fx.projectId,
      pourId,
      by: inspector,
      result: {
        specimen: "cylinder",
        strengthMPa: 5000 * MPA_PER_PSI,
        ageDays: 28,
        specimenCount: 3,
        attachmentId: lab.id,
      },
    });

    const report = await getPourReport(t.db, { projectId: fx.projectId, pourId });
    const units = { unitSystem: "us" as const };
    const liftoffForce = showForce(units, stored.liftoff_force_n);
    const expectedForce = showForce(units, stored.expected_force_n);
    const band = `Lift-off ${stored.within_band ? "within" : "outside"} the ±${stored.band_pct} % band`;

    const pdf = await renderPourPdf(report);
    writeFileSync("test-results/reports/stressing-report-liftoff.pdf", pdf);
    // A narrow column may break "lift-off" after its hyphen: the words are read back whole.
    const text = (await pdfText(pdf)).replace(/(\w)- (\w)/g, "$1-$2");
    expect(text).toContain(`Lift-off check (ordered by disposition ${dRef})`);
    expect(text).toContain("final: 3900 psi at lift-off");
    expect(text).toContain(`gauge: ${liftoffForce} at lift-off; ${expectedForce} expected after seating`);
    expect(text).toContain(band);
    // In time order: after the restress of 2026-12-01, at 10:20 on the site's clock.
    expect(text.indexOf("2 restress (ordered)")).toBeLessThan(text.indexOf("Lift-off check (ordered"));
    expect(text).toContain("2026-12-02 10:20 CST");
    expect(text).toContain("Concrete results");
    expect(text).toMatch(
      /3,100 psi at 7 days, 2 cylinders, no lab report attached, entered by [^,]+ \d{4}-\d\d-\d\d \d\d:\d\d CST/,
    );
    expect(text).toContain(
      `5,000 psi at 28 days, 3 cylinders, lab report Signed-pour-cylinders-28-day.pdf, entered by ${inspector.name}`,
    );
    expect(text.indexOf("3,100 psi at 7 days")).toBeLessThan(text.indexOf("5,000 psi at 28 days"));
    expect(text).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/);

    const csv = Papa.parse<Record<string, string>>(renderPourCsv(report, { last: null, current: false }), {
      header: true,
      skipEmptyLines: true,
    });
    expect(csv.errors).toEqual([]);
    const s01Rows = csv.data.filter((r) => r.Section === "stressing" && r.Tendon === "S-01");
    expect(s01Rows.map((r) => r.Stressing)).toEqual([
      "1 original",
      // The restress as corrected in the signing test above.
      "2 restress (ordered), revision 2",
      `Lift-off check (ordered by disposition ${dRef})`,
    ]);
    expect(s01Rows[2]).toMatchObject({
      End: "A",
      Stressed: "2026-12-02 10:20 CST",
      Operator: crewName,
      "Final pressure": "3900 psi at lift-off",
      Force: `${liftoffForce} at lift-off; ${expectedForce} expected after seating`,
      Deviation: showPct(stored.deviation_pct),
      Verdict: band,
    });
    expect(s01Rows[2]!.Calibration).toMatch(/^\d{4}-\d\d-\d\d to \d{4}-\d\d-\d\d/);
    expect(s01Rows[2]!["Equipment set"]).toBe(s01Rows[1]!["Equipment set"]);
    expect(csv.data.filter((r) => r.Section === "concrete result").map((r) => r.Details)).toEqual([
      expect.stringMatching(/^3,100 psi at 7 days, 2 cylinders, no lab report attached, entered by /),
      expect.stringMatching(
        /^5,000 psi at 28 days, 3 cylinders, lab report Signed-pour-cylinders-28-day\.pdf, entered by .* CST$/,
      ),
    ]);

    // Signing again: the new revision names the lift-off check and the results among what changed.
    const signer = { id: inspector.id };
    const values = { signerName: "Dana Okafor", licence: "ICC 5551234 (invented)", statement: "Inspected as listed." };
    const signed = await signPourReport(t.db, { projectId: fx.projectId, pourId, signer, values });
    const changes = signed.changes.join("\n");
    expect(changes).toMatch(/lift-off S-01 end A 2026-12-02 10:20 CST: added/);
    expect(changes).toMatch(/concrete result .*: added \(5,000 psi at 28 days/);
  }, 120_000);
});
