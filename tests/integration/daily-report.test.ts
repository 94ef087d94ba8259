import { createHash } from "node:crypto";
import { mkdirSync, writeFileSync } from "node:fs";
import Papa from "papaparse";
import { uuidv7 } from "uuidv7";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MPA_PER_PSI } from "@/lib/units";
import { renderDailyCsv } from "@/lib/reports/daily-csv";
import { getDailyCsv } from "@/lib/server/get-daily-csv";
import { pdfText } from "../support/pdf-text";
import { renderDailyPdf } from "@/lib/reports/daily-pdf";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { getDailyReport } from "@/lib/server/get-daily-report";
import { listDailyRevisions } from "@/lib/server/list-daily-revisions";
import { readSignedDailyReport } from "@/lib/server/read-signed-daily-report";
import { signDailyReport } from "@/lib/server/sign-daily-report";
import { verifyReportFile } from "@/lib/server/verify-report-file";
import { type TestDatabase } from "../support/database";
import { copyDemoTendons, seededDemo, type DemoFixture, insertDemoRecord, demoPerson } from "../support/records";
import { makePour } from "../support/factories";

// A pour of our own on the demo project, whose zone is set to America/Chicago. Day under test:
// 2026-11-18 (CST, UTC−6). S-01 is stressed at 09:10 CST; S-02 at 19:30 CST, which is already
// 2026-11-19 in UTC; S-03 the next morning. A concrete result is entered that afternoon.
// All readings are invented demo values.

const DAY = "2026-11-18";
const PSI = MPA_PER_PSI; // MPa per psi (NIST SP 811, 1 psi = 6.894757 kPa)

let t: TestDatabase;
let fx: DemoFixture;
let pourId: string;
let tendons: Record<string, { id: string; pour_id: string }>;
let inspector: { id: string };

const pdfTextOf = pdfText;

async function stress(tag: string, deviceTime: string, measuredMm: number) {
  await insertDemoRecord(t.db, fx, {
    tendon: tendons[tag]!,
    measuredMm,
    finalPressureMPa: 4200 * PSI,
    deviceTime,
  });
  await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendons[tag]!.id, reason: "sync" });
}

beforeAll(async () => {
  mkdirSync("test-results/reports", { recursive: true });
  ({ t, fx } = await seededDemo());
  await t.db.updateTable("projects").set({ time_zone: "America/Chicago" }).where("id", "=", fx.projectId).execute();
  inspector = await demoPerson(t.db, "inspector@demo.tautline.test");
  pourId = (await makePour(t.db, fx.projectId, { name: "Daily pour", concreteStrengthMPa: 4000 * PSI })).id;
  tendons = {};
  for (const row of await copyDemoTendons(t.db, { projectId: fx.projectId, pourId }, ["S-01", "S-02", "S-03"]))
    tendons[row.tag] = row;
  await stress("S-01", "2026-11-18T15:10:00Z", 150);
  await stress("S-02", "2026-11-19T01:30:00Z", 152);
  await stress("S-03", "2026-11-19T14:00:00Z", 151);
  await t.db
    .insertInto("concrete_results")
    .values({
      project_id: fx.projectId,
      pour_id: pourId,
      specimen: "cylinder",
      strength_mpa: 3500 * PSI,
      age_days: 3,
      specimen_count: 2,
      entered_by: inspector.id,
      entered_at: "2026-11-18T21:00:00Z",
    })
    .execute();
  // S-01's tails cut at 17:15 CST, held by its open flag (the reason as the server words it; invented here).
  await t.db
    .insertInto("tail_cuts")
    .values({
      id: uuidv7(),
      project_id: fx.projectId,
      pour_id: pourId,
      tendon_id: tendons["S-01"]!.id,
      cut_by: fx.crewId,
      cut_at: "2026-11-18T23:15:00Z",
      device_id: "test-device",
      held_reasons: ["an open flag on the tendon"],
    })
    .execute();
}, 120_000);
afterAll(async () => {
  await t?.drop();
});

