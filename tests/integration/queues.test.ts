import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { correctRecord } from "@/lib/server/correct-record";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { findClockSkews } from "@/lib/server/find-clock-skews";
import { findFlags } from "@/lib/server/find-flags";
import { getHomeSummary } from "@/lib/server/get-home-summary";
import { getTendonCase } from "@/lib/server/get-tendon-case";
import { recordDisposition } from "@/lib/server/record-disposition";
import { releasePour } from "@/lib/server/release-pour";
import {
  copyDemoTendons,
  demoPerson,
  demoStressing,
  seededDemo,
  type DemoFixture,
  insertDemoRecord,
} from "../support/records";
import { makePour } from "../support/factories";
import { type TestDatabase } from "../support/database";

let t: TestDatabase;
let fx: DemoFixture;
let pourId: string;
let tendons: { id: string; pour_id: string; tag: string }[];
let inspector: { id: string; name: string };
let pressure: number;
let predicted: (tendonId: string) => Promise<number>;
let stress: Awaited<ReturnType<typeof demoStressing>>["stress"];

beforeAll(async () => {
  ({ t, fx } = await seededDemo());
  pourId = (await makePour(t.db, fx.projectId, { name: "Queue test pour", concreteStrengthMPa: 30 })).id;
  tendons = await copyDemoTendons(t.db, { projectId: fx.projectId, pourId }, ["Q-1", "Q-2", "Q-3"]);
  inspector = await demoPerson(t.db, "inspector@demo.tautline.test");
  ({ pressure, predicted, stress } = await demoStressing(t.db, fx));
});
afterAll(async () => {
  await t.drop();
});

describe("queues show the tendon as it stands", () => {
  it("a flagged tendon whose reading was corrected into band shows the latest verdict, with its flag still open", async () => {
    const q1 = tendons[0]!;
    const { recordId, evaluation } = await stress(q1, 1.144);
    expect(evaluation.verdict).toBe("long");
    const before = await findFlags(t.db, { projectIds: [fx.projectId], filter: { status: "any_open", pourId } });
    expect(before).toHaveLength(1);
    expect(before[0]).toMatchObject({ tag: "Q-1", verdict: "long" });
    expect(before[0]!.deviationPct).toBeCloseTo(14.4, 0);

    const corrected = await correctRecord(t.db, {
      projectId: fx.projectId,
      recordId,
      by: inspector,
      correction: { reason: "Tail mark was read from the wrong paint line.", measuredMm: await predicted(q1.id) },
    });
    expect(corrected.evaluation.verdict).toBe("in band");

    const after = await findFlags(t.db, { projectIds: [fx.projectId], filter: { status: "any_open", pourId } });
    expect(after).toHaveLength(1);
    expect(after[0]!.verdict).toBe("in band");
    expect(Math.abs(after[0]!.deviationPct ?? 99)).toBeLessThan(1);
    // The flag that the long reading raised is still open and says so.
    expect(after[0]!.flags.map((f) => [f.kind, f.status])).toEqual([["out_of_band", "open"]]);

    // The home page's queues and the decisions page read the same list.
    const project = await t.db
      .selectFrom("projects")
      .select("name")
      .where("id", "=", fx.projectId)
      .executeTakeFirstOrThrow();
    const home = await getHomeSummary(t.db, {
      memberships: [{ projectId: fx.projectId, projectName: project.name, role: "engineer" }],
      now: new Date("2026-12-10T18:00:00Z"),
    });
    const card = home.waitingDisposition.find((w) => w.tendonId === q1.id);
    expect(card?.verdict).toBe("in band");
  });
});

describe("clock skew is visible", () => {
  it("marks a record whose tablet time is off the receipt by more than the project's threshold, or after it", async () => {
    const q2 = tendons[1]!;
    // 30 minutes behind the server: beyond the default 10 minutes.
    await stress(q2, 0.85, { deviceTime: new Date(Date.now() - 30 * 60_000).toISOString() });
    const queue = await findFlags(t.db, { projectIds: [fx.projectId], filter: { status: "any_open", pourId } });
    expect(queue.find((q) => q.tendonId === q2.id)?.clockSkewRecords).toBe(1);
    // The tendon flagged earlier with a right clock is not marked.
    expect(queue.find((q) => q.tendonId === tendons[0]!.id)?.clockSkewRecords).toBe(0);

    const c = await getTendonCase(t.db, { projectId: fx.projectId, tendonId: q2.id });
    expect(c.records).toHaveLength(1);
    expect(c.records[0]!.skew?.future).toBe(false);
    expect(c.records[0]!.skew?.minutes).toBeLessThan(-29);
    expect(c.records[0]!.receivedAt).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);

    // A wider threshold of the project's own clears it.
    await t.db.updateTable("projects").set({ clock_skew_minutes: 60 }).where("id", "=", fx.projectId).execute();
    const wide = await findFlags(t.db, { projectIds: [fx.projectId], filter: { status: "any_open", pourId } });
    expect(wide.find((q) => q.tendonId === q2.id)?.clockSkewRecords).toBe(0);
    expect((await getTendonCase(t.db, { projectId: fx.projectId, tendonId: q2.id })).records[0]!.skew).toBeNull();

    // A device time after the receipt is marked whatever the threshold.
    const q3 = tendons[2]!;
    await stress(q3, 0.85, { deviceTime: new Date(Date.now() + 5 * 60_000).toISOString() });
    const future = await findFlags(t.db, { projectIds: [fx.projectId], filter: { status: "any_open", pourId } });
    expect(future.find((q) => q.tendonId === q3.id)?.clockSkewRecords).toBe(1);
    const c3 = await getTendonCase(t.db, { projectId: fx.projectId, tendonId: q3.id });
    expect(c3.records[0]!.skew?.future).toBe(true);
    await t.db.updateTable("projects").set({ clock_skew_minutes: 10 }).where("id", "=", fx.projectId).execute();
  });
});

