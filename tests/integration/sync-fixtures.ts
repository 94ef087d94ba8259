import { uuidv7 } from "uuidv7";
import { createDb, type Db } from "@/db/connect";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { seedDemo } from "@/scripts/seed/demo";
import { payloadFromForm, EMPTY_RECORD_FORM, type RecordFormValues, type RecordPayload } from "@/lib/schemas/record";
import type { SyncOp } from "@/lib/schemas/sync";
import type { Pusher } from "@/lib/server/push-ops";
import { predictTendon, projectBasisFromRow, targetPressureMPa } from "@/lib/stressing/basis";
import { formatLength, mpaToPsi } from "@/lib/units";

/** The demo job in a test database, with what the sync tests push against. */
export interface SyncWorld {
  projectId: string;
  pourId: string;
  crew: Pusher & { email: string };
  other: Pusher & { email: string };
  inspector: Pusher;
  tendons: { id: string; tag: string; ends: "A" | "B" | "both" }[];
  setA: { id: string; calibrationId: string };
  setB: { id: string; calibrationId: string };
  /** A tendon of the other project (Quarry Hill Clinic), made here. */
  foreign: { projectId: string; pourId: string; tendonId: string; setId: string };
  /** Marks "0" and "after" that land in band for a tendon, typed as the crew would. */
  inBandAfter: (tendonId: string) => Promise<string>;
  targetPsi: string;
}

async function pusher(db: Db, email: string): Promise<Pusher & { email: string }> {
  const user = await db.selectFrom("users").select("id").where("email", "=", email).executeTakeFirstOrThrow();
  const memberships = await db
    .selectFrom("project_members")
    .select(["project_id as projectId", "role"])
    .where("user_id", "=", user.id)
    .execute();
  return { id: user.id, email, memberships };
}

/**
 * A database of the test file's own with the sync world built in it, and `app`, a client like the
 * app's (prepared statements, `poolSize` connections); `t.drop()` closes the client first.
 */
export async function syncWorld(poolSize: number): Promise<{ t: TestDatabase; w: SyncWorld; app: Db }> {
  const t = await createTestDatabase({ migrate: true });
  const w = await buildWorld(t.db);
  const app = createDb(t.url, poolSize, { prepare: true });
  const drop = async () => {
    await app.destroy();
    await t.drop();
  };
  return { t: { ...t, drop }, w, app };
}

