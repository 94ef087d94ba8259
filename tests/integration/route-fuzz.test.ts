import { randomUUID } from "node:crypto";
import fc from "fast-check";
import { sql } from "kysely";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createDb, type Db } from "@/db/connect";
import { loadSessionUser, type SessionUser } from "@/lib/server/load-session-user";
import { settleBackground } from "@/lib/server/run-in-background";
import { seedDemo } from "@/scripts/seed/demo";
import { MATRIX, type Caller } from "../e2e/authz-matrix";
import * as api from "../support/api-routes";
import { BOGUS_TOKEN, MISSING_ID, routesOnDisk, type RouteOnDisk } from "../support/api-routes";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { routeState } from "./route-mocks";

/**
 * Fuzz of every route handler: each endpoint of the authorization matrix (so a new endpoint is
 * fuzzed as soon as the matrix lists it, which its own test enforces) is called through its real
 * route module, as a signed-in person allowed to reach it, with generated bad bodies, params and
 * queries. Every answer must be below 500; an answer 422 must name the fields at fault (unless the
 * body was not JSON at all); and any refusal (4xx) must leave every table's row count unchanged.
 *
 * Size: ROUTE_FUZZ_RUNS bodies per endpoint (default 40; `npm run test:reliability` runs 200),
 * seed FUZZ_SEED (printed by fast-check with the failing body when a property fails).
 */

vi.mock("@/db", async () => (await import("./route-mocks")).mockedDb);
vi.mock("@/lib/auth/session", async () => (await import("./route-mocks")).mockedSession);

const RUNS = Number(process.env.ROUTE_FUZZ_RUNS ?? 40);
const SEED = Number(process.env.FUZZ_SEED ?? Date.now() % 2 ** 31);
const ORIGIN = process.env.APP_URL ?? "http://localhost:3000";

// next-auth's own handlers need the Next request scope (cookies(), headers()); its one input a
// caller controls, callbackUrl, is checked before next-auth in lib/auth/callback-url.ts (tested there).
const NOT_FUZZED = new Set(["GET /api/auth/[...nextauth]", "POST /api/auth/[...nextauth]"]);

/** "METHOD /path" → the route file that serves it, from the files on disk. */
const ROUTE_FILES = new Map<string, RouteOnDisk>(routesOnDisk().map((r) => [r.endpoint, r]));

/** The first role that passes the endpoint's access check (it may still get 404/409 on the ids). */
function callerFor(endpoint: string): Caller {
  const expected = MATRIX[endpoint]!;
  const order: Caller[] = ["admin", "inspector", "engineer", "crew", "other"];
  return order.find((c) => expected[c] !== 401 && expected[c] !== 403) ?? "admin";
}

interface World {
  ids: Record<string, string>;
  /** Ids of the other project, for "an id of something that is not yours". */
  foreign: Record<string, string>;
  users: Record<Exclude<Caller, "anonymous">, SessionUser>;
}

let t: TestDatabase;
let appDb: Db;
let world: World;
let tables: string[] = [];

async function one<T>(q: Promise<T | undefined>, what: string): Promise<T> {
  const row = await q;
  if (!row) throw new Error(`the demo seed has no ${what}`);
  return row;
}