describe("the day's special-inspection report", () => {
  it("holds the day's records in the project's zone: the Chicago evening record in, the next morning's out", async () => {
    const report = await getDailyReport(t.db, { projectId: fx.projectId, day: DAY });
    expect(report.timeZone).toBe("America/Chicago");
    const pour = report.pours.find((p) => p.report.pour.name === "Daily pour");
    expect(pour?.records.map((r) => r.tag)).toEqual(["S-01", "S-02"]);
    // The flags the evaluations raised were raised when the test ran, not on that day.
    expect(pour?.flagsRaised).toEqual([]);
    expect(report.concrete).toMatchObject([{ pourName: "Daily pour", ageDays: 3, specimenCount: 2 }]);
    expect(report.tailCuts).toMatchObject([{ pourName: "Daily pour", tag: "S-01" }]);
    const next = await getDailyReport(t.db, { projectId: fx.projectId, day: "2026-11-19" });
    expect(next.pours.find((p) => p.report.pour.name === "Daily pour")?.records.map((r) => r.tag)).toEqual(["S-03"]);

    const pdf = await renderDailyPdf(report);
    writeFileSync("test-results/reports/daily-report.pdf", pdf);
    const text = await pdfTextOf(pdf);
    expect(text).toContain(`Daily special-inspection report: ${DAY}`);
    expect(text).toContain("2026-11-18 19:30 CST");
    expect(text).toContain("final: 4200 psi");
    expect(text).toContain("3,500 psi at 3 days, 2 cylinders");
    expect(text).toContain(
      "Daily pour, S-01: tails cut by Luis Ferreira 2026-11-18 17:15 CST; the tendon was held: an open flag",
    );
    expect(text).toContain("licensed engineer of record");
    expect(text).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/);
    expect(text).not.toMatch(/MPa|mm²|\d\.\d{6,}/);
    // Same content, same bytes.
    expect((await renderDailyPdf(await getDailyReport(t.db, { projectId: fx.projectId, day: DAY }))).equals(pdf)).toBe(
      true,
    );

    const csv = renderDailyCsv(report, { last: null, current: false });
    writeFileSync("test-results/reports/daily-report.csv", csv);
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const rows = parsed.data.filter((r) => r.Section === "stressing" && r.Pour === "Daily pour");
    expect(rows.map((r) => [r.Tendon, r.Stressed, r.Method, r["Final pressure"]])).toEqual([
      ["S-01", "2026-11-18 09:10 CST", "marks on the strand", "4200 psi"],
      ["S-02", "2026-11-18 19:30 CST", "marks on the strand", "4200 psi"],
    ]);
    expect(rows[0]!.Measured).toMatch(/^\d+ \d+\/\d+ in$|^\d+ in$/);
    expect(rows[0]!.Deviation).toMatch(/%$/);
    expect(parsed.data.find((r) => r.Section === "remarks")?.Details).toBe("none");
    // Before any signature: one witness group (no member on these tendons), nothing stated yet.
    expect(report.witnessGroups).toEqual([
      { pourId, pourName: "Daily pour", group: "", tags: ["S-01", "S-02"], stressings: 2 },
    ]);
    expect(parsed.data.find((r) => r.Section === "witness")?.Details).toBe(
      "Daily pour: S-01, S-02 (2 stressings); not stated yet: the inspector states it when signing",
    );
    expect(parsed.data.find((r) => r.Section === "conformance")?.Details).toMatch(/^Not stated yet/);
    expect(parsed.data.filter((r) => r.Section === "signature").map((r) => r.Details)).toEqual([
      "Signature: Not signed: no revision of this report has been signed.",
    ]);
    expect(text).toContain("Statement of conformance Not stated yet");
  }, 60_000);

  it("refuses an attestation that does not fit the day, naming the field, and signs nothing", async () => {
    const report = await getDailyReport(t.db, { projectId: fx.projectId, day: DAY });
    // S-01 and S-02 were flagged by their evaluations (raised today, open): exceptions of the day's work.
    expect(report.openExceptions.length).toBeGreaterThan(0);
    const base = {
      signerName: "Dana Okafor",
      licence: "ICC special inspector 5551234 (invented)",
      statement: "I inspected the stressing listed in this report, to the extent stated under what was witnessed.",
      remarks: "",
    };
    const full = { pourId, group: "", extent: "full" as const, witnessedBy: "Dana Okafor", note: "" };
    const sign = (values: Parameters<typeof signDailyReport>[1]["values"]) =>
      signDailyReport(t.db, { projectId: fx.projectId, day: DAY, signer: inspector, values });
    await expect(sign({ ...base, conformance: "not_conforming", witness: [] })).rejects.toMatchObject({
      code: "INVALID_INPUT",
      fields: { witness: ["State what was witnessed for Daily pour."] },
    });
    await expect(
      sign({ ...base, conformance: "not_conforming", witness: [full, { ...full, group: "B9" }] }),
    ).rejects.toMatchObject({
      code: "INVALID_INPUT",
      fields: { "witness.1.group": [expect.stringMatching(/B9|stressed/)] },
    });
    await expect(sign({ ...base, conformance: "conforming", witness: [full] })).rejects.toMatchObject({
      code: "INVALID_INPUT",
      fields: { conformance: [expect.stringContaining(report.openExceptions[0]!.reference)] },
    });
    expect(await t.db.selectFrom("report_revisions").select("id").where("report_day", "=", DAY).execute()).toEqual([]);
  });

  it("is signed as revision 1, refused unchanged, and signed as revision 2 after a new record; verification follows the file", async () => {
    const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
    const values = {
      signerName: "Dana Okafor",
      licence: "ICC special inspector 5551234 (invented)",
      statement: "I inspected the stressing listed in this report; the work was in conformance except as noted.",
      remarks: "=Witnessed S-01 and S-02 from the east slab edge; barricades in place.",
      conformance: "not_conforming" as const,
      witness: [
        { pourId, group: "", extent: "part" as const, witnessedBy: "Dana Okafor", note: "S-01 only; S-02 after dark" },
      ],
    };
    const first = await signDailyReport(t.db, { projectId: fx.projectId, day: DAY, signer: inspector, values });
    expect(first).toMatchObject({ revision: 1, changes: [] });
    await expect(
      signDailyReport(t.db, { projectId: fx.projectId, day: DAY, signer: inspector, values }),
    ).rejects.toMatchObject({ code: "CONFLICT" });

    // The unsigned report now carries the signed remarks, and stands signed.
    const standing = await listDailyRevisions(t.db, { projectId: fx.projectId, day: DAY });
    expect(standing.report.remarks).toBe(values.remarks);
    expect(standing.current.signed).toBe(true);
    // The CSV as downloaded: the same content, so it carries the signature section.
    const csv = Papa.parse<Record<string, string>>(
      (await getDailyCsv(t.db, { projectId: fx.projectId, day: DAY })).csv,
      { header: true },
    );
    expect(csv.data.filter((r) => r.Section === "signature").map((r) => r.Details)).toEqual([
      "Signed by: Dana Okafor",
      "Licence or certification: ICC special inspector 5551234 (invented)",
      `Statement: ${values.statement}`,
      expect.stringMatching(/^Signed: \d{4}-\d\d-\d\d \d\d:\d\d C[SD]T$/),
      `Content sha256: ${first.contentSha256}`,
      "Revision: 1",
    ]);
    // The remarks start with "=": the CSV opens them as text, not a formula.
    expect(csv.data.find((r) => r.Section === "remarks")?.Details).toBe(`'${values.remarks}`);

    const signed1 = await readSignedDailyReport(t.db, { projectId: fx.projectId, day: DAY, revision: 1 });
    expect(sha(signed1.body)).toBe(first.fileSha256);
    writeFileSync("test-results/reports/daily-report-signed-rev1.pdf", signed1.body);
    const text1 = await pdfTextOf(signed1.body);
    expect(text1).toContain("Signed by Dana Okafor, ICC special inspector 5551234 (invented)");
    expect(text1).toContain(`Content sha256 ${first.contentSha256}`);
    expect(text1).toContain("Witnessed S-01 and S-02 from the east slab edge");
    // What was witnessed, by whom, and the statement with the open exceptions, on the signed PDF and the CSV.
    const refs = standing.report.openExceptions.map((f) => f.reference);
    expect(text1).toContain(
      "Daily pour Stressed: S-01, S-02 (2 stressings). Witnessed in part by Dana Okafor: S-01 only; S-02 after dark.",
    );
    expect(text1).toContain(
      "WAS NOT IN CONFORMANCE with the approved construction documents. Open exceptions: flag " + refs[0],
    );
    expect(csv.data.find((r) => r.Section === "witness")?.Details).toBe(
      "Daily pour: S-01, S-02 (2 stressings); witnessed in part by Dana Okafor: S-01 only; S-02 after dark",
    );
    const conformance = csv.data.find((r) => r.Section === "conformance")?.Details ?? "";
    expect(conformance).toMatch(/^The work inspected this day WAS NOT IN CONFORMANCE/);
    for (const ref of refs) expect(conformance).toContain(`flag ${ref} (Daily pour, S-0`);
    // The unsigned copy as it stands prints what was last signed: same content, same hash as signed.
    expect(await pdfTextOf(await renderDailyPdf(standing.report))).toContain("Witnessed in part by Dana Okafor");

    // A restress of S-01 later that day (16:40 CST).
    await stress("S-01", "2026-11-18T22:40:00Z", 153);
    const pending = await listDailyRevisions(t.db, { projectId: fx.projectId, day: DAY });
    expect(pending.current.signed).toBe(false);
    expect(pending.current.changesSinceSigned.join("\n")).toMatch(/record Daily pour S-01 end A stressing 2: added/);
    // The CSV of the new content is not signed: revision 1 no longer matches it.
    const changed = Papa.parse<Record<string, string>>(
      (await getDailyCsv(t.db, { projectId: fx.projectId, day: DAY })).csv,
      { header: true, skipEmptyLines: true },
    ).data.filter((r) => r.Section === "signature");
    expect(changed.map((r) => r.Details)).toEqual([
      expect.stringMatching(
        /^Signature: Not signed: the content changed after revision 1 was signed by Dana Okafor on .*; the signed revision no longer matches this content/,
      ),
    ]);

    const second = await signDailyReport(t.db, { projectId: fx.projectId, day: DAY, signer: inspector, values });
    expect(second.revision).toBe(2);
    expect(second.changes.join("\n")).toMatch(/record Daily pour S-01 end A stressing 2: added/);
    const signed2 = await readSignedDailyReport(t.db, { projectId: fx.projectId, day: DAY, revision: 2 });
    writeFileSync("test-results/reports/daily-report-signed-rev2.pdf", signed2.body);
    expect(await pdfTextOf(signed2.body)).toContain("2026-11-18 16:40 CST");

    expect(await verifyReportFile(t.db, { sha256: second.fileSha256 })).toMatchObject({
      match: true,
      day: DAY,
      pour: null,
      revision: 2,
      latest: true,
    });
    expect(await verifyReportFile(t.db, { sha256: first.fileSha256 })).toMatchObject({
      match: true,
      revision: 1,
      latest: false,
    });
    // The unsigned file is not a signed revision.
    expect(await verifyReportFile(t.db, { sha256: second.contentSha256 })).toEqual({ match: false });

    // Changing only what was witnessed is a change of the signed content: revision 3, which says so;
    // revision 2's file no longer verifies as the latest, revision 3's does.
    const witnessedInFull = {
      ...values,
      witness: [{ pourId, group: "", extent: "full" as const, witnessedBy: "Dana Okafor", note: "" }],
    };
    const third = await signDailyReport(t.db, {
      projectId: fx.projectId,
      day: DAY,
      signer: inspector,
      values: witnessedInFull,
    });
    expect(third.revision).toBe(3);
    expect(third.contentSha256).not.toBe(second.contentSha256);
    expect(third.changes).toEqual([
      "witness Daily pour: witnessed in part by Dana Okafor: S-01 only; S-02 after dark → witnessed in full by Dana Okafor",
    ]);
    expect(await verifyReportFile(t.db, { sha256: second.fileSha256 })).toMatchObject({ match: true, latest: false });
    expect(await verifyReportFile(t.db, { sha256: third.fileSha256 })).toMatchObject({ match: true, latest: true });
    const signed3 = await readSignedDailyReport(t.db, { projectId: fx.projectId, day: DAY, revision: 3 });
    writeFileSync("test-results/reports/daily-report-signed-rev3.pdf", signed3.body);
    expect(await pdfTextOf(signed3.body)).toContain("Witnessed in full by Dana Okafor.");
  }, 60_000);
});