export async function buildWorld(db: Db): Promise<SyncWorld> {
  // The fixed dates of these tests are read against the demo seeded as on 2026-12-01.
  await seedDemo(db, { today: new Date("2026-12-01T12:00:00Z") });
  const project = await db.selectFrom("projects").selectAll().where("code", "=", "AYP").executeTakeFirstOrThrow();
  const pour = await db
    .selectFrom("pours")
    .select("id")
    .where("project_id", "=", project.id)
    .where("name", "=", "L2 Pour 1")
    .executeTakeFirstOrThrow();
  const tendons = await db
    .selectFrom("tendons")
    .select(["id", "tag", "ends"])
    .where("pour_id", "=", pour.id)
    .orderBy("tag")
    .execute();
  const sets = await db
    .selectFrom("equipment_sets")
    .innerJoin("calibrations", "calibrations.equipment_set_id", "equipment_sets.id")
    .select([
      "equipment_sets.id",
      "equipment_sets.name",
      "calibrations.id as calibrationId",
      "calibrations.slope_n_per_mpa",
      "calibrations.intercept_n",
      "calibrations.min_pressure_mpa",
      "calibrations.max_pressure_mpa",
    ])
    .where("equipment_sets.project_id", "=", project.id)
    .orderBy("equipment_sets.name")
    .execute();
  const [a, b] = sets;
  if (!a || !b) throw new Error("the demo seed has no equipment sets with calibrations");

  const qhm = await db.selectFrom("projects").select("id").where("code", "=", "QHM").executeTakeFirstOrThrow();
  const qPour = await db
    .insertInto("pours")
    .values({ project_id: qhm.id, name: "Sync test pour" })
    .returning("id")
    .executeTakeFirstOrThrow();
  const qTendon = await db
    .insertInto("tendons")
    .values({
      project_id: qhm.id,
      pour_id: qPour.id,
      tag: "Q-01",
      kind: "unbonded_monostrand",
      strand_size: "0.5 in",
      strand_count: 1,
      segments: JSON.stringify([{ lengthMm: 9000, angleRad: 0.05 }]),
      ends: "A",
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  const qSet = await db
    .insertInto("equipment_sets")
    .values({ project_id: qhm.id, name: "Q set", jack_serial: "Q-J", gauge_serial: "Q-G" })
    .returning("id")
    .executeTakeFirstOrThrow();

  const basisProject = projectBasisFromRow(project);
  const line = {
    slope: a.slope_n_per_mpa,
    intercept: a.intercept_n,
    minPressureMPa: a.min_pressure_mpa,
    maxPressureMPa: a.max_pressure_mpa,
  };
  const first = await db.selectFrom("tendons").selectAll().where("id", "=", tendons[0]!.id).executeTakeFirstOrThrow();
  const jackingForce = predictTendon({
    project: basisProject,
    tendon: {
      strandSize: first.strand_size,
      strandCount: first.strand_count,
      segments: first.segments,
      ends: first.ends,
      jackGripMm: first.jack_grip_mm,
    },
    lot: null,
  }).jackingForceN;

  return {
    projectId: project.id,
    pourId: pour.id,
    crew: await pusher(db, "crew@demo.tautline.test"),
    other: await pusher(db, "crew@other.tautline.test"),
    inspector: await pusher(db, "inspector@demo.tautline.test"),
    tendons,
    setA: { id: a.id, calibrationId: a.calibrationId },
    setB: { id: b.id, calibrationId: b.calibrationId },
    foreign: { projectId: qhm.id, pourId: qPour.id, tendonId: qTendon.id, setId: qSet.id },
    targetPsi: String(Math.round(mpaToPsi(targetPressureMPa(line, jackingForce)))),
    inBandAfter: async (tendonId) => {
      const t = await db.selectFrom("tendons").selectAll().where("id", "=", tendonId).executeTakeFirstOrThrow();
      const lot = t.strand_lot_id
        ? await db.selectFrom("strand_lots").selectAll().where("id", "=", t.strand_lot_id).executeTakeFirst()
        : undefined;
      const predicted = predictTendon({
        project: basisProject,
        tendon: {
          strandSize: t.strand_size,
          strandCount: t.strand_count,
          segments: t.segments,
          ends: t.ends,
          jackGripMm: t.jack_grip_mm,
        },
        lot: lot ? { areaMm2: lot.area_mm2, modulusMPa: lot.modulus_mpa, breakingLoadN: lot.breaking_load_n } : null,
      });
      // For a two-end tendon one end's reading is judged on that end's share.
      const share = t.ends === "both" ? predicted.prediction.perEndMm.A! / predicted.prediction.grossMm : 1;
      return formatLength(predicted.predictedMm * share, "1/8 in");
    },
  };
}

/** A crew member's new record of end A of a tendon, as the tablet builds it from the form. */
export function recordPayload(
  world: SyncWorld,
  tendonId: string,
  form: Partial<RecordFormValues> = {},
  extra: Partial<RecordPayload> = {},
): { recordId: string; payload: RecordPayload } {
  const recordId = uuidv7();
  const payload = payloadFromForm(
    {
      ...EMPTY_RECORD_FORM,
      equipmentSetId: world.setA.id,
      finalPressure: world.targetPsi,
      marksBefore: "0",
      marksAfter: "4 1/2",
      ...form,
    },
    {
      units: { length: "in", pressure: "psi" },
      projectId: world.projectId,
      pourId: world.pourId,
      tendonId,
      chainId: recordId,
      revision: 1,
      baseRecordId: null,
      calibrationId: world.setA.calibrationId,
      expired: false,
      authorUserId: world.crew.id,
      now: new Date("2026-12-02T15:30:00-08:00"),
      timeZone: "America/Los_Angeles",
    },
  );
  return { recordId, payload: { ...payload, ...extra } };
}

export function createOp(
  world: SyncWorld,
  tendonId: string,
  form: Partial<RecordFormValues> = {},
  extra: Partial<RecordPayload> = {},
): SyncOp {
  const { recordId, payload } = recordPayload(world, tendonId, form, extra);
  return { opId: crypto.randomUUID(), kind: "create", recordId, payload };
}

/** A correction of a stored revision: revision n+1 naming its base. */
export function reviseOp(
  base: { recordId: string; revision: number; payload: RecordPayload },
  changes: Partial<RecordPayload>,
  reason = "Misread the tape",
): SyncOp & { payload: RecordPayload } {
  const recordId = uuidv7();
  return {
    opId: crypto.randomUUID(),
    kind: "revise",
    recordId,
    baseVersion: base.revision,
    payload: {
      ...base.payload,
      ...changes,
      revision: base.revision + 1,
      baseRecordId: base.recordId,
      revisionReason: reason,
    },
  };
}

export async function rowsOf(db: Db, table: "records" | "applied_ops"): Promise<number> {
  const row = await db
    .selectFrom(table)
    .select((eb) => eb.fn.countAll<number>().as("n"))
    .executeTakeFirstOrThrow();
  return Number(row.n);
}