async function buildWorld(db: Db): Promise<World> {
  await seedDemo(db, { records: true });
  const project = async (code: string) =>
    (await one(db.selectFrom("projects").select("id").where("code", "=", code).executeTakeFirst(), code)).id;
  const ayp = await project("AYP");
  const qhm = await project("QHM");
  const idsOf = async (projectId: string) => {
    const pour = await db
      .selectFrom("pours")
      .select("id")
      .where("project_id", "=", projectId)
      .orderBy("name", "desc")
      .executeTakeFirst();
    const tendon = await db
      .selectFrom("tendons")
      .innerJoin("pours", "pours.id", "tendons.pour_id")
      .select("tendons.id")
      .where("pours.project_id", "=", projectId)
      .executeTakeFirst();
    const flag = await db
      .selectFrom("flags")
      .innerJoin("tendons", "tendons.id", "flags.tendon_id")
      .innerJoin("pours", "pours.id", "tendons.pour_id")
      .select("flags.id")
      .where("pours.project_id", "=", projectId)
      .where("flags.status", "=", "open")
      .executeTakeFirst();
    const record = await db
      .selectFrom("records")
      .innerJoin("tendons", "tendons.id", "records.tendon_id")
      .innerJoin("pours", "pours.id", "tendons.pour_id")
      .select("records.id")
      .where("pours.project_id", "=", projectId)
      .executeTakeFirst();
    const set = await db
      .selectFrom("equipment_sets")
      .select("id")
      .where("project_id", "=", projectId)
      .executeTakeFirst();
    const calibration = set
      ? await db.selectFrom("calibrations").select("id").where("equipment_set_id", "=", set.id).executeTakeFirst()
      : undefined;
    const lot = await db.selectFrom("strand_lots").select("id").where("project_id", "=", projectId).executeTakeFirst();
    const attachment = await db
      .selectFrom("attachments")
      .select("id")
      .where("project_id", "=", projectId)
      .executeTakeFirst();
    return {
      projectId,
      pourId: pour?.id ?? MISSING_ID,
      tendonId: tendon?.id ?? MISSING_ID,
      flagId: flag?.id ?? MISSING_ID,
      recordId: record?.id ?? MISSING_ID,
      setId: set?.id ?? MISSING_ID,
      calibrationId: calibration?.id ?? MISSING_ID,
      attachmentId: attachment?.id ?? MISSING_ID,
      strandLotId: lot?.id ?? MISSING_ID,
      invitationId: MISSING_ID,
      linkId: MISSING_ID,
      revision: "1",
      token: BOGUS_TOKEN,
    };
  };
  // A member no caller depends on, for the member routes (a role change or a removal).
  const throwaway = await db
    .insertInto("users")
    .values({ email: "fuzz-member@demo.tautline.test", name: "Fuzz Member", password_hash: null })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db.insertInto("project_members").values({ project_id: ayp, user_id: throwaway.id, role: "crew" }).execute();

  const person = async (email: string) => {
    const u = await one(
      db.selectFrom("users").select(["id", "session_version"]).where("email", "=", email).executeTakeFirst(),
      email,
    );
    const user = await loadSessionUser(db, { id: u.id, sessionVersion: u.session_version });
    if (!user) throw new Error(`${email} cannot sign in`);
    return user;
  };
  return {
    // A day in the daily report's own form, so its routes reach the body.
    ids: { ...(await idsOf(ayp)), userId: throwaway.id, day: "2026-12-01" },
    foreign: { ...(await idsOf(qhm)), userId: (await person("crew@other.tautline.test")).id, day: "2026-12-01" },
    users: {
      admin: await person("admin@demo.tautline.test"),
      crew: await person("crew@demo.tautline.test"),
      inspector: await person("inspector@demo.tautline.test"),
      engineer: await person("engineer@demo.tautline.test"),
      other: await person("crew@other.tautline.test"),
    },
  };
}

/**
 * Every table's row count in one statement. A refusal may append security events (a denied
 * access, a failed token) to the audit trail, as ASVS V16 asks; so audit rows are counted by
 * outcome, and a refusal must not add one that says "success".
 */
async function rowCounts(): Promise<Record<string, number>> {
  const parts = tables.map((name) =>
    name === "audit_events"
      ? sql`'audit_events (success)', (select count(*) from audit_events where outcome = 'success')`
      : sql`${sql.lit(name)}, (select count(*) from ${sql.table(name)})`,
  );
  const { rows } = await sql<{ counts: Record<string, number> }>`select json_build_object(${sql.join(
    parts,
  )}) as counts`.execute(t.db);
  return rows[0]!.counts;
}

// ——— Generators ———

