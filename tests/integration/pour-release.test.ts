import { afterAll, beforeAll, describe, expect, it, onTestFinished } from "vitest";
import type { Db } from "@/db/connect";
import { pourSchema } from "@/lib/schemas/pour";
import { releaseSchema, reopenSchema } from "@/lib/schemas/review";
import { correctRecord } from "@/lib/server/correct-record";
import { createTendon } from "@/lib/server/create-tendon";
import { findReleaseCandidates } from "@/lib/server/find-release-candidates";
import { findStandingRelease } from "@/lib/server/find-standing-release";
import { getPourReport } from "@/lib/server/get-pour-report";
import { importTendonSchedule } from "@/lib/server/import-tendon-schedule";
import { pullChanges } from "@/lib/server/pull-changes";
import { pushOps } from "@/lib/server/push-ops";
import { recordDisposition } from "@/lib/server/record-disposition";
import { listConcreteResults } from "@/lib/server/list-concrete-results";
import { releasePour } from "@/lib/server/release-pour";
import { reopenPour } from "@/lib/server/reopen-pour";
import { renderPourPdf } from "@/lib/reports/pour-pdf";
import { readSignedReport } from "@/lib/server/read-signed-report";
import { pourReportContentSha256, reportContentSha256, signPourReport } from "@/lib/server/sign-pour-report";
import { verifyReportFile } from "@/lib/server/verify-report-file";
import { pdfText } from "../support/pdf-text";
import type { TestDatabase } from "../support/database";
import { demoPerson } from "../support/records";
import { makePour, makeTendons } from "../support/factories";
import { syncWorld, createOp, type SyncWorld } from "./sync-fixtures";

let t: TestDatabase;
let w: SyncWorld;
let app: Db;
let people: Record<"admin" | "inspector" | "engineer", { id: string; name: string }>;

/**
 * Each test makes the pour it is about (`newPour`, `stressedPour`, `releasedPour`), so any of them
 * passes alone and in any order: a pour of our own in the demo project with one-end tendons copied
 * from the demo schedule, its concrete confirmed, and a tablet of its own.
 */
interface TestPour {
  pourId: string;
  tendonIds: string[];
  device: string;
}

async function newPour(name: string, tendons = 2): Promise<TestPour> {
  const demoPour = await t.db
    .selectFrom("pours")
    .select(["concrete_strength_mpa"])
    .where("id", "=", w.pourId)
    .executeTakeFirstOrThrow();
  const pour = await makePour(t.db, w.projectId, { name, concreteStrengthMPa: demoPour.concrete_strength_mpa });
  const sources = w.tendons.filter((x) => x.ends === "A").slice(0, tendons);
  const tendonIds: string[] = [];
  for (const [i, source] of sources.entries()) {
    const s = await t.db.selectFrom("tendons").selectAll().where("id", "=", source.id).executeTakeFirstOrThrow();
    const [row] = await makeTendons(t.db, { projectId: w.projectId, pourId: pour.id }, [`RT-${i + 1}`], {
      kind: s.kind,
      strandSize: s.strand_size,
      strandCount: s.strand_count,
      segments: s.segments,
      ends: s.ends,
      jackGripMm: s.jack_grip_mm,
      strandLotId: s.strand_lot_id,
    });
    tendonIds.push(row!.id);
  }
  return { pourId: pour.id, tendonIds, device: `tablet-${pour.id.slice(0, 8)}` };
}

/** The crew's in-band record of one tendon of the pour, as the tablet sends it. */
const inBandOp = async (pour: TestPour, tendonId: string) =>
  createOp(w, tendonId, { marksAfter: await w.inBandAfter(tendonId) }, { pourId: pour.pourId });

/** A pour whose every tendon has an in-band record (status "stressed"). */
async function stressedPour(name: string, tendons = 2): Promise<TestPour> {
  const pour = await newPour(name, tendons);
  for (const tendonId of pour.tendonIds) {
    const pushed = await pushOps(app, { user: w.crew, deviceId: pour.device, ops: [await inBandOp(pour, tendonId)] });
    expect(pushed.results[0]).toMatchObject({ status: "applied", evaluation: { verdict: "in band", flagKinds: [] } });
  }
  return pour;
}

