import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { importTendonSchedule } from "@/lib/server/import-tendon-schedule";
import { pullChanges } from "@/lib/server/pull-changes";
import { pushOps } from "@/lib/server/push-ops";
import type { SyncOp } from "@/lib/schemas/sync";
import { formatLength, parseLength, MM_PER_INCH } from "@/lib/units";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { demoPerson } from "../support/records";
import type { RecordFormValues, RecordPayload } from "@/lib/schemas/record";
import { buildWorld, recordPayload, type SyncWorld } from "./sync-fixtures";

// What the record form adds to a record reaches PostgreSQL through the push and is judged there:
// the finer second reading, the wire breaks' strand and place, the stressing order, the gauge steps.

let t: TestDatabase;
let w: SyncWorld;
const DEVICE = "tablet-details-0001";

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  w = await buildWorld(t.db);
});
afterAll(async () => {
  await t.drop();
});

/** A new record of end A as the tablet builds it, with its op. */
function createOp(tendonId: string, form: Partial<RecordFormValues> = {}, extra: Partial<RecordPayload> = {}) {
  const { recordId, payload } = recordPayload(w, tendonId, form, extra);
  return { opId: crypto.randomUUID(), kind: "create" as const, recordId, payload } satisfies SyncOp;
}

const push = (ops: SyncOp[]) => pushOps(t.db, { user: w.crew, deviceId: DEVICE, ops });
const oneEnd = () => w.tendons.filter((x) => x.ends !== "both");
const latestEvaluation = (tendonId: string) =>
  t.db
    .selectFrom("evaluations")
    .select(["measured_mm", "verdict", "result", "inputs"])
    .where("tendon_id", "=", tendonId)
    .orderBy("created_at", "desc")
    .executeTakeFirstOrThrow();

describe("push: the finer second reading", () => {
  it("stores the first reading beside the re-read and judges the re-read", async () => {
    const tendon = oneEnd()[0]!;
    const after = await w.inBandAfter(tendon.id);
    // The first reading 1/8 in long, the re-read on the prediction (to the nearest 1/8 in).
    const first = formatLength(
      parseLength(after, { field: "after", system: "SI", defaultUnit: "in" }) + MM_PER_INCH / 8,
      "1/8 in",
    );
    const op = createOp(tendon.id, { marksAfter: first, rereadMarksAfter: after });
    expect(op.payload.firstReadingMm).not.toBeNull();
    const [result] = (await push([op])).results;
    expect(result!.status).toBe("applied");
    const row = await t.db
      .selectFrom("records")
      .select(["measured_mm", "first_reading_mm", "reread_declined_reason", "entered"])
      .where("id", "=", op.recordId)
      .executeTakeFirstOrThrow();
    expect(row.measured_mm).toBeCloseTo(op.payload.measuredMm, 9);
    expect(row.first_reading_mm).toBeCloseTo(op.payload.firstReadingMm!, 9);
    expect(row.reread_declined_reason).toBeNull();
    expect((row.entered as { reread?: unknown }).reread).toEqual({ marksAfter: after, strokes: null });
    const evaluation = await latestEvaluation(tendon.id);
    const readings = (evaluation.inputs as { readings: { firstReadingMm: number | null; measuredMm: number }[] })
      .readings;
    expect(readings[0]!.measuredMm).toBeCloseTo(op.payload.measuredMm, 9);
    expect(readings[0]!.firstReadingMm).toBeCloseTo(op.payload.firstReadingMm!, 9);
  });

  it("stores the crew's reason when it could not be read again, and refuses a reason beside a re-read", async () => {
    const tendon = oneEnd()[1]!;
    const declined = createOp(tendon.id, { rereadDeclinedReason: "Tails already cut at this end" });
    expect((await push([declined])).results[0]!.status).toBe("applied");
    const row = await t.db
      .selectFrom("records")
      .select(["first_reading_mm", "reread_declined_reason"])
      .where("id", "=", declined.recordId)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({ first_reading_mm: null, reread_declined_reason: "Tails already cut at this end" });

    const before = await t.db.selectFrom("records").select(t.db.fn.countAll().as("n")).executeTakeFirstOrThrow();
    const both = createOp(oneEnd()[2]!.id, { rereadMarksAfter: "4 7/16" }, { rereadDeclinedReason: "no reason" });
    const [answer] = (await push([both])).results;
    expect(answer!.status).toBe("rejected");
    expect(JSON.stringify(answer)).toContain("rereadDeclinedReason");
    const after = await t.db.selectFrom("records").select(t.db.fn.countAll().as("n")).executeTakeFirstOrThrow();
    expect(after.n).toBe(before.n);
  });
});