const RAW = "\u0001raw:";
/** Numbers JSON.stringify cannot write (Infinity after parsing, overflow, underflow) go in raw. */
const rawNumber = fc.constantFrom("1e400", "-1e400", "1e-400", "123456789012345678901234567890").map((n) => RAW + n);
const junk: fc.Arbitrary<unknown> = fc.oneof(
  fc.anything({ maxDepth: 2 }),
  fc.string(),
  fc.string({ unit: "grapheme", maxLength: 40 }),
  fc.string({ unit: "binary", maxLength: 20 }),
  fc.constantFrom(
    "",
    " ",
    "\u0000",
    "a\u0000b",
    "\u202e\u0007",
    "\ud800",
    "x".repeat(100_000),
    "NaN",
    "Infinity",
    "-1",
    "2026-02-30",
    "0000-01-01",
    "99999-12-31",
    "2026-12-01T25:61:00Z",
    "=cmd|' /C calc'!A0",
    "<script>alert(1)</script>",
    "'; drop table records; --",
    "__proto__",
    MISSING_ID,
    "00000000-0000-0000-0000-000000000000",
  ),
  fc.constantFrom(-1, 0, -0, 1.5, -1e308, 1e308, Number.MAX_SAFE_INTEGER + 2, 2 ** 31, -(2 ** 31) - 1),
  fc.double(),
  fc.integer(),
  rawNumber,
  fc.uuid(),
  fc.constant(null),
  fc.boolean(),
  fc.array(fc.anything({ maxDepth: 1 }), { maxLength: 3 }),
  fc.constant(Array.from({ length: 2_000 }, (_, i) => i)),
);

function toText(value: unknown): string {
  const text = JSON.stringify(value) ?? "null";
  return text.replace(/"\\u0001raw:([^"]*)"/g, "$1");
}

/** Valid bodies of the mutating endpoints, from which the fuzz mutates one field at a time. */
function seedBody(endpoint: string, w: World): Record<string, unknown> | null {
  const calibration = api.calibrationBody();
  const bodies: Record<string, Record<string, unknown>> = {
    "POST /api/projects": { code: "FZ1", name: "Fuzz project", firstAdminEmail: "admin@demo.tautline.test" },
    "PATCH /api/projects/[projectId]/members/[userId]": { role: "crew" },
    "POST /api/projects/[projectId]/invitations": { email: "fuzz-invite@demo.tautline.test", role: "crew" },
    "POST /api/projects/[projectId]/uploads": api.certificateUploadBody(4096, "fuzz.pdf"),
    "PATCH /api/projects/[projectId]/settings": { tolerancePct: 7 },
    "PATCH /api/projects/[projectId]/flag-mail": { mode: "each" },
    "POST /api/projects/[projectId]/settings/preview": { tolerancePct: 5 },
    "POST /api/projects/[projectId]/pours": api.pourBody("Fuzz pour", "Fuzz"),
    "PATCH /api/projects/[projectId]/pours/[pourId]": api.pourBody("Fuzz pour", "Fuzz"),
    "POST /api/projects/[projectId]/pours/[pourId]/tendons": api.tendonBody("FZ-1"),
    "POST /api/projects/[projectId]/pours/[pourId]/tendons/import": { csv: api.scheduleCsv("FZ-2") },
    "POST /api/projects/[projectId]/pours/[pourId]/report/signatures": api.reportSignatureBody("Fuzz"),
    "POST /api/projects/[projectId]/daily-reports/[day]/signatures": {
      ...api.reportSignatureBody("Fuzz", "Fuzz check of the day's inspection report."),
      remarks: "",
      conformance: "not_conforming",
      witness: [],
    },
    "POST /api/projects/[projectId]/share-links": { label: "Fuzz general contractor", days: 1 },
    "POST /api/report-verifications": { sha256: "0".repeat(64) },
    "POST /api/projects/[projectId]/strand-lots": api.strandLotBody("FZ-LOT"),
    "POST /api/projects/[projectId]/strand-lots/[strandLotId]/preview": api.strandLotBody("FZ-LOT-P"),
    "POST /api/projects/[projectId]/tendons/[tendonId]/preview": api.tendonBody("FZ-P"),
    "POST /api/projects/[projectId]/equipment-sets": api.equipmentSetBody("Fuzz set", "FJ-1", "FG-1"),
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations": calibration,
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/preview": calibration,
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/retirement": {
      reason: "Fuzz check of a retirement.",
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/retirement/preview": {
      reason: "Fuzz check of a retirement preview.",
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/correction": {
      reason: "Fuzz check of a correction.",
      calibration,
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/correction/preview": {
      reason: "Fuzz check of a correction preview.",
      calibration,
    },
    "POST /api/projects/[projectId]/flags/[flagId]/reviews": api.reviewBody(),
    "POST /api/projects/[projectId]/flags/[flagId]/dispositions": api.dispositionBody("Fuzz"),
    "POST /api/projects/[projectId]/records/[recordId]/corrections": api.recordCorrectionBody(),
    "POST /api/projects/[projectId]/pours/[pourId]/release": api.releaseBody("Fuzz"),
    "POST /api/projects/[projectId]/pours/[pourId]/concrete-results": api.concreteResultBody(),
    "POST /api/projects/[projectId]/pours/[pourId]/reopen": api.reopenBody("Fuzz"),
    "POST /api/invitations/accept": api.acceptInvitationBody(),
    "POST /api/password-reset": api.passwordResetBody(),
    "POST /api/password-reset/complete": api.passwordResetCompleteBody(),
    "POST /api/sync/push": {
      deviceId: "fuzz-tablet-0001",
      ops: [{ opId: randomUUID(), kind: "create", recordId: randomUUID(), payload: { tendonId: w.ids.tendonId } }],
    },
  };
  return bodies[endpoint] ?? null;
}

