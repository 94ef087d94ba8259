import { NextRequest } from "next/server";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { SessionUser } from "@/lib/auth/session";
import { loadSessionUser } from "@/lib/server/load-session-user";
import { updateStrandLot } from "@/lib/server/update-strand-lot";
import { updateTendon } from "@/lib/server/update-tendon";
import { seedDemo } from "@/scripts/seed/demo";
import { qualified } from "@/lib/schemas/columns";
import { TENDON_COLUMNS, tendonFromRow } from "@/lib/schemas/tendon";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { routeState } from "./route-mocks";

// The preview routes answer what saving an edit of a strand lot or a tendon's schedule row would
// do to the stressed tendons (how many are judged again, how many verdicts change, how many open
// flags close) by running the edit itself in a transaction that is rolled back. So the preview
// must equal what the save then does, and leave every table as it was.

vi.mock("@/db", async () => (await import("./route-mocks")).mockedDb);
vi.mock("@/lib/auth/session", async () => (await import("./route-mocks")).mockedSession);

const { POST: previewLot } = await import("@/app/api/projects/[projectId]/strand-lots/[strandLotId]/preview/route");
const { POST: previewTendon } = await import("@/app/api/projects/[projectId]/tendons/[tendonId]/preview/route");

const ORIGIN = process.env.APP_URL ?? "http://localhost:3000";
let t: TestDatabase;
let projectId: string;
let admin: SessionUser;
let crew: SessionUser;

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db, { records: true });
  routeState.db = t.db;
  projectId = (await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow()).id;
  const person = async (email: string) => {
    const u = await t.db
      .selectFrom("users")
      .select(["id", "session_version"])
      .where("email", "=", email)
      .executeTakeFirstOrThrow();
    return (await loadSessionUser(t.db, { id: u.id, sessionVersion: u.session_version }))!;
  };
  admin = await person("admin@demo.tautline.test");
  crew = await person("crew@demo.tautline.test");
  routeState.user = admin;
});
afterAll(async () => {
  await t.drop();
});

function post(
  handler: typeof previewLot,
  url: string,
  params: Record<string, string>,
  body: unknown,
): Promise<{ status: number; body: Record<string, unknown> & { error?: { fields?: Record<string, string[]> } } }> {
  return handler(
    new NextRequest(`${ORIGIN}${url}`, {
      method: "POST",
      body: JSON.stringify(body),
      headers: { "content-type": "application/json", origin: ORIGIN },
    }),
    { params: Promise.resolve(params) },
  ).then(async (res) => ({ status: res.status, body: await res.json() }));
}

/** Rows in the tables an edit writes: the preview must leave each count as it was. */
async function counts() {
  const n = (table: "evaluations" | "audit_events" | "flags" | "notifications" | "tendon_versions") =>
    t.db
      .selectFrom(table)
      .select(sql<string>`count(*)`.as("n"))
      .executeTakeFirstOrThrow()
      .then((r) => Number(r.n));
  return {
    evaluations: await n("evaluations"),
    // A refusal for want of rights is audited as a denial, by design; anything else would be a write.
    audits: await t.db
      .selectFrom("audit_events")
      .select(sql<string>`count(*)`.as("n"))
      .where("outcome", "!=", "denied")
      .executeTakeFirstOrThrow()
      .then((r) => Number(r.n)),
    flags: await n("flags"),
    notifications: await n("notifications"),
    versions: await t.db
      .selectFrom("tendon_versions")
      .select(sql<string>`coalesce(sum(version), 0)`.as("n"))
      .executeTakeFirstOrThrow()
      .then((r) => Number(r.n)),
    closed: await t.db
      .selectFrom("flags")
      .select(sql<string>`count(*)`.as("n"))
      .where("status", "=", "closed")
      .executeTakeFirstOrThrow()
      .then((r) => Number(r.n)),
  };
}

async function lotWithStressedTendons() {
  const row = await t.db
    .selectFrom("strand_lots")
    .innerJoin("tendons", "tendons.strand_lot_id", "strand_lots.id")
    .innerJoin("records", "records.tendon_id", "tendons.id")
    .select([
      "strand_lots.id",
      "strand_lots.lot_number",
      "strand_lots.strand_size",
      "strand_lots.area_mm2",
      "strand_lots.modulus_mpa",
      "strand_lots.breaking_load_n",
      "strand_lots.certificate_attachment_id",
      sql<string>`count(distinct tendons.id)`.as("stressed"),
    ])
    .where("strand_lots.project_id", "=", projectId)
    .groupBy("strand_lots.id")
    .orderBy(sql`count(distinct tendons.id)`, "desc")
    .executeTakeFirstOrThrow();
  return {
    id: row.id,
    stressed: Number(row.stressed),
    values: {
      lotNumber: row.lot_number,
      strandSize: row.strand_size,
      areaMm2: row.area_mm2,
      modulusMPa: row.modulus_mpa,
      breakingLoadN: row.breaking_load_n,
      certificateAttachmentId: row.certificate_attachment_id,
    },
  };
}

