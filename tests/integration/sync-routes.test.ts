import fc from "fast-check";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { SessionUser } from "@/lib/auth/session";
import type { RecordPayload } from "@/lib/schemas/record";
import type { PullResponse, PushResponse } from "@/lib/schemas/sync";
import { pullResponseSchema, type PullAnswer } from "@/lib/schemas/sync-response";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { routeState } from "./route-mocks";
import { buildWorld, createOp, reviseOp, rowsOf, type SyncWorld } from "./sync-fixtures";

// The real route modules, with the app's database and the session swapped for the test's own:
// everything between the HTTP request and PostgreSQL is the code that runs in production.
vi.mock("@/db", async () => (await import("./route-mocks")).mockedDb);
vi.mock("@/lib/auth/session", async () => (await import("./route-mocks")).mockedSession);

const { POST: push } = await import("@/app/api/sync/push/route");
const { GET: pull } = await import("@/app/api/sync/pull/route");
const { GET: download } = await import("@/app/api/field/pours/[pourId]/route");
const { GET: listPours } = await import("@/app/api/field/pours/route");

let t: TestDatabase;
let w: SyncWorld;
let crew: SessionUser;
const ORIGIN = process.env.APP_URL ?? "http://localhost:3000";
const noParams = { params: Promise.resolve({}) };

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  w = await buildWorld(t.db);
  routeState.db = t.db;
  crew = {
    id: w.crew.id,
    email: w.crew.email,
    name: "Crew",
    isOperator: false,
    memberships: w.crew.memberships.map((m) => ({ ...m, projectName: "", projectCode: "" })),
  };
  routeState.user = crew;
});
afterAll(async () => {
  await t.drop();
});

function postPush(body: string, headers: Record<string, string> = {}): Promise<Response> {
  return push(
    new NextRequest(`${ORIGIN}/api/sync/push`, {
      method: "POST",
      body,
      headers: { "content-type": "application/json", origin: ORIGIN, ...headers },
    }),
    noParams,
  );
}
const getJson = async <T>(res: Response) => ({ status: res.status, body: (await res.json()) as T });

describe("POST /api/sync/push through the route", () => {
  it("answers 401 without a session and 403 to a role that never records, writing nothing", async () => {
    const body = JSON.stringify({ deviceId: "tablet-routes-01", ops: [createOp(w, w.tendons[0]!.id)] });
    routeState.user = null;
    expect((await postPush(body)).status).toBe(401);
    routeState.user = {
      ...crew,
      id: w.inspector.id,
      memberships: w.inspector.memberships.map((m) => ({ ...m, projectName: "", projectCode: "" })),
    };
    expect((await postPush(body)).status).toBe(403);
    routeState.user = crew;
    expect(await rowsOf(t.db, "records")).toBe(0);
  });

  it("answers 422 naming the fields of a malformed envelope", async () => {
    const res = await getJson<{ error: { fields: Record<string, string[]> } }>(
      await postPush(JSON.stringify({ deviceId: "x", ops: [] })),
    );
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(["deviceId", "ops"]);
  });

  it("never answers 5xx and never writes a row for a rejected op, over 10,000 random malformed bodies", async () => {
    const valid = () => createOp(w, w.tendons[20]!.id);
    const payloadKeys = Object.keys(valid().payload as object);
    // Bodies from anything at all to valid envelopes whose payload has one field replaced by junk.
    const junk = fc.oneof(
      fc.anything(),
      fc.string(),
      fc.double(),
      fc.integer(),
      fc.constant(null),
      fc.uuid(),
      fc.array(fc.anything(), { maxLength: 3 }),
    );
    const mutatedOp = fc
      .record({ key: fc.constantFrom(...payloadKeys, "opId", "kind", "recordId", "baseVersion", "extra"), value: junk })
      .map(({ key, value }) => {
        const op = valid() as unknown as Record<string, unknown> & { payload: Record<string, unknown> };
        if (["opId", "kind", "recordId", "baseVersion", "extra"].includes(key)) op[key] = value;
        else op.payload[key] = value;
        return op;
      });
    const body = fc.oneof(
      { weight: 1, arbitrary: fc.anything().map((v) => JSON.stringify(v) ?? "null") },
      { weight: 1, arbitrary: fc.string() },
      {
        weight: 1,
        arbitrary: fc
          .record({
            deviceId: fc.oneof(fc.string(), fc.constant("tablet-fuzz-0001")),
            ops: fc.array(junk, { maxLength: 3 }),
          })
          .map((b) => JSON.stringify(b)),
      },
      {
        weight: 4,
        arbitrary: fc
          .array(mutatedOp, { minLength: 1, maxLength: 3 })
          .map((ops) => JSON.stringify({ deviceId: "tablet-fuzz-0001", ops })),
      },
    );
    let applied = 0;
    let answered422 = 0;
    const before = await rowsOf(t.db, "records");
    await fc.assert(
      fc.asyncProperty(body, async (text) => {
        const res = await postPush(text);
        expect(res.status).toBeLessThan(500);
        if (res.status === 422) answered422++;
        if (res.status === 200) {
          const { results } = (await res.json()) as PushResponse;
          for (const r of results) {
            expect(["applied", "duplicate", "conflict", "rejected"]).toContain(r.status);
            if (r.status === "applied") applied++;
          }
        }
      }),
      { numRuns: Number(process.env.FUZZ_RUNS ?? 10_000) },
    );
    // Every row written belongs to an op the server answered "applied".
    expect(await rowsOf(t.db, "records")).toBe(before + applied);
    expect(answered422).toBeGreaterThan(0);
  }, 600_000);
});

