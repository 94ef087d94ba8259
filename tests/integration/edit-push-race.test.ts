import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import { pushOps } from "@/lib/server/push-ops";
import { updateTendon } from "@/lib/server/update-tendon";
import { updateStrandLot } from "@/lib/server/update-strand-lot";
import type { TendonInput } from "@/lib/schemas/tendon";
import type { TestDatabase } from "../support/database";
import { syncWorld, createOp, type SyncWorld } from "./sync-fixtures";

// A schedule or strand-lot edit that commits between a pushed record's read and its write: the
// edit raises the tendons' versions, so the push's guard refuses its first write and the record is
// judged again on the edited values (never stored with a verdict on the old ones).

let t: TestDatabase;
let w: SyncWorld;
let app: Db;
const DEVICE = "tablet-edit-race";

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(5));
});
afterAll(() => t.drop());

async function scheduleOf(tendonId: string): Promise<TendonInput> {
  const r = await t.db.selectFrom("tendons").selectAll().where("id", "=", tendonId).executeTakeFirstOrThrow();
  return {
    tag: r.tag,
    kind: r.kind,
    strandSize: r.strand_size,
    strandCount: r.strand_count,
    segments: r.segments,
    ends: r.ends,
    jackGripMm: r.jack_grip_mm,
    shopElongationMm: r.shop_elongation_mm,
    strandLotId: r.strand_lot_id,
  };
}

const oneEnded = (skip: number) => w.tendons.filter((x) => x.ends !== "both")[skip]!;
const latestEvaluation = (tendonId: string) =>
  t.db
    .selectFrom("evaluations")
    .select(["verdict", "reason"])
    .where("tendon_id", "=", tendonId)
    .orderBy("created_at", "desc")
    .executeTakeFirstOrThrow();

/**
 * Pushes an in-band reading of the tendon, running `edit` between the push's read and its first
 * write; answers the attempts the push made and its results.
 */
async function pushWithEditBetween(tendonId: string, edit: () => Promise<unknown>) {
  const op = createOp(w, tendonId, { marksAfter: await w.inBandAfter(tendonId) });
  const attempts: number[] = [];
  const { results } = await pushOps(app, {
    user: w.crew,
    deviceId: DEVICE,
    ops: [op],
    hooks: {
      beforeWrite: async (_op, attempt) => {
        attempts.push(attempt);
        if (attempt === 1) await edit();
      },
    },
  });
  return { attempts, results };
}

describe("an edit racing a pushed record", () => {
  it("a schedule edit between the push's read and write: the record is judged on the new schedule", async () => {
    const tendon = oneEnded(0);
    const schedule = await scheduleOf(tendon.id);
    const { attempts, results } = await pushWithEditBetween(tendon.id, () =>
      updateTendon(t.db, {
        projectId: w.projectId,
        tendonId: tendon.id,
        values: { ...schedule, segments: schedule.segments.map((g) => ({ ...g, lengthMm: g.lengthMm * 1.2 })) },
        by: w.crew.id,
      }),
    );
    expect(attempts).toEqual([1, 2]);
    expect(results[0]).toMatchObject({ status: "applied", evaluation: { verdict: "short" } });
    expect(await latestEvaluation(tendon.id)).toMatchObject({ verdict: "short", reason: expect.any(String) });
  });

  it("a strand-lot edit between the push's read and write: the record is judged on the lot's new modulus", async () => {
    // A tendon of the pour on a lot: its lot's modulus lowered 10 % turns an in-band reading short.
    const rows = await t.db
      .selectFrom("tendons")
      .select(["id", "strand_lot_id"])
      .where("pour_id", "=", w.pourId)
      .where("ends", "!=", "both")
      .where("strand_lot_id", "is not", null)
      .orderBy("tag")
      .execute();
    const tendon = rows.find((r) => r.id !== oneEnded(0).id)!;
    const lot = await t.db
      .selectFrom("strand_lots")
      .selectAll()
      .where("id", "=", tendon.strand_lot_id!)
      .executeTakeFirstOrThrow();
    const { attempts, results } = await pushWithEditBetween(tendon.id, () =>
      updateStrandLot(t.db, {
        projectId: w.projectId,
        strandLotId: lot.id,
        values: {
          lotNumber: lot.lot_number,
          strandSize: lot.strand_size,
          areaMm2: lot.area_mm2,
          modulusMPa: lot.modulus_mpa * 0.9,
          breakingLoadN: lot.breaking_load_n,
          certificateAttachmentId: lot.certificate_attachment_id,
        },
        by: w.crew.id,
      }),
    );
    expect(attempts).toEqual([1, 2]);
    expect(results[0]).toMatchObject({ status: "applied", evaluation: { verdict: "short" } });
  });
});