describe("push: wire breaks, which strand and where", () => {
  it("stores each break's strand and place, and the wire-break flag names them", async () => {
    const tendon = oneEnd()[3]!;
    const op = createOp(tendon.id, {
      wireBreaks: "1",
      wireBreakDetails: [{ strand: "1", strandNotKnown: false, where: "far_end" }],
    });
    expect((await push([op])).results[0]!.status).toBe("applied");
    const row = await t.db
      .selectFrom("records")
      .select(["wire_breaks", "wire_break_details"])
      .where("id", "=", op.recordId)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({ wire_breaks: 1, wire_break_details: [{ strand: 1, where: "far_end" }] });
    const flag = await t.db
      .selectFrom("flags")
      .select("reason")
      .where("tendon_id", "=", tendon.id)
      .where("kind", "=", "wire_break")
      .executeTakeFirstOrThrow();
    expect(flag.reason).toContain("strand 1, at the far end");
  });

  it("refuses a strand the tendon does not have, naming the field, and writes nothing", async () => {
    const tendon = oneEnd()[4]!;
    const strands = await t.db
      .selectFrom("tendons")
      .select("strand_count")
      .where("id", "=", tendon.id)
      .executeTakeFirstOrThrow();
    const op = createOp(
      tendon.id,
      { wireBreaks: "0" },
      {
        wireBreaks: 1,
        wireBreakDetails: [{ strand: strands.strand_count + 1, where: "jack_end" }],
      },
    );
    const [answer] = (await push([op])).results;
    expect(answer!.status).toBe("rejected");
    expect(answer!.error?.fields).toHaveProperty("wireBreakDetails.0.strand");
    const stored = await t.db.selectFrom("records").select("id").where("id", "=", op.recordId).execute();
    expect(stored).toEqual([]);
  });
});

describe("the schedule's stressing order", () => {
  it("is imported into the tendon row, which the tablet pulls as the form's default", async () => {
    const admin = await demoPerson(t.db, "admin@demo.tautline.test");
    const csv = [
      "tag,type,strand size [in],strands,ends,segments [ft@deg],stressing order",
      "SO-1,multistrand,0.6,12,both,40@5.7 40@5.7,simultaneous",
      "SO-2,multistrand,0.6,12,both,40@5.7 40@5.7,",
    ].join("\n");
    expect(await importTendonSchedule(t.db, { projectId: w.projectId, pourId: w.pourId, csv, by: admin.id })).toEqual({
      imported: 2,
    });
    const rows = await t.db
      .selectFrom("tendons")
      .select(["tag", "stressing_order"])
      .where("pour_id", "=", w.pourId)
      .where("tag", "in", ["SO-1", "SO-2"])
      .orderBy("tag")
      .execute();
    expect(rows).toEqual([
      { tag: "SO-1", stressing_order: "simultaneous" },
      { tag: "SO-2", stressing_order: null },
    ]);
    const user = {
      memberships: w.crew.memberships.map((m) => ({ ...m, projectName: "", projectCode: "" })),
    };
    const pulled = await pullChanges(t.db, { user, cursor: "0", pourIds: [w.pourId] });
    expect(pulled.tendons.find((x) => x.tag === "SO-1")?.stressingOrder).toBe("simultaneous");
  });
});