type Path = (string | number)[];
function leafPaths(value: unknown, at: Path = []): Path[] {
  if (value !== null && typeof value === "object") {
    const entries = Array.isArray(value) ? value.map((v, i) => [i, v] as const) : Object.entries(value);
    return [at, ...entries.flatMap(([k, v]) => leafPaths(v, [...at, k]))].filter((p) => p.length > 0);
  }
  return [at];
}
function replaceAt(value: unknown, at: Path, replacement: unknown): unknown {
  if (at.length === 0) return replacement;
  const [head, ...rest] = at;
  const copy = (Array.isArray(value) ? [...value] : { ...(value as object) }) as Record<string | number, unknown>;
  copy[head!] = replaceAt(copy[head!], rest, replacement);
  return copy;
}

/** A body: anything at all, text that is not JSON, or a valid body with one field spoiled. */
function bodyArbitrary(seed: Record<string, unknown> | null, w: World): fc.Arbitrary<string> {
  const foreignIds = fc.constantFrom(...Object.values(w.foreign));
  const generic = fc.oneof(
    fc.anything({ maxDepth: 3 }).map(toText),
    fc.string(),
    fc.constantFrom("{", "[1,", '{"a":}', "nul", '"\\ud800"', '{"__proto__":{"admin":true}}', "{}", "[]", "null"),
    fc.dictionary(fc.string({ maxLength: 12 }), junk, { maxKeys: 4 }).map(toText),
  );
  if (!seed) return generic;
  const keys = Object.keys(seed);
  // Any field, nested ones too (a calibration point's force, a segment's length).
  const spoilOne = fc
    .record({ at: fc.constantFrom(...leafPaths(seed)), value: fc.oneof(junk, foreignIds) })
    .map(({ at, value }) => toText(replaceAt(seed, at, value)));
  // A control character inside a text the body otherwise gets right.
  const stringPaths = leafPaths(seed).filter(
    (p) => typeof p.reduce<unknown>((v, k) => (v as never)[k], seed) === "string",
  );
  const controlInText = fc
    .record({
      at: fc.constantFrom(...(stringPaths.length ? stringPaths : leafPaths(seed))),
      c: fc.constantFrom("\u0000", "\u0007", "\u001b", "\u007f", "\u0085"),
    })
    .map(({ at, c }) =>
      toText(replaceAt(seed, at, `${String(at.reduce<unknown>((v, k) => (v as never)[k], seed))}${c}x`)),
    );
  const dropOne = fc.constantFrom(...keys).map((key) => {
    const copy: Record<string, unknown> = { ...seed };
    delete copy[key];
    return toText(copy);
  });
  const extra = fc
    .record({ key: fc.string({ minLength: 1, maxLength: 12 }), value: junk })
    .map(({ key, value }) => toText({ ...seed, [key]: value }));
  const spoilMany = fc
    .dictionary(fc.constantFrom(...keys), junk, { minKeys: 1, maxKeys: keys.length })
    .map((d) => toText({ ...seed, ...d }));
  return fc.oneof(
    { weight: 2, arbitrary: generic },
    { weight: 5, arbitrary: spoilOne },
    { weight: 1, arbitrary: controlInText },
    { weight: 2, arbitrary: dropOne },
    { weight: 1, arbitrary: extra },
    { weight: 2, arbitrary: spoilMany },
  );
}

