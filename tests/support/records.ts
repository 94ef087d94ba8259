import { afterAll, beforeAll, expect } from "vitest";
import { uuidv7 } from "uuidv7";
import { ASTM_A416_GRADE_270 } from "@/lib/elongation";
import type { Db } from "@/db/connect";
import type { FlagKind, TendonEnd } from "@/lib/schemas/domain";
import { loadTendonBasis } from "@/lib/server/load-tendon-basis";
import { judgeStressing } from "@/lib/stressing/judge";
import { predictTendon } from "@/lib/stressing/basis";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { seedDemo } from "@/scripts/seed/demo";
import { createTestDatabase, type TestDatabase } from "./database";
import { makePour, makeTendons, type TendonShape } from "./factories";
import { judgeRecord } from "./judge-record";
import { pick } from "@/lib/schemas/columns";
import { TENDON_COLUMNS, tendonFromRow } from "@/lib/schemas/tendon";

/** Fixtures for tests that need stressing records without going through the tablet's sync. */

export type DemoFixture = Awaited<ReturnType<typeof demoFixture>>;

/**
 * A database of the test file's own, migrated and seeded with the demo project, and the demo's
 * ids a test starts from. Each file calls it in its beforeAll and drops the database after.
 */
export async function seededDemo(): Promise<{ t: TestDatabase; fx: DemoFixture }> {
  const t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db);
  return { t, fx: await demoFixture(t.db) };
}

/**
 * `seededDemo` for a whole test file: made in the file's beforeAll, dropped in its afterAll. The
 * two objects are filled when the beforeAll has run: read them in tests and hooks only.
 */
export function seededDemoPerFile(): { t: TestDatabase; fx: DemoFixture } {
  const t = {} as TestDatabase;
  const fx = {} as DemoFixture;
  beforeAll(async () => {
    const made = await seededDemo();
    Object.assign(t, made.t);
    Object.assign(fx, made.fx);
  });
  afterAll(async () => {
    await t.drop?.();
  });
  return { t, fx };
}

/** ASTM A416 Grade 270 0.5 in strand (the demo's), from the strand table in lib/elongation. */
export const HALF_INCH = ASTM_A416_GRADE_270.find((s) => s.designation === "0.5 in")!;

export async function demoFixture(db: Db) {
  const project = await db.selectFrom("projects").select(["id"]).where("code", "=", "AYP").executeTakeFirstOrThrow();
  const crew = await db
    .selectFrom("users")
    .select("id")
    .where("email", "=", "crew@demo.tautline.test")
    .executeTakeFirstOrThrow();
  const sets = await db
    .selectFrom("equipment_sets")
    .select(["id", "name"])
    .where("project_id", "=", project.id)
    .orderBy("name")
    .execute();
  const tendon = async (tag: string) =>
    db
      .selectFrom("tendons")
      .select(["id", "pour_id", "ends"])
      .where("project_id", "=", project.id)
      .where("tag", "=", tag)
      .executeTakeFirstOrThrow();
  return { projectId: project.id, crewId: crew.id, setA: sets[0]!.id, setB: sets[1]!.id, tendon };
}

export async function insertRecord(
  db: Db,
  input: {
    projectId: string;
    tendon: { id: string; pour_id: string };
    end: TendonEnd;
    equipmentSetId: string;
    authorId: string;
    measuredMm: number;
    finalPressureMPa: number;
    initialPressureMPa?: number | null;
    wireBreaks?: number;
    deviceTime?: string;
    /** When the server received it (default now, the column's own). */
    receivedAt?: Date;
    restressOfDispositionId?: string;
    base?: { id: string; chainId: string; revision: number; reason: string };
    /** What the crew typed, as the tablet stores it (default: the measured length in mm). */
    entered?: unknown;
    seatingMm?: number | null;
    remarks?: string | null;
  },
): Promise<string> {
  const id = uuidv7();
  await db
    .insertInto("records")
    .values({
      id,
      project_id: input.projectId,
      pour_id: input.tendon.pour_id,
      tendon_id: input.tendon.id,
      tendon_end: input.end,
      chain_id: input.base?.chainId ?? id,
      revision: input.base ? input.base.revision + 1 : 1,
      base_record_id: input.base?.id ?? null,
      revision_reason: input.base?.reason ?? null,
      equipment_set_id: input.equipmentSetId,
      initial_pressure_mpa: input.initialPressureMPa ?? null,
      final_pressure_mpa: input.finalPressureMPa,
      reading_method: "marks",
      entered: JSON.stringify(input.entered ?? { unit: "mm", measuredMm: input.measuredMm }),
      measured_mm: input.measuredMm,
      wire_breaks: input.wireBreaks ?? 0,
      device_time: input.deviceTime ?? new Date().toISOString(),
      device_time_zone: "America/Chicago",
      device_id: "test-device",
      author_user_id: input.authorId,
      restress_of_disposition_id: input.restressOfDispositionId ?? null,
      ...(input.seatingMm !== undefined ? { seating_mm: input.seatingMm } : {}),
      ...(input.remarks !== undefined ? { remarks: input.remarks } : {}),
      ...(input.receivedAt ? { received_at: input.receivedAt } : {}),
    })
    .execute();
  return id;
}

