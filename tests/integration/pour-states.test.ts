import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import * as perPour from "@/db/migrations/2026-12-14T090000-pour-states-per-pour";
import { pushOps } from "@/lib/server/push-ops";
import { releasePour } from "@/lib/server/release-pour";
import { reopenPour } from "@/lib/server/reopen-pour";
import type { TestDatabase } from "../support/database";
import { makePour } from "../support/factories";
import { demoPerson } from "../support/records";
import { syncWorld, createOp, type SyncWorld } from "./sync-fixtures";

// pour_states was rewritten so that PostgreSQL reads only the pours asked for. Its rows must be
// the ones the former definition gives, on pours in every state, made here with one-end and
// two-end tendons: an end still missing, every end recorded, released, released and reopened,
// released again after its reopening, tendons but no record, and no tendon at all.

let t: TestDatabase;
let w: SyncWorld;
let app: Db;

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(3));
});
afterAll(() => t.drop());

/** A pour of our own with a two-end and a one-end tendon shaped as the demo schedule's. */
async function pourWithTendons(name: string): Promise<{ pourId: string; both: string; single: string }> {
  const demoPour = await t.db
    .selectFrom("pours")
    .select("concrete_strength_mpa")
    .where("id", "=", w.pourId)
    .executeTakeFirstOrThrow();
  const pour = await makePour(t.db, w.projectId, { name, concreteStrengthMPa: demoPour.concrete_strength_mpa });
  const ids: string[] = [];
  for (const ends of ["both", "A"] as const) {
    const source = w.tendons.find((x) => x.ends === ends)!;
    const row = await t.db
      .insertInto("tendons")
      .columns(["project_id", "pour_id", "tag", "kind", "strand_size", "strand_count", "segments", "ends"])
      .expression((eb) =>
        eb
          .selectFrom("tendons")
          .select(["project_id", eb.val(pour.id).as("pour_id"), eb.val(`PS-${ends}`).as("tag"), "kind"])
          .select(["strand_size", "strand_count", "segments", "ends"])
          .where("id", "=", source.id),
      )
      .returning("id")
      .executeTakeFirstOrThrow();
    ids.push(row.id);
  }
  return { pourId: pour.id, both: ids[0]!, single: ids[1]! };
}

async function record(pourId: string, tendonId: string, tendonEnd: "A" | "B") {
  const op = createOp(w, tendonId, { tendonEnd, marksAfter: await w.inBandAfter(tendonId) }, { pourId });
  const { results } = await pushOps(app, { user: w.crew, deviceId: "tablet-pour-states", ops: [op] });
  expect(results[0]!.status).toBe("applied");
}

/** A pour whose every scheduled end has a record. */
async function stressed(name: string): Promise<string> {
  const pour = await pourWithTendons(name);
  await record(pour.pourId, pour.both, "A");
  await record(pour.pourId, pour.both, "B");
  await record(pour.pourId, pour.single, "A");
  return pour.pourId;
}

async function engineer() {
  return { ...(await demoPerson(t.db, "engineer@demo.tautline.test")), role: "engineer" as const };
}

async function release(pourId: string) {
  await releasePour(t.db, {
    projectId: w.projectId,
    pourId,
    by: await engineer(),
    statement: "Every end in band; tails may be cut.",
    signerName: "Dana Okafor",
    licence: "PE 048213 (invented)",
  });
}

async function reopen(pourId: string) {
  await reopenPour(t.db, { projectId: w.projectId, pourId, by: await engineer(), reason: "A gauge to check again." });
}

const rows = async () =>
  (await sql<Record<string, unknown>>`select * from pour_states order by pour_id`.execute(t.db)).rows;

describe("pour_states", () => {
  it("gives the same rows as its former definition, on pours in every state", async () => {
    const allEnds = await stressed("Every end recorded");
    const released = await stressed("Released");
    await release(released);
    const reopened = await stressed("Released and reopened");
    await release(reopened);
    await reopen(reopened);
    const again = await stressed("Released again after a reopening");
    await release(again);
    await reopen(again);
    await release(again);
    const oneMissing = await pourWithTendons("End B of the two-end tendon missing");
    await record(oneMissing.pourId, oneMissing.both, "A");
    await record(oneMissing.pourId, oneMissing.single, "A");
    const unrecorded = await pourWithTendons("Tendons, no record");
    const empty = await makePour(t.db, w.projectId, { name: "No tendon yet" });

    const now = await rows();
    const status = (pourId: string) => now.find((r) => r.pour_id === pourId)?.status;
    expect([allEnds, released, reopened, again, oneMissing.pourId, unrecorded.pourId, empty.id].map(status)).toEqual([
      "stressed",
      "released",
      "stressed",
      "released",
      "stressing",
      "planned",
      "planned",
    ]);
    expect(now.find((r) => r.pour_id === again)).toMatchObject({ last_reopen_reason: "A gauge to check again." });

    // The former definition (the migration's down), then this one again.
    await perPour.down(t.db);
    try {
      expect(await rows()).toEqual(now);
    } finally {
      await perPour.up(t.db);
    }
    expect(await rows()).toEqual(now);
  });
});