/** A one-end tendon like the demo's 2-1-U01 on the given pour. */
async function addTendon(onPour: string, tag: string) {
  const [tendon] = await copyDemoTendons(t.db, { projectId: fx.projectId, pourId: onPour }, [tag]);
  return tendon!;
}

describe("the review queue lists every record whose time is off, flagged tendon or not", () => {
  it("lists a skewed record on an unflagged tendon with both times, and no record with a right clock", async () => {
    // In band, so nothing flags the tendon; its tablet was 45 minutes behind the server.
    const unflagged = await addTendon(pourId, "Q-4");
    const deviceTime = new Date(Date.now() - 45 * 60_000).toISOString();
    const { recordId, evaluation } = await stress(unflagged, 1.0, { deviceTime });
    expect(evaluation.flagKinds).toEqual([]);
    const flagged = await findFlags(t.db, { projectIds: [fx.projectId], filter: { status: "any_open", pourId } });
    expect(flagged.map((q) => q.tendonId)).not.toContain(unflagged.id);

    const skewed = await findClockSkews(t.db, { projectIds: [fx.projectId], pourId });
    const row = skewed.find((r) => r.recordId === recordId);
    expect(row).toMatchObject({ tendonId: unflagged.id, tag: "Q-4", end: "A", pourId, timeZone: "America/Chicago" });
    expect(row!.deviceTime.toISOString()).toBe(deviceTime);
    expect(row!.receivedAt.getTime() - row!.deviceTime.getTime()).toBeGreaterThan(44 * 60_000);
    expect(row!.skew.future).toBe(false);
    expect(row!.skew.minutes).toBeLessThan(-44);
    // The skewed records of the flagged tendons are listed too (Q-2 behind, Q-3 ahead); Q-1,
    // stressed with a right clock, is not.
    const tags = skewed.map((r) => r.tag);
    expect(tags).toEqual(expect.arrayContaining(["Q-2", "Q-3", "Q-4"]));
    expect(tags).not.toContain("Q-1");
    expect(skewed.find((r) => r.tag === "Q-3")!.skew.future).toBe(true);
    // Without the pour filter the same records are there; another project's reviewer sees none.
    const all = await findClockSkews(t.db, { projectIds: [fx.projectId] });
    expect(all.map((r) => r.recordId)).toEqual(expect.arrayContaining(skewed.map((r) => r.recordId)));
    expect(await findClockSkews(t.db, { projectIds: [] })).toEqual([]);
  });

  it("does not list an office correction whose receipt is later than the original's tablet time", async () => {
    const tendon = await addTendon(pourId, "Q-5");
    // Received two hours ago with a right clock, then corrected in the office now.
    const twoHoursAgo = new Date(Date.now() - 2 * 3600_000);
    const recordId = await insertDemoRecord(t.db, fx, {
      tendon,
      measuredMm: await predicted(tendon.id),
      finalPressureMPa: pressure,
      deviceTime: twoHoursAgo.toISOString(),
      receivedAt: twoHoursAgo,
    });
    await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    await correctRecord(t.db, {
      projectId: fx.projectId,
      recordId,
      by: inspector,
      correction: { reason: "Tail mark copied from the wrong line.", measuredMm: (await predicted(tendon.id)) * 1.01 },
    });
    const skewed = await findClockSkews(t.db, { projectIds: [fx.projectId], pourId });
    expect(skewed.map((r) => r.tag)).not.toContain("Q-5");
    const c = await getTendonCase(t.db, { projectId: fx.projectId, tendonId: tendon.id });
    expect(c.records.map((r) => [r.revision, r.skew])).toEqual([
      [1, null],
      [2, null],
    ]);
  });

  it("leaves a released pour's records out", async () => {
    const pour = await t.db
      .insertInto("pours")
      .values({ project_id: fx.projectId, name: "Skew release pour", concrete_strength_mpa: 30 })
      .returning("id")
      .executeTakeFirstOrThrow();
    const tendon = await addTendon(pour.id, "S-1");
    const { recordId } = await stress(tendon, 1.0, { deviceTime: new Date(Date.now() - 20 * 60_000).toISOString() });
    const listed = async () => (await findClockSkews(t.db, { projectIds: [fx.projectId] })).map((r) => r.recordId);
    expect(await listed()).toContain(recordId);
    const by = await demoPerson(t.db, "engineer@demo.tautline.test");
    await releasePour(t.db, {
      projectId: fx.projectId,
      pourId: pour.id,
      by: { ...by, role: "engineer" },
      statement: "Tendon S-1 stressed and accepted; the tablet's late clock was checked with the crew.",
      signerName: by.name,
      licence: "PE 048213 (invented)",
    });
    expect(await listed()).not.toContain(recordId);
  });
});