/**
 * A record of end A by the demo crew with the demo's Set A (as `insertRecord`); give another end,
 * set or author where the test is about it.
 */
export function insertDemoRecord(
  db: Db,
  fx: DemoFixture,
  input: Omit<Parameters<typeof insertRecord>[1], "projectId" | "end" | "equipmentSetId" | "authorId"> &
    Partial<Pick<Parameters<typeof insertRecord>[1], "end" | "equipmentSetId" | "authorId">>,
): Promise<string> {
  return insertRecord(db, {
    projectId: fx.projectId,
    end: "A",
    equipmentSetId: fx.setA,
    authorId: fx.crewId,
    ...input,
  });
}

/**
 * The judge's prediction for end A of a one-end tendon as stored now, read the way `method` says:
 * marks after lock-off (net of the anchor set, the default) or ram travel over one stroke (gross
 * plus the strand in a jack of `jackGripMm`); with the set it took off. What a perfect reading
 * would measure, asked of the same judge the server uses, with the tendon's own basis.
 */
export async function predictionAsRead(
  db: Db,
  input: { projectId: string; tendonId: string; method?: "marks" | "strokes"; jackGripMm?: number | null },
): Promise<{ mm: number; setMm: number }> {
  const basis = await loadTendonBasis(db, input);
  const probe = judgeStressing({
    project: basis.project,
    tendon: basis.tendon,
    lot: basis.lot,
    sets: [{ id: "s", name: "s", jackGripMm: input.jackGripMm ?? null, maxForceN: null, calibrations: [] }],
    records: [judgeRecord({ equipmentSetId: "s", readingMethod: input.method ?? "marks" })],
  });
  return { mm: probe.ends[0]!.predictedMm, setMm: probe.ends[0]!.setMm };
}

/** The id of the tendon's first flag of `kind`; the test fails when there is none. */
export async function flagIdOf(db: Db, tendonId: string, kind: FlagKind): Promise<string> {
  const flag = await db
    .selectFrom("flags")
    .select("id")
    .where("tendon_id", "=", tendonId)
    .where("kind", "=", kind)
    .orderBy("created_at")
    .executeTakeFirstOrThrow();
  return flag.id;
}

/** The id of the tendon's oldest flag that is not closed; the test fails when there is none. */
export async function openFlagIdOf(db: Db, tendonId: string): Promise<string> {
  const flag = await db
    .selectFrom("flags")
    .select("id")
    .where("tendon_id", "=", tendonId)
    .where("status", "!=", "closed")
    .orderBy("created_at")
    .executeTakeFirstOrThrow();
  return flag.id;
}

/** The demo jacks grip 18 in (457.2 mm) of strand behind the anchor (the demo seed's sets). */
export const DEMO_JACK_GRIP_MM = 457.2;

/** A demo person by e-mail, in the shape the server's operations take as `by`. */
export function demoPerson(db: Db, email: string): Promise<{ id: string; name: string }> {
  return db.selectFrom("users").select(["id", "name"]).where("email", "=", email).executeTakeFirstOrThrow();
}

/** The gauge pressure (MPa) at which the set's calibration line gives `forceN`. */
export async function pressureForForce(db: Db, equipmentSetId: string, forceN: number): Promise<number> {
  const line = await db
    .selectFrom("calibrations")
    .select(["slope_n_per_mpa", "intercept_n"])
    .where("equipment_set_id", "=", equipmentSetId)
    .executeTakeFirstOrThrow();
  return (forceN - line.intercept_n) / line.slope_n_per_mpa;
}

/** The tendon's prediction (jacking force, elongation) from its basis as stored, with a demo jack's grip. */
export async function demoPrediction(db: Db, input: { projectId: string; tendonId: string }) {
  const basis = await loadTendonBasis(db, input);
  return predictTendon({
    project: basis.project,
    tendon: basis.tendon,
    lot: basis.lot,
    equipmentGripMm: DEMO_JACK_GRIP_MM,
  });
}