describe("pull and download through the routes", () => {
  const get = (handler: typeof pull, url: string, params: Record<string, string> = {}) =>
    handler(new NextRequest(`${ORIGIN}${url}`), { params: Promise.resolve(params) });

  it("lists the pours a crew member may take out, and downloads one with its tendons, sets and calibrations", async () => {
    const list = await getJson<{ pours: { id: string; projectCode: string; tendonCount: number }[] }>(
      await get(listPours, "/api/field/pours"),
    );
    expect(list.status).toBe(200);
    expect(list.body.pours.every((p) => p.projectCode === "AYP")).toBe(true);
    expect(list.body.pours.find((p) => p.id === w.pourId)?.tendonCount).toBe(w.tendons.length);

    const res = await getJson<PullResponse>(await get(download, `/api/field/pours/${w.pourId}`, { pourId: w.pourId }));
    expect(res.status).toBe(200);
    expect(res.body.tendons).toHaveLength(w.tendons.length);
    expect(res.body.projects.map((p) => p.code)).toEqual(["AYP"]);
    expect(res.body.equipmentSets).toHaveLength(2);
    expect(res.body.calibrations).toHaveLength(2);
    expect(res.body.cursor).toMatch(/^\d+$/);
  });

  it("sends the concrete strengths spelt MPa, and the old spelling beside them for apps cached before it", async () => {
    const before = await t.db
      .selectFrom("projects")
      .innerJoin("pours", "pours.project_id", "projects.id")
      .select(["projects.required_concrete_mpa", "pours.concrete_strength_mpa"])
      .where("pours.id", "=", w.pourId)
      .executeTakeFirstOrThrow();
    await t.db.updateTable("projects").set({ required_concrete_mpa: 28 }).where("id", "=", w.projectId).execute();
    await t.db.updateTable("pours").set({ concrete_strength_mpa: 31.5 }).where("id", "=", w.pourId).execute();
    try {
      for (const res of [
        await getJson<PullAnswer>(await get(download, `/api/field/pours/${w.pourId}`, { pourId: w.pourId })),
        await getJson<PullAnswer>(await get(pull, `/api/sync/pull?cursor=0&pours=${w.pourId}`)),
      ]) {
        expect(res.status).toBe(200);
        const project = res.body.projects.find((p) => p.id === w.projectId);
        const pour = res.body.pours.find((p) => p.id === w.pourId);
        expect(project).toMatchObject({ requiredConcreteMPa: 28, requiredConcreteMpa: 28 });
        expect(pour).toMatchObject({ concreteStrengthMPa: 31.5, concreteStrengthMpa: 31.5 });

        // The tablet parses the answer before storing it and keeps the contract's names only.
        const kept = pullResponseSchema.parse(res.body);
        expect(kept.projects.find((p) => p.id === w.projectId)).not.toHaveProperty("requiredConcreteMpa");
        expect(kept.projects.find((p) => p.id === w.projectId)?.requiredConcreteMPa).toBe(28);
        expect(kept.pours.find((p) => p.id === w.pourId)).not.toHaveProperty("concreteStrengthMpa");
        expect(kept.pours.find((p) => p.id === w.pourId)?.concreteStrengthMPa).toBe(31.5);
      }
    } finally {
      await t.db
        .updateTable("projects")
        .set({ required_concrete_mpa: before.required_concrete_mpa })
        .where("id", "=", w.projectId)
        .execute();
      await t.db
        .updateTable("pours")
        .set({ concrete_strength_mpa: before.concrete_strength_mpa })
        .where("id", "=", w.pourId)
        .execute();
    }
  });

  it("does not download another project's pour (404), nor pull it (listed unavailable)", async () => {
    expect((await get(download, `/api/field/pours/${w.foreign.pourId}`, { pourId: w.foreign.pourId })).status).toBe(
      404,
    );
    const res = await getJson<PullResponse>(await get(pull, `/api/sync/pull?cursor=0&pours=${w.foreign.pourId}`));
    expect(res.body.unavailable).toEqual([w.foreign.pourId]);
    expect(res.body.tendons).toEqual([]);
    expect((await get(pull, `/api/sync/pull?cursor=abc&pours=nope`)).status).toBe(422);
  });

  it("returns what changed since the cursor and nothing twice once the cursor has moved past it", async () => {
    const first = await getJson<PullResponse>(await get(pull, `/api/sync/pull?cursor=0&pours=${w.pourId}`));
    const op = createOp(w, w.tendons[21]!.id) as ReturnType<typeof createOp> & { payload: RecordPayload };
    const pushed = await getJson<PushResponse>(
      await postPush(JSON.stringify({ deviceId: "tablet-routes-01", ops: [op] })),
    );
    expect(pushed.body.results[0]!.status).toBe("applied");
    await t.db.updateTable("tendons").set({ jack_grip_mm: 400 }).where("id", "=", w.tendons[22]!.id).execute();

    const second = await getJson<PullResponse>(
      await get(pull, `/api/sync/pull?cursor=${first.body.cursor}&pours=${w.pourId}`),
    );
    expect(second.body.records.map((r) => r.id)).toContain(op.recordId);
    expect(second.body.tendons.map((x) => x.id)).toContain(w.tendons[22]!.id);
    expect(second.body.evaluations.map((e) => e.tendonId)).toContain(w.tendons[21]!.id);
    expect(second.body.equipmentSets).toEqual([]);

    // A correction appears as the next revision; a deleted tendon as a tombstone.
    const fix = reviseOp(
      { recordId: op.recordId, revision: 1, payload: op.payload },
      { remarks: "Recorded the wrong end mark" },
    );
    await postPush(JSON.stringify({ deviceId: "tablet-routes-01", ops: [fix] }));
    await t.db.deleteFrom("tendons").where("id", "=", w.tendons[49]!.id).execute();
    const third = await getJson<PullResponse>(
      await get(pull, `/api/sync/pull?cursor=${second.body.cursor}&pours=${w.pourId}`),
    );
    expect(third.body.records.map((r) => [r.id, r.revision])).toEqual([[fix.recordId, 2]]);
    expect(third.body.removed).toEqual([{ table: "tendons", id: w.tendons[49]!.id }]);
    expect(third.body.tendons.map((x) => x.id)).not.toContain(w.tendons[22]!.id);
  });

  it("never lets a row committed late slip behind the cursor", async () => {
    const start = await getJson<PullResponse>(await get(pull, `/api/sync/pull?cursor=0&pours=${w.pourId}`));
    // A writer takes its transaction id, then a pull runs, then the writer commits.
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    let wrote!: () => void;
    const written = new Promise<void>((r) => (wrote = r));
    const writer = t.db.transaction().execute(async (trx) => {
      await trx.updateTable("tendons").set({ jack_grip_mm: 410 }).where("id", "=", w.tendons[30]!.id).execute();
      wrote();
      await gate;
    });
    await written;
    const during = await getJson<PullResponse>(
      await get(pull, `/api/sync/pull?cursor=${start.body.cursor}&pours=${w.pourId}`),
    );
    expect(during.body.tendons.map((x) => x.id)).not.toContain(w.tendons[30]!.id);
    release();
    await writer;
    const after = await getJson<PullResponse>(
      await get(pull, `/api/sync/pull?cursor=${during.body.cursor}&pours=${w.pourId}`),
    );
    expect(after.body.tendons.find((x) => x.id === w.tendons[30]!.id)?.jackGripMm).toBe(410);
  });
});