const FIRST_RELEASE = "Both tendons in band; tails may be cut.";

/** A stressed pour the engineer has released. */
async function releasedPour(name: string): Promise<TestPour> {
  const pour = await stressedPour(name);
  await release(pour.pourId, FIRST_RELEASE);
  return pour;
}

const stateOf = async (pourId: string) =>
  t.db.selectFrom("pour_states").selectAll().where("pour_id", "=", pourId).executeTakeFirstOrThrow();
const recordCount = async (pourId: string) =>
  Number(
    (
      await t.db
        .selectFrom("records")
        .select((eb) => eb.fn.countAll<number>().as("n"))
        .where("pour_id", "=", pourId)
        .executeTakeFirstOrThrow()
    ).n,
  );
/** The crew member as the pull sees a session: their project memberships. */
const crewSession = () =>
  ({
    memberships: w.crew.memberships.map((m) => ({ ...m, projectName: "", projectCode: "" })),
  }) as unknown as Parameters<typeof pullChanges>[1]["user"];
const engineer = () => ({ ...people.engineer, role: "engineer" as const });

/** The inspector's paperwork correction of the tendon's record: the length copied 1 mm short. */
async function correctOneMm(tendonId: string) {
  const record = await t.db
    .selectFrom("records")
    .select(["id", "measured_mm"])
    .where("tendon_id", "=", tendonId)
    .executeTakeFirstOrThrow();
  return correctRecord(t.db, {
    projectId: w.projectId,
    recordId: record.id,
    by: { id: people.inspector.id },
    correction: { reason: "Copied from the wrong line.", measuredMm: record.measured_mm + 1 },
  });
}

type Release = Parameters<typeof releasePour>[1];
/** A release of the pour by `by` (the engineer unless said), signed as the demo's engineer signs. */
const release = (pourId: string, statement: string, by: Release["by"] = engineer(), hooks?: Release["hooks"]) =>
  releasePour(t.db, {
    projectId: w.projectId,
    pourId,
    by,
    statement,
    signerName: "Dana Okafor",
    licence: "PE 048213 (invented)",
    hooks,
  });
/** A reopen of the pour by `by` (the engineer unless said), for `reason`. */
const reopen = (pourId: string, reason: string, by: Release["by"] = engineer()) =>
  reopenPour(t.db, { projectId: w.projectId, pourId, by, reason });

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(3));
  const user = (email: string) => demoPerson(t.db, email);
  people = {
    admin: await user("admin@demo.tautline.test"),
    inspector: await user("inspector@demo.tautline.test"),
    engineer: await user("engineer@demo.tautline.test"),
  };
});
afterAll(() => t.drop());

describe("a pour's status follows from its records and its release", () => {
  it("is planned, then stressing, then stressed, and the pour form cannot set it", async () => {
    const pour = await newPour("Status pour");
    const { pourId, tendonIds } = pour;
    expect((await stateOf(pourId)).status).toBe("planned");
    const first = await pushOps(app, {
      user: w.crew,
      deviceId: pour.device,
      ops: [await inBandOp(pour, tendonIds[0]!)],
    });
    expect(first.results[0]).toMatchObject({ status: "applied", evaluation: { verdict: "in band", flagKinds: [] } });
    expect((await stateOf(pourId)).status).toBe("stressing");
    const second = await pushOps(app, {
      user: w.crew,
      deviceId: pour.device,
      ops: [await inBandOp(pour, tendonIds[1]!)],
    });
    expect(second.results[0]).toMatchObject({ status: "applied", evaluation: { flagKinds: [] } });
    expect((await stateOf(pourId)).status).toBe("stressed");

    const set = pourSchema.safeParse({
      name: "X",
      level: null,
      areaM2: null,
      plannedStressingDate: null,
      status: "released",
    });
    expect(set.success).toBe(false);
    expect(set.error?.issues[0]).toMatchObject({
      path: ["status"],
      message: expect.stringMatching(/follows from its records/),
    });
    expect(pourSchema.safeParse({ name: "X", level: null, areaM2: null, plannedStressingDate: null }).success).toBe(
      true,
    );
  });
});