const paramNames = (endpoint: string) => [...endpoint.matchAll(/\[(\w+)\]/g)].map((m) => m[1]!);

/** Params: mostly the right ids (so the body is reached), else ids that are wrong in every way. */
function paramsArbitrary(endpoint: string, w: World): fc.Arbitrary<Record<string, string>> {
  const names = paramNames(endpoint);
  const wrong = fc.oneof(
    fc.uuid(),
    fc.string({ maxLength: 40 }),
    fc.string({ unit: "grapheme", maxLength: 10 }),
    fc.constantFrom("-1", "0", "1e400", "NaN", "a\u0000b", "x".repeat(10_000), "..%2F..", MISSING_ID),
    fc.integer().map(String),
  );
  const one = (name: string) =>
    fc.oneof(
      { weight: 8, arbitrary: fc.constant(w.ids[name] ?? MISSING_ID) },
      { weight: 1, arbitrary: fc.constant(w.foreign[name] ?? MISSING_ID) },
      { weight: 2, arbitrary: wrong },
    );
  return fc.record(Object.fromEntries(names.map((n) => [n, one(n)]))) as fc.Arbitrary<Record<string, string>>;
}

const QUERY_KEYS = ["cursor", "pours", "status", "kind", "pourId", "projectId", "page", "limit", "format"];
const queryArbitrary = fc.array(
  fc.record({
    key: fc.oneof(fc.constantFrom(...QUERY_KEYS), fc.string({ maxLength: 8 })),
    value: fc.oneof(fc.string({ maxLength: 30 }), fc.uuid(), fc.constantFrom("-1", "1e400", "any_open", "\u0000")),
  }),
  { maxLength: 4 },
);

const contentType = fc.oneof(
  { weight: 12, arbitrary: fc.constant("application/json") },
  { weight: 1, arbitrary: fc.constantFrom("text/plain", "application/x-www-form-urlencoded", "") },
);

// ——— The test ———

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  world = await buildWorld(t.db);
  appDb = createDb(t.appUrl, 5);
  routeState.db = appDb;
  tables = (
    await sql<{ tablename: string }>`select tablename from pg_tables where schemaname = 'public' order by 1`.execute(
      t.db,
    )
  ).rows.map((r) => r.tablename);
}, 120_000);

afterAll(async () => {
  await settleBackground();
  await appDb?.destroy();
  await t?.drop();
});

