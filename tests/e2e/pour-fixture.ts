import { expect, type APIRequestContext } from "@playwright/test";
import { randomUUID } from "node:crypto";
import { uuidv7 } from "uuidv7";
import { pressureForForce } from "@/lib/elongation";
import { predictTendon, type ProjectBasis, type TendonBasis } from "@/lib/stressing/basis";
import { formatLength, MM_PER_INCH, MPA_PER_PSI, parseLength, parsePressure } from "@/lib/units";
import { PEOPLE, apiAs, queryDemo } from "./people";

const PSI_PER_MPA = 1 / MPA_PER_PSI;

/**
 * A pour of the demo project made for one spec, with one-end tendons copied from the demo schedule.
 * A spec stresses, flags, signs or releases only pours it made this way (or through the app), so
 * it passes alone and in any order: the demo's own pours stay as seeded for the specs that read them.
 */
export interface PourFixture {
  projectId: string;
  pourId: string;
  pourName: string;
  tendons: { id: string; tag: string }[];
  crewId: string;
  setId: string;
  setName: string;
  calibrationId: string;
  line: { slope: number; intercept: number };
  project: ProjectBasis;
  tendon: TendonBasis;
  lot: { areaMm2: number; modulusMPa: number; breakingLoadN: number } | null;
}

export interface PourFixtureOptions {
  /** false: the pour starts with no concrete results, so the concrete gate is not met (default true). */
  concreteConfirmed?: boolean;
}

export async function makePourFixture(
  pourName: string,
  tags: string[],
  options: PourFixtureOptions = {},
): Promise<PourFixture> {
  const confirmed = options.concreteConfirmed ?? true;
  const [p] = await queryDemo<Record<string, unknown>>("select * from projects where code = 'AYP'");
  const [template] = await queryDemo<Record<string, unknown>>(
    "select * from tendons where project_id = $1 and ends = 'A' order by tag limit 1",
    [p!.id],
  );
  const [pour] = await queryDemo<{ id: string }>(
    `insert into pours (project_id, name, level, concrete_strength_mpa, concrete_confirmed_at, planned_stressing_date)
     values ($1, $2, 'Level 2', $3, $4, current_date) returning id`,
    [p!.id, pourName, confirmed ? 25 : null, confirmed ? new Date() : null],
  );
  const tendons: { id: string; tag: string }[] = [];
  for (const tag of tags) {
    const [row] = await queryDemo<{ id: string }>(
      `insert into tendons (project_id, pour_id, tag, kind, strand_size, strand_count, segments, ends, jack_grip_mm, strand_lot_id)
       values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10) returning id`,
      [
        p!.id,
        pour!.id,
        tag,
        template!.kind,
        template!.strand_size,
        template!.strand_count,
        JSON.stringify(template!.segments),
        template!.ends,
        template!.jack_grip_mm,
        template!.strand_lot_id,
      ],
    );
    tendons.push({ id: row!.id, tag });
  }
  const [lot] = await queryDemo<{ area_mm2: number; modulus_mpa: number; breaking_load_n: number }>(
    "select * from strand_lots where id = $1",
    [template!.strand_lot_id],
  );
  // The demo's Set A by name, with its calibration in force: other specs add sets and retire or
  // correct calibrations of their own, and none of that may change what this pour is stressed with.
  const [set] = await queryDemo<{
    id: string;
    name: string;
    calibration_id: string;
    slope_n_per_mpa: number;
    intercept_n: number;
  }>(
    `select s.id, s.name, c.id as calibration_id, c.slope_n_per_mpa, c.intercept_n from equipment_sets s join calibrations c on c.equipment_set_id = s.id
     where s.project_id = $1 and s.name like 'Set A%' and c.retired_at is null order by c.calibrated_on desc limit 1`,
    [p!.id],
  );
  if (!set) throw new Error("the demo's Set A with a calibration in force was not found");
  const [crew] = await queryDemo<{ id: string }>("select id from users where email = $1", [PEOPLE.crew]);
  return {
    projectId: p!.id as string,
    pourId: pour!.id,
    pourName,
    tendons,
    crewId: crew!.id,
    setId: set!.id,
    setName: set!.name,
    calibrationId: set!.calibration_id,
    line: { slope: set!.slope_n_per_mpa, intercept: set!.intercept_n },
    project: {
      tolerancePct: p!.tolerance_pct as number,
      shortTendonFloorMm: p!.short_tendon_floor_mm as number | null,
      comparisonBasis: p!.comparison_basis as "gross" | "net",
      countJackGrip: p!.count_jack_grip as boolean,
      frictionMu: p!.friction_mu as number,
      wobblePerM: p!.wobble_per_m as number,
      anchorSetMm: p!.anchor_set_mm as number,
    },
    tendon: {
      strandSize: template!.strand_size as string,
      strandCount: template!.strand_count as number,
      segments: template!.segments as TendonBasis["segments"],
      ends: template!.ends as TendonBasis["ends"],
      jackGripMm: template!.jack_grip_mm as number | null,
    },
    lot: lot ? { areaMm2: lot.area_mm2, modulusMPa: lot.modulus_mpa, breakingLoadN: lot.breaking_load_n } : null,
  };
}

