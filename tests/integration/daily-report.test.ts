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
import { readSignedDailyReport } from "@/lib/server/read-signed-report";
import { recordDetension } from "@/lib/server/record-detension";
import { recordDisposition } from "@/lib/server/record-disposition";
import { recordLiftoffCheck } from "@/lib/server/record-liftoff-check";
import { getPourReport } from "@/lib/server/get-pour-report";
import { RECORD_COLUMNS, recordRows } from "@/lib/reports/pour-rows";
import { dailySnapshot } from "@/lib/reports/daily-rows";
import { signDailyReport } from "@/lib/server/sign-daily-report";
import { verifyReportFile } from "@/lib/server/verify-report-file";
import { type TestDatabase } from "../support/database";
import {
  copyDemoTendons,
  openFlagIdOf,
  signatureRows,
  seededDemo,
  type DemoFixture,
  insertDemoRecord,
  demoPerson,
} from "../support/records";
import { makePour } from "../support/factories";

// A pour of our own on the demo project, whose zone is set to America/Chicago. Day under test:
// 2026-11-18 (CST, UTC−6). S-01 is stressed at 09:10 CST; S-02 at 19:30 CST, which is already
// 2026-11-19 in UTC; S-03 the next morning. A concrete result is entered that afternoon.
// A second pour, "Check pour", is stressed on 2026-11-16 (C-01, C-02, both flagged); on the
// engineer's orders C-01 gets a lift-off check on 2026-11-17 at 21:00 CST (already 2026-11-18 in
// UTC) and another on the day at 10:00 CST, and C-02 is detensioned on the day at 23:30 CST
// (2026-11-19 in UTC): on the day that pour has a lift-off check and a detension and no stressing.
// All readings are invented demo values.

const DAY = "2026-11-18";
const PSI = MPA_PER_PSI; // MPa per psi (NIST SP 811, 1 psi = 6.894757 kPa)

let t: TestDatabase;
let fx: DemoFixture;
let pourId: string;
let tendons: Record<string, { id: string; pour_id: string }>;
let inspector: { id: string };
let checkPourId: string;
let checkTendons: Record<string, { id: string; pour_id: string }>;
/** The references of the dispositions that ordered C-01's lift-off check and C-02's detension. */
const ordered = { liftoff: "", detension: "", liftoffId: "" };
const crewSender = () => ({ id: fx.crewId, memberships: [{ projectId: fx.projectId, role: "crew" as const }] });

/** A lift-off check on C-01 at that instant, through the server's own operation; 3,900 psi read at lift-off. */
async function liftoff(checkedAt: string) {
  const result = await recordLiftoffCheck(
    t.db,
    { user: crewSender(), deviceId: "test-device" },
    {
      opId: uuidv7(),
      kind: "liftoff_check",
      recordId: uuidv7(),
      payload: {
        projectId: fx.projectId,
        pourId: checkPourId,
        tendonId: checkTendons["C-01"]!.id,
        dispositionId: ordered.liftoffId,
        tendonEnd: "A",
        equipmentSetId: fx.setA,
        pressure: "3900",
        pressureUnit: "psi",
        checkedAt,
        authorUserId: fx.crewId,
      },
    },
  );
  expect(result.status).toBe("applied");
}

const pdfTextOf = pdfText;

async function stress(tag: string, deviceTime: string, measuredMm: number, on = tendons) {
  await insertDemoRecord(t.db, fx, {
    tendon: on[tag]!,
    measuredMm,
    finalPressureMPa: 4200 * PSI,
    deviceTime,
  });
  await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: on[tag]!.id, reason: "sync" });
}

