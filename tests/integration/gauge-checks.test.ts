import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/scripts/seed/demo";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { getPourInsight } from "@/lib/server/get-pour-insight";
import { pullChanges } from "@/lib/server/pull-changes";
import { queueGaugeChecks } from "@/lib/server/queue-gauge-checks";
import { gaugeChecks, judgedFromRecords } from "@/lib/stressing/gauge-check";
import { MomentOld } from "@/db/moment-old";
import { createTestDatabase, type TestDatabase } from "../support/database";

// The demo seed has a set whose gauge reads off on one pour; its size may be retuned, so these
// tests take the drifting sets from the insight page's own figures, never from demo numbers.

let t: TestDatabase;
let drifting: { projectId: string; pourId: string; unitSystem: string; sets: { id: string; name: string }[] }[];

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db, { records: true });
  const pours = await t.db
    .selectFrom("pours")
    .innerJoin("projects", "projects.id", "pours.project_id")
    .select(["pours.id", "pours.project_id", "projects.unit_system"])
    .execute();
  drifting = [];
  for (const p of pours) {
    const insight = await getPourInsight(new MomentOld(t.db, null), { projectId: p.project_id, pourId: p.id });
    const sets = insight.driftOnPour.filter((d) => d.drifting).map((d) => ({ id: d.setId, name: d.setName }));
    if (sets.length) drifting.push({ projectId: p.project_id, pourId: p.id, unitSystem: p.unit_system, sets });
  }
});
afterAll(async () => {
  await t.drop();
});

const gaugeMails = () =>
  t.db
    .selectFrom("notifications")
    .select(["dedupe_key", "to_emails", "subject", "text_body"])
    .where("dedupe_key", "like", "gauge:%")
    .orderBy("dedupe_key")
    .execute();

async function judgeAgain(pourId: string) {
  const tendon = await t.db
    .selectFrom("tendons")
    .innerJoin("evaluations", "evaluations.tendon_id", "tendons.id")
    .select(["tendons.id", "tendons.project_id"])
    .where("tendons.pour_id", "=", pourId)
    .limit(1)
    .executeTakeFirstOrThrow();
  await evaluateTendon(t.db, { projectId: tendon.project_id, tendonId: tendon.id, reason: "test: judged again" });
}

describe("the inspector's gauge check e-mail", () => {
  it("finds the demo's drifting set through the insight page", () => {
    expect(drifting.length).toBeGreaterThan(0);
  });

  it("goes once per set per pour per day, even with two dispatchers at once, to the inspectors", async () => {
    const expected = drifting.flatMap((p) => p.sets.map((s) => `gauge:${p.pourId}:${s.id}:`));
    const now = new Date();
    const counts = await Promise.all([queueGaugeChecks(t.db, { now }), queueGaugeChecks(t.db, { now })]);
    expect(counts[0]! + counts[1]!).toBe(expected.length);
    const mails = await gaugeMails();
    expect(mails.map((m) => m.dedupe_key.replace(/\d{4}-\d{2}-\d{2}$/, "")).sort()).toEqual(expected.sort());
    for (const mail of mails) {
      const pour = drifting.find((p) => mail.dedupe_key.startsWith(`gauge:${p.pourId}:`))!;
      const set = pour.sets.find((s) => mail.dedupe_key.includes(s.id))!;
      expect(mail.to_emails).toEqual(["inspector@demo.tautline.test"]);
      expect(mail.subject).toContain(set.name);
      expect(mail.text_body).toContain("against the master gauge");
      expect(mail.text_body).toMatch(new RegExp(`${set.name}: mean deviation [+−]\\d+\\.\\d % over \\d+ tendons`));
      expect(mail.text_body).toContain("OSHA 29 CFR 1926.701(c)");
      if (pour.unitSystem === "us") expect(mail.text_body).not.toMatch(/MPa|mm\b/);
    }

    // Nothing new to look at: nothing more.
    expect(await queueGaugeChecks(t.db, { now })).toBe(0);
    // A tendon judged again the same day: looked at again, but the day's e-mail is already out.
    await judgeAgain(drifting[0]!.pourId);
    expect(await queueGaugeChecks(t.db, { now: new Date() })).toBe(0);
    expect(await gaugeMails()).toHaveLength(expected.length);

    // Judged again the next day while the set still drifts: the next day's e-mail goes.
    await judgeAgain(drifting[0]!.pourId);
    const tomorrow = new Date(Date.now() + 24 * 3_600_000);
    expect(await queueGaugeChecks(t.db, { now: tomorrow })).toBe(drifting[0]!.sets.length);
  });

  it("the tablet finds the same sets from what the pull carries, with the same function", async () => {
    const p = drifting[0]!;
    const user = {
      memberships: [{ projectId: p.projectId, role: "crew", projectName: "", projectCode: "" }],
    } as unknown as Parameters<typeof pullChanges>[1]["user"];
    const pulled = await pullChanges(t.db, { user, cursor: "0", pourIds: [p.pourId] });
    const records = new Map(pulled.records.map((r) => [r.id, r]));
    const names = new Map(pulled.equipmentSets.map((s) => [s.id, s.name]));
    const latest = new Map<string, (typeof pulled.evaluations)[number]>();
    for (const e of [...pulled.evaluations].sort((a, b) => a.createdAt.localeCompare(b.createdAt)))
      latest.set(e.tendonId, e);
    expect([...latest.values()].every((e) => e.recordIds?.length)).toBe(true);
    const judged = [...latest.values()].map((e) => judgedFromRecords(e, records, names));
    expect(judged.every(Boolean)).toBe(true);
    const onTablet = gaugeChecks(judged.filter((j) => j !== null));
    expect(onTablet.map((c) => c.setId).sort()).toEqual(p.sets.map((s) => s.id).sort());
    const insight = await getPourInsight(new MomentOld(t.db, null), { projectId: p.projectId, pourId: p.pourId });
    const server = insight.driftOnPour.find((d) => d.setId === onTablet[0]!.setId)!;
    expect(onTablet[0]!.meanPct).toBeCloseTo(server.meanPct, 9);
    expect(onTablet[0]!.n).toBe(server.n);
  });
});