describe("release", () => {
  it("is refused to an admin, the inspector (on an engineer-released project) and the crew; the statement must be confirmed", async () => {
    const { pourId } = await stressedPour("Release refused pour");
    for (const role of ["admin", "inspector"] as const) {
      await expect(release(pourId, "Trying to release it.", { ...people[role], role })).rejects.toMatchObject({
        code: "FORBIDDEN",
      });
    }
    await expect(release(pourId, "Crew release.", { id: w.crew.id, name: "Crew", role: "crew" })).rejects.toMatchObject(
      { code: "FORBIDDEN" },
    );
    expect((await stateOf(pourId)).status).toBe("stressed");
    const unconfirmed = releaseSchema.safeParse({ statement: "All tendons accepted; tails may be cut." });
    expect(unconfirmed.error?.issues.map((i) => i.path.join("."))).toEqual(["signerName", "licence", "confirmed"]);
    expect(
      releaseSchema.safeParse({ statement: "All tendons accepted; tails may be cut.", confirmed: false }).success,
    ).toBe(false);
  });

  it("by the engineer freezes the pour: the push answers rejected, and no tendon or correction is taken", async () => {
    const pour = await stressedPour("Release pour");
    const { pourId, tendonIds } = pour;
    const cursorBefore = (await pullChanges(t.db, { user: crewSession(), cursor: "0", pourIds: [pourId] })).cursor;
    await release(pourId, "Both tendons in band; tails may be cut.");
    const state = await stateOf(pourId);
    expect(state).toMatchObject({ status: "released", released_by_name: people.engineer.name });
    await expect(release(pourId, "A second release of the same pour.")).rejects.toMatchObject({ code: "CONFLICT" });

    // The tablet learns of the release on its next pull, though no record changed.
    const pulled = await pullChanges(t.db, { user: crewSession(), cursor: cursorBefore, pourIds: [pourId] });
    expect(pulled.pours).toEqual([
      expect.objectContaining({
        id: pourId,
        status: "released",
        release: expect.objectContaining({ by: people.engineer.name }),
        reopened: null,
      }),
    ]);

    const before = await recordCount(pourId);
    const pushed = await pushOps(app, {
      user: w.crew,
      deviceId: pour.device,
      ops: [await inBandOp(pour, tendonIds[0]!)],
    });
    expect(pushed.results[0]).toMatchObject({
      status: "rejected",
      error: {
        code: "RELEASED",
        message: expect.stringMatching(
          /released: it takes no new record or tendon unless the engineer of record reopens it/,
        ),
      },
    });
    expect(await recordCount(pourId)).toBe(before);
    const claims = await t.db.selectFrom("applied_ops").select("op_id").where("device_id", "=", pour.device).execute();
    expect(claims).toHaveLength(2);

    const template = await t.db
      .selectFrom("tendons")
      .selectAll()
      .where("id", "=", tendonIds[0]!)
      .executeTakeFirstOrThrow();
    await expect(
      createTendon(t.db, {
        projectId: w.projectId,
        pourId,
        values: {
          tag: "RT-3",
          kind: template.kind,
          strandSize: template.strand_size,
          strandCount: template.strand_count,
          segments: template.segments,
          ends: template.ends,
          jackGripMm: null,
          shopElongationMm: null,
          strandLotId: null,
        } as Parameters<typeof createTendon>[1]["values"],
      }),
    ).rejects.toMatchObject({ code: "CONFLICT", message: expect.stringMatching(/released/) });
    await expect(
      importTendonSchedule(t.db, { projectId: w.projectId, pourId, csv: "tag\nRT-9\n", by: people.admin.id }),
    ).rejects.toMatchObject({ code: "CONFLICT" });
    const record = await t.db
      .selectFrom("records")
      .select("id")
      .where("pour_id", "=", pourId)
      .executeTakeFirstOrThrow();
    await expect(
      correctRecord(t.db, {
        projectId: w.projectId,
        recordId: record.id,
        by: { id: people.inspector.id },
        correction: { reason: "Copied from the wrong line.", measuredMm: 200 },
      }),
    ).rejects.toMatchObject({ code: "CONFLICT" });
    expect(await recordCount(pourId)).toBe(before);
    expect(await t.db.selectFrom("tendons").select("id").where("pour_id", "=", pourId).execute()).toHaveLength(2);
  });

  it("is also enforced by the database, whatever path a write comes by", async () => {
    const { pourId, tendonIds } = await releasedPour("Database-guarded pour");
    const source = await t.db.selectFrom("records").selectAll().where("pour_id", "=", pourId).executeTakeFirstOrThrow();
    await expect(
      t.db
        .insertInto("records")
        .values({
          ...source,
          id: crypto.randomUUID(),
          chain_id: crypto.randomUUID(),
          entered: JSON.stringify(source.entered),
          change_xid: undefined,
        } as never)
        .execute(),
    ).rejects.toMatchObject({ code: "TL423" });
    await expect(
      t.db.updateTable("tendons").set({ tag: "RT-1b" }).where("id", "=", tendonIds[0]!).execute(),
    ).rejects.toMatchObject({ code: "TL423" });
  });
});