describe("every route handler answers generated bad input without a 5xx, naming the fields, writing nothing", () => {
  it("knows the route file of every endpoint in the authorization matrix", () => {
    const missing = Object.keys(MATRIX).filter((k) => !ROUTE_FILES.has(k));
    expect(missing).toEqual([]);
  });

  it("answers 422 naming an unknown field in any body, on every endpoint that takes one", async () => {
    const unnamed: string[] = [];
    for (const endpoint of Object.keys(MATRIX).filter((k) => !NOT_FUZZED.has(k))) {
      const seed = seedBody(endpoint, world);
      if (!seed) continue;
      const { file, method } = ROUTE_FILES.get(endpoint)!;
      const mod = (await import(file)) as Record<
        string,
        (req: NextRequest, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>
      >;
      const caller = callerFor(endpoint);
      routeState.user = caller === "anonymous" ? null : world.users[caller];
      const params = Object.fromEntries(paramNames(endpoint).map((n) => [n, world.ids[n] ?? MISSING_ID]));
      const url = new URL(
        endpoint.split(" ")[1]!.replace(/\[(\w+)\]/g, (_, name: string) => encodeURIComponent(params[name]!)),
        ORIGIN,
      );
      const before = await rowCounts();
      const res = await mod[method]!(
        new NextRequest(url, {
          method,
          headers: { origin: ORIGIN, "content-type": "application/json" },
          body: JSON.stringify({ ...seed, colourOfTheJack: "red" }),
        }),
        { params: Promise.resolve(params) },
      );
      await settleBackground();
      const answer = (await res.json()) as { error?: { fields?: Record<string, string[]> } };
      if (res.status !== 422 || !answer.error?.fields?.colourOfTheJack) unnamed.push(`${endpoint} → ${res.status}`);
      expect(await rowCounts(), endpoint).toEqual(before);
    }
    expect(unnamed).toEqual([]);
  });

  const endpoints = Object.keys(MATRIX).filter((k) => !NOT_FUZZED.has(k));
  let index = 0;
  for (const endpoint of endpoints) {
    const endpointSeed = SEED + index++;
    it(`${endpoint} (fast-check seed ${endpointSeed})`, async () => {
      const { file, method } = ROUTE_FILES.get(endpoint)!;
      const mod = (await import(file)) as Record<
        string,
        (req: NextRequest, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>
      >;
      const handler = mod[method]!;
      const caller = callerFor(endpoint);
      routeState.user = caller === "anonymous" ? null : world.users[caller];
      const mutating = method !== "GET";
      const urlPath = endpoint.split(" ")[1]!;
      const seed = seedBody(endpoint, world);

      const input = fc.record({
        params: paramsArbitrary(endpoint, world),
        query: queryArbitrary,
        body: mutating ? bodyArbitrary(seed, world) : fc.constant(""),
        contentType,
      });

      let counts = await rowCounts();
      const statuses = new Map<number, number>();
      await fc.assert(
        fc.asyncProperty(input, async ({ params, query, body, contentType: type }) => {
          const url = new URL(
            urlPath.replace(/\[(\w+)\]/g, (_, name: string) => encodeURIComponent(params[name] ?? "")),
            ORIGIN,
          );
          for (const { key, value } of query) url.searchParams.append(key, value);
          const request = new NextRequest(url, {
            method,
            headers: { origin: ORIGIN, ...(mutating && type ? { "content-type": type } : {}) },
            ...(mutating ? { body } : {}),
          });
          const res = await handler(request, { params: Promise.resolve(params) });
          await settleBackground();
          statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
          const text = await res.text();
          expect(res.status, `${method} ${url.pathname}${url.search} ${body.slice(0, 300)} → ${text}`).toBeLessThan(
            500,
          );
          if (res.status >= 400) {
            const answer = JSON.parse(text) as { error?: { message?: string; fields?: Record<string, string[]> } };
            expect(answer.error?.message, text).toBeTruthy();
            if (res.status === 422 && !/not valid JSON/.test(answer.error!.message!)) {
              expect(Object.keys(answer.error!.fields ?? {}), `422 without the field at fault: ${text}`).not.toEqual(
                [],
              );
            }
            expect(await rowCounts(), `a refused ${method} wrote rows: ${body.slice(0, 300)} → ${text}`).toEqual(
              counts,
            );
          } else {
            counts = await rowCounts();
          }
        }),
        { numRuns: RUNS, seed: endpointSeed, endOnFailure: true },
      );
      console.log(`${endpoint} as ${caller}: ${RUNS} calls, answers ${JSON.stringify(Object.fromEntries(statuses))}`);
      // The fuzz reached the handlers' own checks, not only the front door.
      expect(
        [...statuses.keys()].some((s) => s !== 401 && s !== 403),
        JSON.stringify([...statuses]),
      ).toBe(true);
    }, 300_000);
  }
});
