import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { findFlagTrail } from "@/lib/server/find-flag-trail";
import { findFlags } from "@/lib/server/find-flags";
import { getPourReport } from "@/lib/server/get-pour-report";
import { reference } from "@/lib/format/references";
import { seedDemo } from "@/scripts/seed/demo";
import { createTestDatabase, type TestDatabase } from "../support/database";

// The office screens name flags and dispositions by the same project reference as the stressing
// report ("F-0012", "D-0007"): the trail numbers them in the database, the report in its own query,
// and the two must agree for every flag and disposition of every pour.

let t: TestDatabase;
beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db, { records: true });
});
afterAll(async () => {
  await t.drop();
});

const tendonOf = async (flagId: string) =>
  (await t.db.selectFrom("flags").select("tendon_id").where("id", "=", flagId).executeTakeFirst())?.tendon_id;

describe("flag and disposition references", () => {
  it("the trail's references are the stressing report's, and each is used once in the project", async () => {
    const project = await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow();
    const pours = await t.db.selectFrom("pours").select("id").where("project_id", "=", project.id).execute();
    const seenFlags = new Set<string>();
    const seenDispositions = new Set<string>();
    let dispositionsCompared = 0;
    for (const pour of pours) {
      const trail = await findFlagTrail(t.db, { projectId: project.id, pourId: pour.id });
      const report = await getPourReport(t.db, { projectId: project.id, pourId: pour.id });
      for (const f of trail.flags) {
        const inReport = report.flags.find((r) => r.id === f.id);
        expect(f.reference).toMatch(/^F-\d{4,}$/);
        expect(f.reference).toBe(inReport!.reference);
        expect(seenFlags.has(f.reference)).toBe(false);
        seenFlags.add(f.reference);
        const reportDispositions = inReport!.dispositions.map((d) => d.reference);
        const trailDispositions = trail.dispositions.filter((d) => d.flagId === f.id).map((d) => d.reference);
        expect(trailDispositions).toEqual(reportDispositions);
        for (const d of trailDispositions) {
          expect(seenDispositions.has(d)).toBe(false);
          seenDispositions.add(d);
          dispositionsCompared += 1;
        }
      }
    }
    expect(seenFlags.size, "the demo raises flags").toBeGreaterThan(2);
    expect(dispositionsCompared, "the demo records dispositions").toBeGreaterThan(0);
    // Numbered from 1 without a gap across the project.
    const total = await t.db
      .selectFrom("flags")
      .select((eb) => eb.fn.countAll<string>().as("n"))
      .where("project_id", "=", project.id)
      .executeTakeFirstOrThrow();
    expect(seenFlags.has(`F-${String(Number(total.n)).padStart(4, "0")}`)).toBe(true);
    expect(seenFlags.has("F-0001")).toBe(true);

    // The review queue names each open flag by the same reference.
    const queue = await findFlags(t.db, { projectIds: [project.id], filter: { status: "any_open" } });
    const queued = queue.flatMap((tendon) => tendon.flags);
    expect(queued.length).toBeGreaterThan(0);
    for (const f of queued) {
      const [trail] = (
        await findFlagTrail(t.db, { projectId: project.id, tendonId: (await tendonOf(f.id))! })
      ).flags.filter((x) => x.id === f.id);
      expect(f.reference).toBe(trail!.reference);
    }
  });

  it("a reference is given once at insert and never moves, even for a flag stamped earlier that commits later", async () => {
    const project = await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow();
    const tendon = await t.db
      .selectFrom("tendons")
      .select(["id", "pour_id"])
      .where("project_id", "=", project.id)
      .limit(1)
      .executeTakeFirstOrThrow();
    const flag = (created_at: Date) => ({
      project_id: project.id,
      pour_id: tendon.pour_id,
      tendon_id: tendon.id,
      record_id: null,
      evaluation_id: null,
      kind: "wire_break" as const,
      reason: "Reference numbering check.",
      created_at,
    });
    const before = await t.db
      .selectFrom("flags")
      .select(["id", "number"])
      .where("project_id", "=", project.id)
      .orderBy("number")
      .execute();
    const last = before.at(-1)!.number;

    // Two writers at once: each waits for the other's number, neither takes the same one.
    const [a, b] = await Promise.all(
      [new Date(), new Date()].map((at) =>
        t.db
          .transaction()
          .execute((trx) =>
            trx.insertInto("flags").values(flag(at)).returning(["id", "number"]).executeTakeFirstOrThrow(),
          ),
      ),
    );
    expect([a!.number, b!.number].sort((x, y) => x - y)).toEqual([last + 1, last + 2]);

    // A flag stamped a year back (as a transaction that began long ago would stamp it) comes last.
    const late = await t.db
      .insertInto("flags")
      .values(flag(new Date(Date.now() - 365 * 24 * 3600 * 1000)))
      .returning(["id", "number"])
      .executeTakeFirstOrThrow();
    expect(late.number).toBe(last + 3);
    const after = await t.db
      .selectFrom("flags")
      .select(["id", "number"])
      .where("project_id", "=", project.id)
      .where(
        "id",
        "in",
        before.map((f) => f.id),
      )
      .orderBy("number")
      .execute();
    expect(after).toEqual(before);
    const trail = await findFlagTrail(t.db, { projectId: project.id, tendonId: tendon.id });
    expect(trail.flags.find((f) => f.id === late.id)?.reference).toBe(reference("F", last + 3));
  });
});