describe("reopen", () => {
  it("is the engineer's alone, needs a confirmed reason, and is refused on a pour that is not released", async () => {
    const { pourId } = await releasedPour("Reopen refused pour");
    for (const role of ["admin", "inspector"] as const) {
      await expect(reopen(pourId, "Reopen by the wrong person.", { ...people[role], role })).rejects.toMatchObject({
        code: "FORBIDDEN",
      });
    }
    expect(reopenSchema.safeParse({ reason: "short", confirmed: true }).success).toBe(false);
    expect(reopenSchema.safeParse({ reason: "Lift-off check ordered on RT-1.", confirmed: false }).success).toBe(false);
    const stressed = await stressedPour("Never released pour");
    await expect(reopen(stressed.pourId, "Nothing to reopen here.")).rejects.toMatchObject({ code: "CONFLICT" });
  });

  it("lets records in again, is audited and shown with the pour, and the pour can be released anew", async () => {
    const { pourId, tendonIds } = await releasedPour("Reopened pour");
    const cursorBefore = (await pullChanges(t.db, { user: crewSession(), cursor: "0", pourIds: [pourId] })).cursor;
    // The inspector signed the released pour's report before the reopen.
    const signValues = {
      signerName: "Dana Okafor",
      licence: "ICC special inspector 5551234 (invented)",
      statement: "I inspected the stressing of the tendons listed.",
    };
    const signer = { id: people.inspector.id };
    const first = await signPourReport(t.db, { projectId: w.projectId, pourId, signer, values: signValues });
    expect(first.revision).toBe(1);
    await reopen(pourId, "Lift-off check ordered on RT-1 after the site visit.");
    // The reopen is in the report's content: a new content hash, the reopening printed under the release.
    const reopened = await getPourReport(t.db, { projectId: w.projectId, pourId });
    expect(await reportContentSha256(reopened)).not.toBe(first.contentSha256);
    const reopenedText = await pdfText(await renderPourPdf(reopened));
    expect(reopenedText).toMatch(
      new RegExp(
        `Released by ${people.engineer.name} on [^,]+, reopened by ${people.engineer.name} on \\d{4}-\\d\\d-\\d\\d \\d\\d:\\d\\d [A-Z]+: Lift-off check ordered on RT-1 after the site visit\\.`,
      ),
    );
    expect(reopenedText).toContain("Not released.");
    // Signing again gives revision 2, whose "what changed" names the reopen; the old file is superseded.
    const second = await signPourReport(t.db, { projectId: w.projectId, pourId, signer, values: signValues });
    expect(second.revision).toBe(2);
    expect(second.changes.join("\n")).toMatch(
      new RegExp(`reopening 1: added \\(reopened by ${people.engineer.name} on .*: Lift-off check ordered on RT-1`),
    );
    expect(second.changes).toContain(`release: released by ${people.engineer.name} → not released`);
    const signed2 = await readSignedReport(t.db, { projectId: w.projectId, pourId, revision: 2 });
    expect(await pdfText(signed2.body)).toMatch(/What changed .*reopening 1: added/);
    expect(await verifyReportFile(t.db, { sha256: first.fileSha256 })).toMatchObject({
      match: true,
      revision: 1,
      latest: false,
      supersededBy: 2,
    });
    expect(await verifyReportFile(t.db, { sha256: second.fileSha256 })).toMatchObject({
      match: true,
      revision: 2,
      latest: true,
      supersededBy: null,
    });
    const state = await stateOf(pourId);
    expect(state).toMatchObject({ status: "stressed", release_id: null, last_reopened_by_name: people.engineer.name });
    // The reopened release no longer stands: the report and the tendon page show none.
    expect(await findStandingRelease(t.db, { projectId: w.projectId, pourId })).toBeUndefined();
    expect((await getPourReport(t.db, { projectId: w.projectId, pourId })).release).toBeNull();
    const audit = await t.db
      .selectFrom("audit_events")
      .select(["action", "outcome", "detail"])
      .where("action", "=", "pour.reopen")
      .where("target", "=", pourId)
      .execute();
    expect(audit).toEqual([
      expect.objectContaining({
        outcome: "success",
        detail: expect.objectContaining({ reason: expect.stringMatching(/Lift-off/) }),
      }),
    ]);
    await expect(t.db.deleteFrom("pour_reopenings").where("pour_id", "=", pourId).execute()).rejects.toThrow(
      /append-only/,
    );

    const pulled = await pullChanges(t.db, { user: crewSession(), cursor: cursorBefore, pourIds: [pourId] });
    expect(pulled.pours[0]).toMatchObject({
      status: "stressed",
      release: null,
      reopened: { by: people.engineer.name, reason: expect.stringMatching(/Lift-off/) },
    });

    // The paperwork correction refused while the pour stood released is taken now.
    const corrected = await correctOneMm(tendonIds[0]!);
    expect(corrected.evaluation).toMatchObject({ verdict: "in band" });

    // The list shows its times in the project's zone, not the server's or UTC.
    const { time_zone: zoneBefore } = await t.db
      .selectFrom("projects")
      .select("time_zone")
      .where("id", "=", w.projectId)
      .executeTakeFirstOrThrow();
    onTestFinished(async () => {
      await t.db.updateTable("projects").set({ time_zone: zoneBefore }).where("id", "=", w.projectId).execute();
    });
    await t.db.updateTable("projects").set({ time_zone: "America/Denver" }).where("id", "=", w.projectId).execute();
    const [candidate] = (await findReleaseCandidates(t.db, [w.projectId])).filter((c) => c.pourId === pourId);
    expect(candidate).toMatchObject({
      status: "stressed",
      releasedBy: null,
      reopened: { by: people.engineer.name },
      timeZone: "America/Denver",
    });

    await release(pourId, "Lift-off checked; released again.");
    expect((await stateOf(pourId)).status).toBe("released");
    const releases = await t.db
      .selectFrom("releases")
      .select("statement")
      .where("pour_id", "=", pourId)
      .orderBy("created_at")
      .execute();
    expect(releases.map((r) => r.statement)).toEqual([FIRST_RELEASE, "Lift-off checked; released again."]);
    // The report names the release that stands, not the first one found.
    expect((await getPourReport(t.db, { projectId: w.projectId, pourId })).release).toMatchObject({
      statement: "Lift-off checked; released again.",
    });
    // The concrete box of a released pour shows the release that stands (it never says "do not stress").
    const gate = await listConcreteResults(t.db, { projectId: w.projectId, pourId });
    expect(gate.release).toMatchObject({ by: engineer().name });
    expect(new Date(gate.release!.at).getTime()).toBeGreaterThan(Date.now() - 60_000);
  });
});

