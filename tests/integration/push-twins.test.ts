import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import type { Database } from "@/db/types";
import type { OpResult, SyncOp } from "@/lib/schemas/sync";
import { pushOps } from "@/lib/server/push-ops";
import type { TestDatabase } from "../support/database";
import { syncWorld, createOp, type SyncWorld } from "./sync-fixtures";

// A tablet whose answer was late sends its batch again while the first delivery is still being
// applied: two deliveries of the same batch at once. Each op lands once, both answers say the same
// thing (applied and duplicate, with the same revision and evaluation), each flag e-mail is queued once,
// and the second delivery does not judge the tendon again.

let t: TestDatabase;
let w: SyncWorld;
let app: Db;
const DEVICE = "tablet-twins-01";

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(5));
});
afterAll(() => t.drop());

/** Three records of single-end tendons, the second far out of band (a flag and its e-mail). */
async function batchOn(tendonIds: string[]): Promise<SyncOp[]> {
  return Promise.all(
    tendonIds.map(async (id, i) => createOp(w, id, { marksAfter: i === 1 ? "9" : await w.inBandAfter(id) })),
  );
}

function singleEnded(from: number, count: number): string[] {
  const ids = w.tendons.filter((x) => x.ends !== "both").map((x) => x.id);
  expect(ids.length).toBeGreaterThanOrEqual(from + count);
  return ids.slice(from, from + count);
}

/**
 * For each op, the answers of the two deliveries agree: one applied, one duplicate, the same
 * result. Answers the records, claims, flags and e-mails the applied answers stand for: one of
 * each per op, a flag per kind its evaluation names, an e-mail per evaluation that raised any.
 */
function expectAgreeing(ops: SyncOp[], first: OpResult[], second: OpResult[]) {
  const flagKinds = ops.map(
    (_, i) => [first[i]!, second[i]!].find((r) => r.status === "applied")?.evaluation?.flagKinds,
  );
  ops.forEach((op, i) => {
    const pair: [OpResult, OpResult] = [first[i]!, second[i]!];
    expect(pair.map((r) => r.opId)).toEqual([op.opId, op.opId]);
    expect(pair.map((r) => r.status).sort()).toEqual(["applied", "duplicate"]);
    const [applied, duplicate] = pair[0].status === "applied" ? pair : [pair[1], pair[0]];
    expect(applied.evaluation).toBeDefined();
    expect({ ...duplicate, status: "applied" }).toEqual(applied);
  });
  const raised = flagKinds.map((kinds) => kinds?.length ?? 0);
  // The out-of-band record raised its flag.
  expect(raised[1]).toBeGreaterThan(0);
  return {
    records: ops.length,
    claims: ops.length,
    flags: raised.reduce((a, b) => a + b, 0),
    mails: raised.filter((n) => n > 0).length,
  };
}

/** Records, claims, flags and queued e-mails the ops left. */
async function storedBy(ops: SyncOp[]) {
  const recordIds = ops.map((o) => o.recordId);
  const tendonIds = ops.map((o) => (o.payload as { tendonId: string }).tendonId);
  const [records, claims, flags, mails] = await Promise.all([
    t.db.selectFrom("records").select("id").where("id", "in", recordIds).execute(),
    t.db
      .selectFrom("applied_ops")
      .select("op_id")
      .where(
        "op_id",
        "in",
        ops.map((o) => o.opId),
      )
      .execute(),
    t.db.selectFrom("flags").select("id").where("tendon_id", "in", tendonIds).execute(),
    t.db
      .selectFrom("notifications")
      .innerJoin("flags", "flags.id", "notifications.flag_id")
      .select("notifications.id")
      .where("flags.tendon_id", "in", tendonIds)
      .execute(),
  ]);
  return { records: records.length, claims: claims.length, flags: flags.length, mails: mails.length };
}

describe("one batch delivered twice at once", () => {
  it("on one server: each op lands once, the answers agree, and the second delivery writes nothing", async () => {
    const ops = await batchOn(singleEnded(0, 3));
    const writes: string[] = [];
    const deliver = () =>
      pushOps(app, { user: w.crew, deviceId: DEVICE, ops, hooks: { beforeWrite: (op) => void writes.push(op.opId) } });
    const [first, second] = await Promise.all([deliver(), deliver()]);
    const expected = expectAgreeing(ops, first.results, second.results);
    expect(await storedBy(ops)).toEqual(expected);
    // The later delivery of each op waited for the first and answered from its claim: no op was
    // judged and written twice.
    expect(writes.sort()).toEqual(ops.map((o) => o.opId).sort());
  });

  it("on two servers, both past their read: the refused write answers from the claim without reading the tendon again", async () => {
    const ops = await batchOn(singleEnded(3, 3));
    const sent: string[] = [];
    const other: Kysely<Database> = new Kysely<Database>({
      dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: t.url, max: 5 }) }),
      log: (event) => void sent.push(event.query.sql),
    });
    try {
      // Each op is written by neither server until both have read and judged it.
      const arrived = new Map<string, number>();
      const bothThere = new Map<string, () => void>();
      const gates = new Map(ops.map((o) => [o.opId, new Promise<void>((go) => bothThere.set(o.opId, go))]));
      const beforeWrite = async (op: SyncOp) => {
        const n = (arrived.get(op.opId) ?? 0) + 1;
        arrived.set(op.opId, n);
        if (n === 2) bothThere.get(op.opId)!();
        await gates.get(op.opId);
      };
      const [first, second] = await Promise.all([
        pushOps(app, { user: w.crew, deviceId: DEVICE, ops, hooks: { beforeWrite } }),
        pushOps(other, { user: w.crew, deviceId: DEVICE, ops, hooks: { beforeWrite } }),
      ]);
      const expected = expectAgreeing(ops, first.results, second.results);
      expect(await storedBy(ops)).toEqual(expected);
      expect([...arrived.values()]).toEqual([2, 2, 2]);
      // The second server read each tendon's state once (the read joins tendon_versions); the
      // ops it lost were answered from the claim.
      const reads = sent.filter((s) => s.includes('"tendon_versions"') && s.trimStart().startsWith("select"));
      expect(reads).toHaveLength(3);
      const lost = second.results.filter((r) => r.status === "duplicate").length;
      const claimReads = sent.filter((s) => /^select "user_id", "result" from "applied_ops"/.test(s));
      expect(claimReads).toHaveLength(lost);
    } finally {
      await other.destroy();
    }
  });
});