describe("POST …/strand-lots/[strandLotId]/preview", () => {
  it("tells how many stressed tendons a modulus change judges again, writes nothing, and the save then does the same", async () => {
    const lot = await lotWithStressedTendons();
    expect(lot.stressed, "the demo has stressed tendons on a lot").toBeGreaterThan(1);
    // 10 % below the certificate: P·L/(A·E) grows by 1/0.9, enough to move a verdict on a ±7 % band.
    const values = { ...lot.values, modulusMPa: Math.round(lot.values.modulusMPa * 0.9) };
    const before = await counts();
    const url = `/api/projects/${projectId}/strand-lots/${lot.id}/preview`;
    const res = await post(previewLot, url, { projectId, strandLotId: lot.id }, values);
    expect(res.status).toBe(200);
    expect(res.body.rejudged).toBe(lot.stressed);
    expect(res.body.verdictsChanging).toBeGreaterThan(0);
    expect(await counts()).toEqual(before);
    const stored = await t.db
      .selectFrom("strand_lots")
      .select("modulus_mpa")
      .where("id", "=", lot.id)
      .executeTakeFirstOrThrow();
    expect(stored.modulus_mpa).toBe(lot.values.modulusMPa);

    // The save does what the preview said.
    const saved = await updateStrandLot(t.db, { projectId, strandLotId: lot.id, values, by: admin.id });
    expect({ rejudged: saved.reevaluated, verdictsChanging: saved.changed, flagsClosing: saved.closedFlags }).toEqual(
      res.body,
    );
    // And back: restoring the certificate's value closes the flags the lowered modulus opened.
    const back = await post(previewLot, url, { projectId, strandLotId: lot.id }, lot.values);
    expect(back.body).toMatchObject({ rejudged: lot.stressed, verdictsChanging: saved.changed });
  });

  it("a change that no prediction reads (the breaking load) judges nothing again", async () => {
    const lot = await lotWithStressedTendons();
    const res = await post(
      previewLot,
      `/api/projects/${projectId}/strand-lots/${lot.id}/preview`,
      { projectId, strandLotId: lot.id },
      { ...lot.values, breakingLoadN: lot.values.breakingLoadN + 100 },
    );
    expect(res).toEqual({ status: 200, body: { rejudged: 0, verdictsChanging: 0, flagsClosing: 0 } });
  });

  it("answers 422 naming each bad field, 403 to the crew and 404 for a lot of no project of ours, writing nothing", async () => {
    const lot = await lotWithStressedTendons();
    const before = await counts();
    const url = `/api/projects/${projectId}/strand-lots/${lot.id}/preview`;
    const bad = await post(
      previewLot,
      url,
      { projectId, strandLotId: lot.id },
      { ...lot.values, modulusMPa: -5, areaMm2: "lots" },
    );
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error!.fields!).sort()).toEqual(["areaMm2", "modulusMPa"]);
    routeState.user = crew;
    expect((await post(previewLot, url, { projectId, strandLotId: lot.id }, lot.values)).status).toBe(403);
    routeState.user = admin;
    const missing = "00000000-0000-4000-8000-000000000000";
    expect((await post(previewLot, url, { projectId, strandLotId: missing }, lot.values)).status).toBe(404);
    expect(await counts()).toEqual(before);
  });
});

describe("POST …/tendons/[tendonId]/preview", () => {
  async function stressedTendon(released: boolean) {
    const row = await t.db
      .selectFrom("tendons")
      .innerJoin("pour_states", "pour_states.pour_id", "tendons.pour_id")
      .select(qualified("tendons", TENDON_COLUMNS))
      .where("tendons.project_id", "=", projectId)
      .where("pour_states.status", released ? "=" : "!=", "released")
      .where("tendons.id", "in", (eb) => eb.selectFrom("records").select("tendon_id"))
      .orderBy("tendons.tag")
      .executeTakeFirstOrThrow();
    // The tendon as its form sends it: the DTO less its ids (the body names every field of the schema).
    const { id, projectId: ofProject, pourId, ...values } = tendonFromRow(row);
    expect(ofProject).toBe(projectId);
    return { id, pourId, values };
  }

  it("a longer profile judges the tendon again; a new member judges the pour's stressed tendons; nothing is written", async () => {
    const tendon = await stressedTendon(false);
    const url = `/api/projects/${projectId}/tendons/${tendon.id}/preview`;
    const params = { projectId, tendonId: tendon.id };
    const before = await counts();
    // 20 % more length: P·L/(A·E) grows with L, so the same reading falls short of the band.
    const longer = {
      ...tendon.values,
      segments: tendon.values.segments.map((s) => ({ ...s, lengthMm: s.lengthMm * 1.2 })),
    };
    const res = await post(previewTendon, url, params, longer);
    expect(res).toEqual({ status: 200, body: expect.objectContaining({ rejudged: 1, verdictsChanging: 1 }) });

    const [{ n: pourStressed }] = (await t.db
      .selectFrom("records")
      .select(sql<string>`count(distinct tendon_id)`.as("n"))
      .where("pour_id", "=", tendon.pourId)
      .execute()) as [{ n: string }];
    const member = await post(previewTendon, url, params, { ...tendon.values, member: "Preview band" });
    expect(member.status).toBe(200);
    expect(member.body.rejudged).toBe(Number(pourStressed));
    expect(Number(pourStressed)).toBeGreaterThan(1);
    expect(await counts()).toEqual(before);

    // The save does what the preview said.
    const saved = await updateTendon(t.db, { projectId, tendonId: tendon.id, values: longer, by: admin.id });
    expect({ rejudged: saved.reevaluated, verdictsChanging: saved.changed, flagsClosing: saved.closedFlags }).toEqual(
      res.body,
    );
  });

  it("a tendon of a released pour answers 409 as the save would, and a bad row 422 naming its fields", async () => {
    const released = await stressedTendon(true);
    const params = { projectId, tendonId: released.id };
    const url = `/api/projects/${projectId}/tendons/${released.id}/preview`;
    const res = await post(previewTendon, url, params, released.values);
    expect(res.status).toBe(409);
    const open = await stressedTendon(false);
    const bad = await post(
      previewTendon,
      `/api/projects/${projectId}/tendons/${open.id}/preview`,
      { projectId, tendonId: open.id },
      { ...open.values, strandCount: 0, segments: [] },
    );
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error!.fields!)).toEqual(expect.arrayContaining(["strandCount", "segments"]));
  });
});