describe("decisions sync down", () => {
  it("a pull carries the tendon's open flag with its reason, then the engineer's disposition with the instruction", async () => {
    const tendonId = w.tendons.find((x) => x.ends === "A")!.id;
    const start = (await pullChanges(t.db, { user: crewSession(), cursor: "0", pourIds: [w.pourId] })).cursor;
    const long = createOp(w, tendonId, { marksAfter: "9" });
    const pushed = await pushOps(app, { user: w.crew, deviceId: "tablet-decisions", ops: [long] });
    expect(pushed.results[0]).toMatchObject({ status: "applied", evaluation: { verdict: "long" } });

    const first = await pullChanges(t.db, { user: crewSession(), cursor: start, pourIds: [w.pourId] });
    const flag = first.flags.find((f) => f.tendonId === tendonId && f.kind === "out_of_band");
    expect(flag).toMatchObject({ status: "open", reason: expect.stringMatching(/long|band/i), dispositions: [] });

    await recordDisposition(t.db, {
      projectId: w.projectId,
      flagId: flag!.id,
      engineer: people.engineer,
      disposition: {
        decision: "restress",
        reasons: "Detension is not needed; restress to 3,350 psi and re-read the marks.",
        licenceStatement: "Licensed professional engineer (test)",
      },
    });
    const second = await pullChanges(t.db, { user: crewSession(), cursor: first.cursor, pourIds: [w.pourId] });
    const again = second.flags.find((f) => f.id === flag!.id);
    expect(again).toMatchObject({
      status: "with_engineer",
      dispositions: [
        {
          decision: "restress",
          reasons: "Detension is not needed; restress to 3,350 psi and re-read the marks.",
          engineerName: people.engineer.name,
        },
      ],
    });
  });
});