describe("people are told", () => {
  const outbox = () =>
    t.db
      .selectFrom("notifications")
      .selectAll()
      .where("project_id", "=", fx.projectId)
      .where("dedupe_key", "not like", "evaluation:%")
      .execute();
  const engineer = () =>
    t.db
      .selectFrom("users")
      .select(["id", "name"])
      .where("email", "=", "engineer@demo.tautline.test")
      .executeTakeFirstOrThrow();

  it("queues one e-mail to crew and inspector per disposition that orders work, in the project's units, none for an acceptance", async () => {
    const before = (await outbox()).length;
    const by = await engineer();
    const flags = await t.db
      .selectFrom("flags")
      .select(["id", "tendon_id"])
      .where("pour_id", "=", pourId)
      .where("status", "!=", "closed")
      .orderBy("created_at")
      .execute();
    const onQ2 = flags.find((f) => f.tendon_id === tendons[1]!.id)!;
    const onQ3 = flags.find((f) => f.tendon_id === tendons[2]!.id)!;
    const ordered = await recordDisposition(t.db, {
      projectId: fx.projectId,
      flagId: onQ2.id,
      engineer: by,
      disposition: {
        decision: "restress",
        reasons: "Restress end A to the target gauge pressure and read again.",
        licenceStatement: "Licensed professional engineer (demo)",
      },
    });
    await recordDisposition(t.db, {
      projectId: fx.projectId,
      flagId: onQ3.id,
      engineer: by,
      disposition: {
        decision: "accept",
        reasons: "Short elongation accepted; within the member's capacity.",
        licenceStatement: "Licensed professional engineer (demo)",
      },
    });
    const rows = await outbox();
    expect(rows).toHaveLength(before + 1);
    const mail = rows.find((r) => r.dedupe_key === `disposition:${ordered.dispositionId}`)!;
    expect([...mail.to_emails].sort()).toEqual(["crew@demo.tautline.test", "inspector@demo.tautline.test"]);
    expect(mail.flag_id).toBe(onQ2.id);
    expect(mail.subject).toContain("Restress");
    expect(mail.text_body).toContain("Restress end A to the target gauge pressure");
    // The demo project is in US units: gauge in psi, elongation in inches, never MPa or mm.
    expect(mail.text_body).toMatch(/gauge [\d,]+ psi/);
    expect(mail.text_body).toMatch(/elongation [\d -\/]+ in/);
    expect(mail.text_body).not.toMatch(/MPa|\bmm\b/);
    expect(mail.text_body).toContain("Caution:");
  });

  it("queues one e-mail per release", async () => {
    const template = await t.db
      .selectFrom("tendons")
      .selectAll()
      .where("id", "=", tendons[0]!.id)
      .executeTakeFirstOrThrow();
    const pour = await t.db
      .insertInto("pours")
      .values({ project_id: fx.projectId, name: "Release notice pour", concrete_strength_mpa: 30 })
      .returning("id")
      .executeTakeFirstOrThrow();
    const tendon = await t.db
      .insertInto("tendons")
      .values({
        project_id: fx.projectId,
        pour_id: pour.id,
        tag: "N-1",
        kind: template.kind,
        strand_size: template.strand_size,
        strand_count: template.strand_count,
        segments: JSON.stringify(template.segments),
        ends: template.ends,
        jack_grip_mm: template.jack_grip_mm,
        strand_lot_id: template.strand_lot_id,
      })
      .returning(["id", "pour_id"])
      .executeTakeFirstOrThrow();
    const { evaluation } = await stress(tendon, 1.0);
    expect(evaluation.flagKinds).toEqual([]);
    const before = (await outbox()).length;
    const by = await engineer();
    const { releaseId } = await releasePour(t.db, {
      projectId: fx.projectId,
      pourId: pour.id,
      by: { ...by, role: "engineer" },
      statement: "Tendon N-1 stressed and accepted; tails may be cut.",
      signerName: by.name,
      licence: "PE 048213 (invented)",
    });
    const rows = await outbox();
    expect(rows).toHaveLength(before + 1);
    const mail = rows.find((r) => r.dedupe_key === `release:${releaseId}`)!;
    expect(mail.subject).toContain("Release notice pour");
    expect(mail.text_body).toContain("Tendon N-1 stressed and accepted; tails may be cut.");
    expect([...mail.to_emails].sort()).toEqual(["crew@demo.tautline.test", "inspector@demo.tautline.test"]);
  });
});