/**
 * Pushes one record of end A, typed as the crew would type it (pressure to the gauge mark,
 * marks to 1/8 in), through the tablet's sync route; answers the op's result.
 */
/** What the crew types for a reading `factor` times the prediction: pressure to the mark, marks from 2 in. */
export function typedReading(fx: PourFixture, factor: number): { psi: string; before: string; after: string } {
  const predicted = predictTendon({ project: fx.project, tendon: fx.tendon, lot: fx.lot });
  const psi = String(Math.floor((pressureForForce(fx.line, predicted.jackingForceN) * PSI_PER_MPA) / 50) * 50);
  const after = formatLength(2 * MM_PER_INCH + predicted.predictedMm * factor, "1/8 in").replace(/ in$/, "");
  return { psi, before: "2", after };
}

export async function pushEndA(
  crew: APIRequestContext,
  fx: PourFixture,
  tendonId: string,
  factor: number,
  /**
   * The tablet's clock at the save (now by default), and fields of the record's payload to send
   * otherwise (a reason for a set used without its calibration).
   */
  options: { deviceTime?: Date; expiredCalibrationReason?: string | null } = {},
) {
  const { psi, after } = typedReading(fx, factor);
  const measuredMm =
    parseLength(after, { field: "marksAfter", system: "US", defaultUnit: "in" }) -
    parseLength("2", { field: "marksBefore", system: "US", defaultUnit: "in" });
  const id = uuidv7();
  const payload = {
    projectId: fx.projectId,
    pourId: fx.pourId,
    tendonId,
    tendonEnd: "A",
    chainId: id,
    revision: 1,
    baseRecordId: null,
    revisionReason: null,
    equipmentSetId: fx.setId,
    calibrationId: fx.calibrationId,
    expiredCalibrationReason: null,
    initialPressureMPa: null,
    finalPressureMPa: parsePressure(psi, { field: "finalPressure", system: "SI", defaultUnit: "psi" }),
    readingMethod: "marks",
    entered: {
      units: { length: "in", pressure: "psi" },
      initialPressure: null,
      finalPressure: psi,
      marks: { before: "2", after },
      strokes: null,
      seating: null,
    },
    measuredMm,
    seatingMm: null,
    wireBreaks: 0,
    remarks: null,
    deviceTime: (options.deviceTime ?? new Date()).toISOString(),
    deviceTimeZone: "America/Chicago",
    authorUserId: fx.crewId,
    ...("expiredCalibrationReason" in options
      ? { expiredCalibrationReason: options.expiredCalibrationReason ?? null }
      : {}),
  };
  const res = await crew.post("/api/sync/push", {
    data: { deviceId: "release-check-tablet", ops: [{ opId: randomUUID(), kind: "create", recordId: id, payload }] },
  });
  const body = (await res.json()) as { results: { status: string; error?: { code: string; message: string } }[] };
  return { httpStatus: res.status(), result: body.results[0]!, recordId: id };
}