/**
 * Tendons on the given pour shaped like one of the demo schedule's (by default the one-end
 * 2-1-U01: same kind, strands, profile, ends, grip and lot) but for `options`, tagged as given, in that order.
 */
export async function copyDemoTendons(
  db: Db,
  where: { projectId: string; pourId: string },
  tags: readonly string[],
  options: Partial<TendonShape> & { templateTag?: string } = {},
) {
  const { templateTag = "2-1-U01", ...changes } = options;
  const template = tendonFromRow(
    await db
      .selectFrom("tendons")
      .select(TENDON_COLUMNS)
      .where("project_id", "=", where.projectId)
      .where("tag", "=", templateTag)
      .executeTakeFirstOrThrow(),
  );
  return makeTendons(db, where, tags, {
    ...pick(template, ["kind", "strandSize", "strandCount", "segments", "ends", "jackGripMm", "strandLotId"]),
    ...changes,
  });
}

/**
 * A pour of the test's own, `name`d, whose concrete is as confirmed as the pour of the demo tendon
 * it copies (`templateTag`, by default 2-1-U01), with copies of that tendon tagged `tags`, as
 * `copyDemoTendons` makes them (`options` changes their shape).
 */
export async function pourOfDemoCopies(
  db: Db,
  projectId: string,
  name: string,
  tags: readonly string[],
  options: Partial<TendonShape> & { templateTag?: string } = {},
) {
  const source = await db
    .selectFrom("tendons")
    .innerJoin("pours", "pours.id", "tendons.pour_id")
    .select("pours.concrete_strength_mpa")
    .where("tendons.project_id", "=", projectId)
    .where("tendons.tag", "=", options.templateTag ?? "2-1-U01")
    .executeTakeFirstOrThrow();
  const pour = await makePour(db, projectId, { name, concreteStrengthMPa: source.concrete_strength_mpa });
  return { pourId: pour.id, tendons: await copyDemoTendons(db, { projectId, pourId: pour.id }, tags, options) };
}

/**
 * Stressing on the demo project with its set A, at the gauge pressure that gives the jacking force
 * of a tendon like 2-1-U01. `stress` records each end of the tendon at `factor` × its predicted
 * elongation (1: a perfect reading) and evaluates it as a sync would; it returns the first end's
 * record id and the evaluation. `record` does the same without the evaluation.
 */
export async function demoStressing(db: Db, fx: DemoFixture) {
  const template = await fx.tendon("2-1-U01");
  const { jackingForceN } = await demoPrediction(db, { projectId: fx.projectId, tendonId: template.id });
  const pressure = await pressureForForce(db, fx.setA, jackingForceN);
  const predicted = async (tendonId: string) =>
    (await demoPrediction(db, { projectId: fx.projectId, tendonId })).predictedMm;
  /** Records each end of the tendon at `factor` × its prediction, not yet evaluated; the records' ids. */
  const record = async (
    tendon: { id: string; pour_id: string },
    factor: number,
    extra: { deviceTime?: string; wireBreaks?: number } = {},
  ) => {
    const measuredMm = (await predicted(tendon.id)) * factor;
    const { ends } = await db
      .selectFrom("tendons")
      .select("ends")
      .where("id", "=", tendon.id)
      .executeTakeFirstOrThrow();
    const recordIds: string[] = [];
    for (const end of ends === "both" ? (["A", "B"] as const) : (["A"] as const)) {
      recordIds.push(
        await insertRecord(db, {
          projectId: fx.projectId,
          tendon,
          end,
          equipmentSetId: fx.setA,
          authorId: fx.crewId,
          measuredMm,
          finalPressureMPa: pressure,
          ...extra,
        }),
      );
    }
    return recordIds;
  };
  const stress = async (
    tendon: { id: string; pour_id: string },
    factor: number,
    extra: { deviceTime?: string; wireBreaks?: number } = {},
  ) => {
    const [recordId] = await record(tendon, factor, extra);
    const evaluation = await evaluateTendon(db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    return { recordId: recordId!, evaluation };
  };
  return { pressure, predicted, record, stress };
}

/**
 * The signature section of a signed report's CSV (pour or day), as the signer typed it: who, the
 * licence, the statement, when (in the project's zone), the content hash and the revision.
 */
export const signatureRows = (
  values: { signerName: string; licence: string; statement: string },
  contentSha256: string,
  revision = 1,
) => [
  `Signed by: ${values.signerName}`,
  `Licence or certification: ${values.licence}`,
  `Statement: ${values.statement}`,
  expect.stringMatching(/^Signed: \d{4}-\d\d-\d\d \d\d:\d\d C[SD]T$/),
  `Content sha256: ${contentSha256}`,
  `Revision: ${revision}`,
];