beforeAll(async () => {
  mkdirSync("test-results/reports", { recursive: true });
  ({ t, fx } = await seededDemo());
  await t.db.updateTable("projects").set({ time_zone: "America/Chicago" }).where("id", "=", fx.projectId).execute();
  inspector = await demoPerson(t.db, "inspector@demo.tautline.test");
  // Two pours of one-end tendons like 2-1-U01: the day's stressings, and one checked and detensioned.
  const addPour = async (name: string, tags: string[]) => {
    const id = (await makePour(t.db, fx.projectId, { name, concreteStrengthMPa: 4000 * PSI })).id;
    const rows: Record<string, { id: string; pour_id: string }> = {};
    for (const row of await copyDemoTendons(t.db, { projectId: fx.projectId, pourId: id }, tags, { ends: "A" }))
      rows[row.tag] = row;
    return { id, rows };
  };
  ({ id: pourId, rows: tendons } = await addPour("Daily pour", ["S-01", "S-02", "S-03"]));
  ({ id: checkPourId, rows: checkTendons } = await addPour("Check pour", ["C-01", "C-02"]));
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

  // The Check pour: stressed on 2026-11-16, both tendons flagged; the engineer orders a lift-off
  // check on C-01 and a detension and restress on C-02.
  await stress("C-01", "2026-11-16T16:00:00Z", 150, checkTendons);
  await stress("C-02", "2026-11-16T16:30:00Z", 150, checkTendons);
  const engineer = await t.db
    .selectFrom("users")
    .select(["id", "name"])
    .where("email", "=", "engineer@demo.tautline.test")
    .executeTakeFirstOrThrow();
  for (const [tag, decision] of [
    ["C-01", "liftoff_check"],
    ["C-02", "detension_restress"],
  ] as const) {
    const { dispositionId } = await recordDisposition(t.db, {
      projectId: fx.projectId,
      flagId: await openFlagIdOf(t.db, checkTendons[tag]!.id),
      engineer,
      disposition: {
        decision,
        reasons: "Check the force in the tendon before deciding (invented).",
        licenceStatement: "Licensed professional engineer (test)",
      },
    });
    const { number } = await t.db
      .selectFrom("dispositions")
      .select("number")
      .where("id", "=", dispositionId)
      .executeTakeFirstOrThrow();
    const ref = `D-${String(number).padStart(4, "0")}`;
    if (decision === "liftoff_check") Object.assign(ordered, { liftoff: ref, liftoffId: dispositionId });
    else ordered.detension = ref;
    if (decision === "detension_restress") {
      const result = await recordDetension(
        t.db,
        { user: crewSender(), deviceId: "test-device" },
        {
          opId: uuidv7(),
          kind: "detension",
          recordId: uuidv7(),
          payload: {
            projectId: fx.projectId,
            pourId: checkPourId,
            tendonId: checkTendons["C-02"]!.id,
            dispositionId,
            detensionedAt: "2026-11-19T05:30:00Z", // 23:30 CST on the day
            operatorName: "Luis Ferreira",
            equipmentSetId: fx.setA,
            pressure: "600",
            pressureUnit: "psi",
            strandsDetensioned: 1,
            remarks: "Released from the live end.",
            authorUserId: fx.crewId,
          },
        },
      );
      expect(result.status).toBe("applied");
    }
  }
  await liftoff("2026-11-18T03:00:00Z"); // 21:00 CST on 2026-11-17
  await liftoff("2026-11-18T16:00:00Z"); // 10:00 CST on the day
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

  it("lists the day's lift-off checks and detensions per pour in the stressing report's words, and no other day's", async () => {
    const report = await getDailyReport(t.db, { projectId: fx.projectId, day: DAY });
    // The Check pour is on the day for its lift-off check and detension alone.
    const check = report.pours.find((p) => p.report.pour.name === "Check pour");
    expect(check?.records).toEqual([]);
    expect(check?.liftoffChecks.map((l) => l.at.toISOString())).toEqual(["2026-11-18T16:00:00.000Z"]);
    expect(check?.detensions.map((d) => d.at.toISOString())).toEqual(["2026-11-19T05:30:00.000Z"]);
    expect(report.pours.find((p) => p.report.pour.name === "Daily pour")?.liftoffChecks).toEqual([]);

    // The CSV rows are the pour's stressing report's rows for those two, column for column (the
    // Flags column names the flags raised that day only, none here).
    const csv = Papa.parse<Record<string, string>>(renderDailyCsv(report, { last: null, current: false }), {
      header: true,
      skipEmptyLines: true,
    });
    expect(csv.errors).toEqual([]);
    const rows = csv.data.filter((r) => r.Section === "stressing" && r.Pour === "Check pour");
    expect(rows.map((r) => [r.Tendon, r.End, r.Stressing, r.Stressed, r.Method])).toEqual([
      ["C-01", "A", `Lift-off check (ordered by disposition ${ordered.liftoff})`, "2026-11-18 10:00 CST", ""],
      ["C-02", "", `Detension (ordered by disposition ${ordered.detension})`, "2026-11-18 23:30 CST", ""],
    ]);
    const pourRows = recordRows(await getPourReport(t.db, { projectId: fx.projectId, pourId: checkPourId }));
    for (const row of rows) {
      const same = pourRows.find((r) => r[RECORD_COLUMNS.indexOf("Stressed")] === row.Stressed)!;
      for (const column of RECORD_COLUMNS.filter((c) => c !== "Flags"))
        expect(row[column]).toBe(same[RECORD_COLUMNS.indexOf(column)]);
    }
    expect(rows[0]).toMatchObject({ "Final pressure": "3900 psi at lift-off", Operator: "Luis Ferreira" });
    expect(rows[0]!.Verdict).toMatch(/^Lift-off (within|outside) the ±\d+ % band$/);
    expect(rows[1]).toMatchObject({
      "Final pressure": "at release: 600 psi",
      "Readings as entered": "1 strand detensioned",
      Verdict: "Detensioned: restress required",
    });

    // The PDF prints them in the same words; the lift-off of the evening before (already the day in UTC) is left out.
    const pdf = await renderDailyPdf(report);
    writeFileSync("test-results/reports/daily-report-liftoff-detension.pdf", pdf);
    // A narrow column may break a word after its hyphen: the words are read back whole.
    const text = (await pdfTextOf(pdf)).replace(/(\w)- (\w)/g, "$1-$2");
    expect(text).toContain(`Lift-off check (ordered by disposition ${ordered.liftoff})`);
    expect(text).toContain(`Detension (ordered by disposition ${ordered.detension})`);
    expect(text).toContain("3900 psi at lift-off");
    expect(text).toContain("1 lift-off check (");
    expect(text).toContain("1 detension.");
    expect(text).toContain("2026-11-18 23:30 CST");
    expect(text).not.toContain("2026-11-17 21:00 CST");
    // The signed content names them, so a change of either is a new revision that says so.
    expect(Object.keys(dailySnapshot(report))).toEqual(
      expect.arrayContaining([
        "lift-off Check pour C-01 end A 2026-11-18 10:00 CST",
        "detension Check pour C-02 2026-11-18 23:30 CST",
      ]),
    );
    // C-01 and C-02 were not stressed that day, but checked and detensioned on it: the flags they
    // still carry open are exceptions of the day's work, for the inspector's statement of conformance.
    // C-01 carries three: its stressing's and its two lift-off checks' (the evening before and that
    // morning), all raised when this test ran, so they count by when the work was done.
    const stillOpen = await t.db
      .selectFrom("flags")
      .innerJoin("tendons", "tendons.id", "flags.tendon_id")
      .select("tendons.tag")
      .where("tendons.pour_id", "=", checkPourId)
      .where("flags.status", "!=", "closed")
      .execute();
    expect(stillOpen.map((f) => f.tag).sort()).toEqual(["C-01", "C-01", "C-01", "C-02"]);
    expect(
      report.openExceptions
        .filter((f) => f.pourName === "Check pour")
        .map((f) => f.tendonTag)
        .sort(),
    ).toEqual(stillOpen.map((f) => f.tag).sort());

    // The evening before: only that lift-off check, and the report's content is as of it.
    const before = await getDailyReport(t.db, { projectId: fx.projectId, day: "2026-11-17" });
    expect(
      before.pours.map((p) => [p.report.pour.name, p.records.length, p.liftoffChecks.length, p.detensions.length]),
    ).toEqual([["Check pour", 0, 1, 0]]);
    expect(before.asOf.toISOString()).toBe("2026-11-18T03:00:00.000Z");
    const beforeCsv = Papa.parse<Record<string, string>>(renderDailyCsv(before, { last: null, current: false }), {
      header: true,
      skipEmptyLines: true,
    }).data;
    const beforeRows = beforeCsv.filter((r) => r.Section === "stressing");
    // The set used for the lift-off check is listed with the calibration the check stood on.
    expect(beforeCsv.filter((r) => r.Section === "equipment").map((r) => r.Details)).toEqual([
      expect.stringMatching(
        /: Jack .*\. Calibrated \d{4}-\d\d-\d\d, valid until \d{4}-\d\d-\d\d.* \(used for a lift-off check\)\.$/,
      ),
    ]);
    expect(beforeRows.map((r) => [r.Pour, r.Tendon, r.Stressing, r.Stressed])).toEqual([
      ["Check pour", "C-01", `Lift-off check (ordered by disposition ${ordered.liftoff})`, "2026-11-17 21:00 CST"],
    ]);
    // The day after (the detension's UTC day): nothing of the Check pour.
    const after = await getDailyReport(t.db, { projectId: fx.projectId, day: "2026-11-19" });
    expect(after.pours.map((p) => p.report.pour.name)).not.toContain("Check pour");
    expect(after.pours.flatMap((p) => [...p.liftoffChecks, ...p.detensions])).toEqual([]);
    // The day the pour was stressed: its stressings, without the later lift-off checks and detension.
    const stressed = await getDailyReport(t.db, { projectId: fx.projectId, day: "2026-11-16" });
    const stressedText = await pdfTextOf(await renderDailyPdf(stressed));
    expect(stressed.pours.find((p) => p.report.pour.name === "Check pour")?.records.map((r) => r.tag)).toEqual([
      "C-01",
      "C-02",
    ]);
    expect(stressedText).toContain("0 lift-off checks, 0 detensions.");
    expect(stressedText).not.toMatch(/Lift-? ?off check \(ordered|Detension \(ordered/);
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
    expect(csv.data.filter((r) => r.Section === "signature").map((r) => r.Details)).toEqual(
      signatureRows(values, first.contentSha256),
    );
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
    for (const f of standing.report.openExceptions)
      expect(conformance).toContain(`flag ${f.reference} (${f.pourName}, ${f.tendonTag}`);
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

  it("a lift-off check made later on a signed day is a change: the signed revision no longer matches", async () => {
    const standing = await listDailyRevisions(t.db, { projectId: fx.projectId, day: DAY });
    expect(standing.current.signed).toBe(true);
    const last = standing.revisions[0]!.revision;
    // The signed file holds the day's lift-off check and detension.
    const signed = (
      await pdfTextOf((await readSignedDailyReport(t.db, { projectId: fx.projectId, day: DAY, revision: last })).body)
    ).replace(/(\w)- (\w)/g, "$1-$2");
    expect(signed).toContain(`Lift-off check (ordered by disposition ${ordered.liftoff})`);
    expect(signed).toContain(`Detension (ordered by disposition ${ordered.detension})`);

    await liftoff("2026-11-18T22:00:00Z"); // 16:00 CST on the day
    const pending = await listDailyRevisions(t.db, { projectId: fx.projectId, day: DAY });
    expect(pending.current.signed).toBe(false);
    expect(pending.current.changesSinceSigned).toEqual([
      expect.stringMatching(
        /^lift-off Check pour C-01 end A 2026-11-18 16:00 CST: added \(.* at 3900 psi, .*the band\)$/,
      ),
    ]);
    expect(pending.report.asOf.getTime()).toBeGreaterThanOrEqual(new Date("2026-11-18T22:00:00Z").getTime());
    const signature = Papa.parse<Record<string, string>>(
      (await getDailyCsv(t.db, { projectId: fx.projectId, day: DAY })).csv,
      { header: true, skipEmptyLines: true },
    ).data.filter((r) => r.Section === "signature");
    expect(signature.map((r) => r.Details)).toEqual([
      expect.stringMatching(
        new RegExp(
          `^Signature: Not signed: the content changed after revision ${last} was signed .*no longer matches this content`,
        ),
      ),
    ]);
    // A lift-off check on the next day in the project's zone changes nothing of this day.
    await liftoff("2026-11-19T06:30:00Z"); // 00:30 CST on 2026-11-19
    const again = await listDailyRevisions(t.db, { projectId: fx.projectId, day: DAY });
    expect(again.current.contentSha256).toBe(pending.current.contentSha256);
  }, 60_000);
});