/** Pushes end A of each tendon at its factor of the prediction (`pushEndA`); each must be applied. */
export async function pushReadings(
  crew: APIRequestContext,
  fx: PourFixture,
  readings: readonly (readonly [tendonId: string, factor: number])[],
): Promise<void> {
  for (const [tendonId, factor] of readings) {
    expect((await pushEndA(crew, fx, tendonId, factor)).result).toMatchObject({ status: "applied" });
  }
}

/** The id of the out-of-band flag a reading raised on the tendon; the test fails if there is none. */
export async function outOfBandFlagId(tendonId: string): Promise<string> {
  const [flag] = await queryDemo<{ id: string }>("select id from flags where tendon_id = $1 and kind = 'out_of_band'", [
    tendonId,
  ]);
  expect(flag, "the reading raised an out-of-band flag").toBeTruthy();
  return flag!.id;
}

/** The engineer records a decision on the flag, with a licence statement, through the app's route (201). */
export async function decideFlag(
  engineer: APIRequestContext,
  fx: PourFixture,
  flagId: string,
  decision: string,
  reasons: string,
): Promise<void> {
  const ordered = await engineer.post(`/api/projects/${fx.projectId}/flags/${flagId}/dispositions`, {
    data: { decision, reasons, licenceStatement: "Licensed professional engineer (test)" },
  });
  expect(ordered.status()).toBe(201);
}

/**
 * A pour of the spec's own whose one tendon (`tag`) read short, at 85 % of the prediction, and was
 * flagged; and the engineer's `decision` on the flag, for `reasons`. The pour, its tendon, the
 * crew's and the engineer's API clients (the spec disposes of them), the flag and the record.
 */
export async function shortTendonDecided(pourName: string, tag: string, decision: string, reasons: string) {
  const fx = await makePourFixture(pourName, [tag]);
  const tendon = fx.tendons[0]!;
  const crewApi = await apiAs(PEOPLE.crew);
  const pushed = await pushEndA(crewApi, fx, tendon.id, 0.85);
  expect(pushed.result).toMatchObject({ status: "applied" });
  const flagId = await outOfBandFlagId(tendon.id);
  const engineerApi = await apiAs(PEOPLE.engineer);
  await decideFlag(engineerApi, fx, flagId, decision, reasons);
  return { fx, tendon, crewApi, engineerApi, flagId, recordId: pushed.recordId };
}

/** The demo project's id (a spec that only needs the project, not a pour of its own). */
export async function demoProjectId(): Promise<string> {
  const [project] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  return project!.id;
}

/** Five calibration points on a line of `slope` N per MPa less 900 N (invented figures, about 5.1 kN per MPa). */
export const calibrationLine = (slope = 5100) =>
  [5, 10, 20, 30, 40].map((p) => ({ pressureMPa: p, forceN: slope * p - 900 }));

/**
 * An equipment set of the spec's own on the project, made by the admin through the app's route
 * (201), named and serialled as given, with no grip and no force limit; and one calibration of
 * `calibratedOn` on `calibrationLine()` (201). Their ids.
 */
export async function makeCalibratedSet(
  admin: APIRequestContext,
  projectId: string,
  set: { name: string; jackSerial: string; gaugeSerial: string },
  calibratedOn: string,
): Promise<{ setId: string; calibrationId: string }> {
  const made = await admin.post(`/api/projects/${projectId}/equipment-sets`, {
    data: { ...set, pumpSerial: null, jackGripMm: null, maxForceN: null },
  });
  expect(made.status()).toBe(201);
  const { setId } = (await made.json()) as { setId: string };
  const calibration = await admin.post(`/api/projects/${projectId}/equipment-sets/${setId}/calibrations`, {
    data: {
      calibratedOn,
      validUntil: null,
      points: calibrationLine(),
      laboratory: null,
      certificateAttachmentId: null,
    },
  });
  expect(calibration.status()).toBe(201);
  const { calibrationId } = (await calibration.json()) as { calibrationId: string };
  return { setId, calibrationId };
}