describe("the release's report hash", () => {
  const HASH_RELEASE = "Tendon in band; tails may be cut.";

  it("is the report drawn before the lock when nothing changed in between", async () => {
    const pour = await stressedPour("Hash pour, quiet", 1);
    const before = await pourReportContentSha256(t.db, { projectId: w.projectId, pourId: pour.pourId });
    const released = await release(pour.pourId, HASH_RELEASE);
    expect(released).toMatchObject({ contentSha256: before, redrawn: false });
  });

  it("covers a record that arrives between the draw and the lock: the report is drawn again under the lock", async () => {
    const pour = await stressedPour("Hash pour, late record", 1);
    const before = await pourReportContentSha256(t.db, { projectId: w.projectId, pourId: pour.pourId });
    let withLateRecord = "";
    let lateRecordId = "";
    const released = await release(pour.pourId, HASH_RELEASE, engineer(), {
      afterDraw: async () => {
        // A paperwork correction stores a new record revision of the tendon while the report is drawn.
        const corrected = await correctOneMm(pour.tendonIds[0]!);
        expect(corrected.evaluation).toMatchObject({ verdict: "in band" });
        lateRecordId = corrected.recordId;
        withLateRecord = await pourReportContentSha256(t.db, { projectId: w.projectId, pourId: pour.pourId });
      },
    });
    expect(lateRecordId).not.toBe("");
    expect(withLateRecord).not.toBe(before);
    expect(released).toMatchObject({ contentSha256: withLateRecord, redrawn: true });
    const stored = await t.db
      .selectFrom("releases")
      .select("content_sha256")
      .where("id", "=", released.releaseId)
      .executeTakeFirstOrThrow();
    expect(stored.content_sha256).toBe(withLateRecord);
  });

  it("draws nothing for a release that is refused", async () => {
    const pour = await stressedPour("Hash pour, refused", 1);
    let drawn = false;
    await expect(
      release(
        pour.pourId,
        "Inspector release.",
        { ...people.inspector, role: "inspector" },
        { afterDraw: () => void (drawn = true) },
      ),
    ).rejects.toMatchObject({ code: "FORBIDDEN" });
    expect(drawn).toBe(false);
  });
});
