import { projectTimeZone } from "@/lib/format/dates";
import "server-only";
import { reference } from "@/lib/format/references";
import { projectBasisFromRow } from "@/lib/stressing/basis";
import type { Kysely, Selectable } from "kysely";
import type { Database } from "@/db/types";
import type { Decision, FlagKind, FlagStatus, ReviewKind } from "@/lib/schemas/domain";
import { ENGINE_VERSION } from "@/lib/elongation";
import { AppError } from "@/lib/errors";
import { CALIBRATION_COLUMNS, calibrationFromRow, type Calibration } from "@/lib/schemas/calibration";
import {
  EQUIPMENT_SET_COLUMNS,
  equipmentNamedFromRow,
  equipmentSetFromRow,
  type EquipmentNamed,
  type EquipmentSet,
} from "@/lib/schemas/equipment";
import { STRAND_LOT_COLUMNS, strandLotFromRow, type StrandLot } from "@/lib/schemas/strand-lot";
import { qualified } from "@/lib/schemas/columns";
import { POUR_COLUMNS, pourFromRow, type Pour } from "@/lib/schemas/pour";
import { detensionFromRow, type Detension } from "@/lib/schemas/detension";
import { liftoffCheckFromRow, type LiftoffCheck } from "@/lib/schemas/liftoff";
import type { StoredResolution } from "@/lib/format/quantities";
import { findFlagTrail } from "./find-flag-trail";
import { selectConcreteResults } from "./list-concrete-results";
import { selectDetensions } from "./list-detensions";
import { selectLiftoffChecks } from "./list-liftoff-checks";
import { findStandingRelease } from "./find-standing-release";
import { listPourRecords, type PourRecord } from "./list-pour-records";
import { listTendonResults, type TendonResult } from "./list-tendon-results";
import type { ConcreteResultWords } from "@/lib/reports/concrete-lines";

/**
 * Everything the pour's stressing report says, in SI as stored: the project and its computation
 * basis, the pour, the equipment sets with their calibrations, the strand lots, every tendon with
 * its latest evaluation, the flags with their reviews and dispositions, and the release. The PDF
 * and the CSV render this one object, so the two never disagree.
 */

export interface ReportFlag {
  id: string;
  /** The project's running reference, "F-0012". */
  reference: string;
  tendonTag: string;
  /** The stressing record whose evaluation raised it; null for a flag raised by another event. */
  recordId: string | null;
  kind: FlagKind;
  reason: string;
  status: FlagStatus;
  raisedAt: Date;
  closedAt: Date | null;
  closedBy: string | null;
  closeReason: string | null;
  reviews: { kind: ReviewKind; body: string; author: string; at: Date }[];
  dispositions: {
    reference: string;
    decision: Decision;
    reasons: string;
    engineerName: string;
    licenceStatement: string;
    at: Date;
  }[];
}

/** A detension the crew recorded on the engineer's order, for the tendon's record sequence (from the one `Detension`). */
export interface ReportDetension extends Pick<Detension, "tendonId" | "entered" | "releasePressureMPa" | "remarks"> {
  at: Date;
  operator: string;
  recordedBy: string;
  equipment: EquipmentNamed;
  strands: number;
  /** The disposition that ordered it, "D-0003". */
  dispositionReference: string;
}

/** A lift-off check the crew made on the engineer's order, for the tendon's record sequence (from the one `LiftoffCheck`). */
export interface ReportLiftoff extends Pick<
  LiftoffCheck,
  | "tendonId"
  | "entered"
  | "pressureMPa"
  | "liftoffForceN"
  | "expectedForceN"
  | "deviationPct"
  | "bandPct"
  | "withinBand"
> {
  end: "A" | "B";
  at: Date;
  /** Who made the check (the person signed in on the tablet). */
  operator: string;
  equipment: EquipmentNamed;
  calibration: { calibratedOn: string; validUntil: string; laboratory: string | null };
  /** The disposition that ordered it, "D-0003". */
  dispositionReference: string;
  /** The flag it raised outside the band, "F-0004"; null within it. */
  raisedFlagReference: string | null;
}

/** A concrete test result of the pour, as entered (the words of `lib/reports/concrete-lines.ts`). */
export type ReportConcreteResult = ConcreteResultWords;

export interface PourReport {
  /**
   * The moment of the latest change the report shows (a record, an evaluation, a flag's trail,
   * the release). The report prints it instead of the time it was drawn, so the same content
   * always gives the same file, byte for byte.
   */
  asOf: Date;
  /** The zone the pour was stressed in (its records' zone), for every date and time the report prints. */
  timeZone: string;
  engineVersion: string;
  project: {
    id: string;
    code: string;
    name: string;
    address: string | null;
    unitSystem: "us" | "si";
    readingResolution: StoredResolution;
    engineerOfRecordName: string | null;
    releaseBy: "engineer" | "inspector";
  };
  basis: {
    tolerancePct: number;
    groupTolerancePct: number | null;
    shortTendonFloorMm: number | null;
    comparisonBasis: "gross" | "net";
    countJackGrip: boolean;
    frictionMu: number;
    wobblePerM: number;
    anchorSetMm: number;
    /** The project's factor of fpu·A for the specified jacking force (0.80 when absent). */
    jackingForceFactor?: number;
    requiredConcreteMPa: number | null;
  };
  pour: Pick<Pour, "id" | "name" | "level" | "status" | "plannedStressingDate" | "concreteStrengthMPa"> & {
    concreteConfirmedBy: string | null;
    concreteConfirmedAt: Date | null;
  };
  equipment: (Pick<EquipmentSet, "id" | "name" | "jackSerial" | "gaugeSerial" | "pumpSerial"> & {
    calibrations: Pick<Calibration, "calibratedOn" | "validUntil" | "slope" | "intercept" | "r2" | "laboratory">[];
  })[];
  strandLots: Pick<StrandLot, "lotNumber" | "strandSize" | "areaMm2" | "modulusMPa" | "breakingLoadN">[];
  tendons: TendonResult[];
  /** Every stressing of every end, in order: the original and each restress, never only the latest. */
  records: PourRecord[];
  /** The detensions of the pour's tendons, oldest first; the records table shows them in each tendon's sequence. */
  detensions: ReportDetension[];
  /** The lift-off checks on the pour's tendons, oldest first; the records table shows them in each tendon's sequence. */
  liftoffChecks: ReportLiftoff[];
  /** The pour's concrete test results, oldest first. */
  concreteResults: ReportConcreteResult[];
  /** Each time the engineer reopened a release of this pour, oldest first. */
  reopenings: { byName: string; at: Date; reason: string; releasedBy: string; releasedAt: Date }[];
  flags: ReportFlag[];
  release: {
    byName: string;
    at: Date;
    statement: string;
    /** The signature (null on releases from before releases were signed). */
    signature: { signerName: string; licence: string; contentSha256: string } | null;
  } | null;
}

export { reference };

const asDay = (d: Date | string) => (typeof d === "string" ? d.slice(0, 10) : d.toISOString().slice(0, 10));

type ProjectRow = Selectable<Database["projects"]>;

/**
 * `project` is the project's row when the caller has read it already (the daily report draws
 * every pour of a day from one read); it must be the row of `input.projectId`.
 */
export async function getPourReport(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
  preread?: { project?: ProjectRow },
): Promise<PourReport> {
  const project =
    preread?.project && preread.project.id === input.projectId
      ? preread.project
      : await db.selectFrom("projects").selectAll().where("id", "=", input.projectId).executeTakeFirst();
  const pour = await db
    .selectFrom("pours")
    .leftJoin("users", "users.id", "pours.concrete_confirmed_by")
    .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
    .select([
      ...qualified("pours", POUR_COLUMNS),
      "pour_states.status",
      "pours.concrete_confirmed_at",
      "pours.updated_at",
      "users.name as concreteConfirmedBy",
    ])
    .where("pours.project_id", "=", input.projectId)
    .where("pours.id", "=", input.pourId)
    .executeTakeFirst();
  if (!project || !pour) throw new AppError("NOT_FOUND", "No such pour on this project.");

  const [tendons, records, { flags, reviews, dispositions }, release, detensions, liftoffs, concrete, reopenings] =
    await Promise.all([
      listTendonResults(db, input),
      listPourRecords(db, { ...input, projectBasis: project.comparison_basis, timeZone: projectTimeZone(project) }),
      findFlagTrail(db, { projectId: input.projectId, pourId: input.pourId }),
      findStandingRelease(db, input),
      selectDetensions(db, input.projectId)
        .select([
          "equipment_sets.name",
          "equipment_sets.jack_serial",
          "equipment_sets.gauge_serial",
          "equipment_sets.pump_serial",
        ])
        .where("detensions.pour_id", "=", input.pourId)
        .orderBy("detensions.detensioned_at")
        .orderBy("detensions.id")
        .execute(),
      selectLiftoffChecks(db, input.projectId)
        .select([
          "equipment_sets.name",
          "equipment_sets.jack_serial",
          "equipment_sets.gauge_serial",
          "equipment_sets.pump_serial",
          "calibrations.calibrated_on",
          "calibrations.valid_until",
          "calibrations.laboratory",
        ])
        .where("liftoff_checks.pour_id", "=", input.pourId)
        .orderBy("liftoff_checks.checked_at")
        .orderBy("liftoff_checks.id")
        .execute(),
      selectConcreteResults(db, input.projectId)
        .select("users.name as entered_by_name")
        .where("c.pour_id", "=", input.pourId)
        .orderBy("c.entered_at")
        .orderBy("c.id")
        .execute(),
      db
        .selectFrom("pour_reopenings as o")
        .innerJoin("releases", (j) =>
          j.onRef("releases.id", "=", "o.release_id").onRef("releases.project_id", "=", "o.project_id"),
        )
        .select([
          "o.reopened_by_name",
          "o.reason",
          "o.created_at",
          "releases.released_by_name",
          "releases.created_at as released_at",
        ])
        .where("o.project_id", "=", input.projectId)
        .where("o.pour_id", "=", input.pourId)
        .orderBy("o.created_at")
        .orderBy("o.id")
        .execute(),
    ]);
  // The references come with the pour's flag trail (each row keeps its number). A disposition named
  // elsewhere (a detension's order, a closing's words) that is not on this pour's flags is read by id,
  // on this project only: none in the usual case, so no read of the project's every flag per report.
  const flagRef = new Map(flags.map((f) => [f.id, f.reference]));
  const dispositionRef = new Map(dispositions.map((d) => [d.id, d.reference]));
  const named = [
    ...detensions.map((d) => d.disposition_id),
    ...liftoffs.map((l) => l.disposition_id),
    ...flags.flatMap((f) => [...(f.closeReason ?? "").matchAll(/disposition ([0-9a-f-]{36})/g)].map((m) => m[1]!)),
  ];
  const stray = [...new Set(named.filter((id) => !dispositionRef.has(id)))];
  if (stray.length)
    for (const d of await db
      .selectFrom("dispositions")
      .select(["id", "number as n"])
      .where("project_id", "=", input.projectId)
      .where("id", "in", stray)
      .execute())
      dispositionRef.set(d.id, reference("D", Number(d.n)));

  // The sets used on this pour and the lots its tendons name.
  const setIds = [...new Set(tendons.flatMap((t) => t.endResults.map((r) => r.equipmentSetId)))];
  const lotNumbers = [...new Set(tendons.map((t) => t.lotNumber).filter((n): n is string => n !== null))];
  const [sets, calibrations, lots] = await Promise.all([
    setIds.length
      ? db
          .selectFrom("equipment_sets")
          .select(EQUIPMENT_SET_COLUMNS)
          .where("project_id", "=", input.projectId)
          .where("id", "in", setIds)
          .orderBy("name")
          .execute()
      : [],
    setIds.length
      ? db
          .selectFrom("calibrations")
          .select(CALIBRATION_COLUMNS)
          .where("project_id", "=", input.projectId)
          .where("equipment_set_id", "in", setIds)
          .orderBy("calibrated_on")
          .execute()
      : [],
    lotNumbers.length
      ? db
          .selectFrom("strand_lots")
          .select(STRAND_LOT_COLUMNS)
          .where("project_id", "=", input.projectId)
          .where("lot_number", "in", lotNumbers)
          .orderBy("lot_number")
          .execute()
      : [],
  ]);

  const moments = [
    new Date(pour.updated_at),
    ...records.flatMap((r) => [r.deviceTime, ...(r.evaluation ? [r.evaluation.at] : [])]),
    ...tendons.flatMap((t) => (t.evaluation ? [t.evaluation.createdAt] : [])),
    ...flags.flatMap((f) => [new Date(f.createdAt), ...(f.closedAt ? [new Date(f.closedAt)] : [])]),
    ...reviews.map((r) => new Date(r.created_at)),
    ...dispositions.map((d) => new Date(d.createdAt)),
    ...(release ? [new Date(release.created_at)] : []),
    ...detensions.map((d) => new Date(d.detensioned_at)),
    ...liftoffs.map((l) => new Date(l.checked_at)),
    ...concrete.map((c) => new Date(c.entered_at)),
    ...reopenings.map((o) => new Date(o.created_at)),
  ];
  const asOf = new Date(Math.max(...moments.map((m) => m.getTime())));

  const shown = pourFromRow(pour);
  // Every date on the report is written in the project's own time zone (the site's), like the screens.
  const timeZone = projectTimeZone(project);

  return {
    asOf,
    timeZone,
    engineVersion: ENGINE_VERSION,
    project: reportProjectHead(project),
    basis: {
      ...projectBasisFromRow(project),
      groupTolerancePct: project.group_tolerance_pct,
      requiredConcreteMPa: project.required_concrete_mpa,
    },
    pour: {
      id: shown.id,
      name: shown.name,
      level: shown.level,
      status: shown.status,
      plannedStressingDate: shown.plannedStressingDate,
      concreteStrengthMPa: shown.concreteStrengthMPa,
      concreteConfirmedBy: pour.concreteConfirmedBy,
      concreteConfirmedAt: pour.concrete_confirmed_at ? new Date(pour.concrete_confirmed_at) : null,
    },
    equipment: sets.map(equipmentSetFromRow).map(({ id, name, jackSerial, gaugeSerial, pumpSerial }) => ({
      id,
      name,
      jackSerial,
      gaugeSerial,
      pumpSerial,
      calibrations: calibrations
        .map(calibrationFromRow)
        .filter((c) => c.equipmentSetId === id)
        .map(({ calibratedOn, validUntil, slope, intercept, r2, laboratory }) => ({
          calibratedOn,
          validUntil,
          slope,
          intercept,
          r2,
          laboratory,
        })),
    })),
    strandLots: lots.map(strandLotFromRow).map(({ lotNumber, strandSize, areaMm2, modulusMPa, breakingLoadN }) => ({
      lotNumber,
      strandSize,
      areaMm2,
      modulusMPa,
      breakingLoadN,
    })),
    tendons,
    records,
    detensions: detensions.map((row) => {
      const d = detensionFromRow(row);
      return {
        tendonId: d.tendonId,
        at: new Date(d.detensionedAt),
        operator: d.operatorName,
        recordedBy: d.recordedByName,
        equipment: equipmentNamedFromRow(row),
        entered: d.entered,
        releasePressureMPa: d.releasePressureMPa,
        strands: d.strandsDetensioned,
        remarks: d.remarks,
        dispositionReference: dispositionRef.get(d.dispositionId) ?? "D-?",
      };
    }),
    liftoffChecks: liftoffs.map((row) => {
      const l = liftoffCheckFromRow(row);
      return {
        tendonId: l.tendonId,
        end: l.tendonEnd,
        at: new Date(l.checkedAt),
        operator: l.checkedByName,
        equipment: equipmentNamedFromRow(row),
        calibration: {
          calibratedOn: asDay(row.calibrated_on),
          validUntil: asDay(row.valid_until),
          laboratory: row.laboratory,
        },
        entered: l.entered,
        pressureMPa: l.pressureMPa,
        liftoffForceN: l.liftoffForceN,
        expectedForceN: l.expectedForceN,
        deviationPct: l.deviationPct,
        bandPct: l.bandPct,
        withinBand: l.withinBand,
        dispositionReference: dispositionRef.get(l.dispositionId) ?? "D-?",
        raisedFlagReference: l.raisedFlagId ? (flagRef.get(l.raisedFlagId) ?? "F-?") : null,
      };
    }),
    concreteResults: concrete.map((c) => ({
      specimen: c.specimen,
      strengthMPa: c.strength_mpa,
      ageDays: c.age_days,
      specimenCount: c.specimen_count,
      labReport: c.attachment_id ? (c.original_name ?? "uploaded (no file name)") : null,
      enteredBy: c.entered_by_name,
      at: new Date(c.entered_at),
    })),
    reopenings: reopenings.map((o) => ({
      byName: o.reopened_by_name,
      at: new Date(o.created_at),
      reason: o.reason,
      releasedBy: o.released_by_name,
      releasedAt: new Date(o.released_at),
    })),
    flags: flags.map((f) => ({
      id: f.id,
      reference: flagRef.get(f.id) ?? "F-?",
      tendonTag: f.tendonTag,
      recordId: f.recordId,
      kind: f.kind,
      reason: f.reason,
      status: f.status,
      raisedAt: new Date(f.createdAt),
      closedAt: f.closedAt ? new Date(f.closedAt) : null,
      closedBy: f.closedByName,
      // Closures written by the evaluation name rows by id; the report names them by reference.
      closeReason: f.closeReason
        ? f.closeReason
            .replace(
              /disposition ([0-9a-f-]{36})/g,
              (_, id: string) => `disposition ${dispositionRef.get(id) ?? "of another project"}`,
            )
            .replace(/;? ?evaluation [0-9a-f-]{36}/g, "; the new evaluation")
        : null,
      reviews: reviews
        .filter((r) => r.flag_id === f.id)
        .map((r) => ({ kind: r.kind, body: r.body, author: r.author, at: new Date(r.created_at) })),
      dispositions: dispositions
        .filter((d) => d.flagId === f.id)
        .map((d) => ({
          reference: dispositionRef.get(d.id) ?? "D-?",
          decision: d.decision,
          reasons: d.reasons,
          engineerName: d.engineerName,
          licenceStatement: d.licenceStatement,
          at: new Date(d.createdAt),
        })),
    })),
    release: release
      ? {
          byName: release.released_by_name,
          at: new Date(release.created_at),
          statement: release.statement,
          signature:
            release.signer_name && release.licence && release.content_sha256
              ? { signerName: release.signer_name, licence: release.licence, contentSha256: release.content_sha256 }
              : null,
        }
      : null,
  };
}

/** The project as a report's head names it (the pour's and the day's reports). */
export function reportProjectHead(
  project: Pick<
    Selectable<Database["projects"]>,
    "id" | "code" | "name" | "address" | "unit_system" | "reading_resolution" | "engineer_of_record_name" | "release_by"
  >,
): PourReport["project"] {
  return {
    id: project.id,
    code: project.code,
    name: project.name,
    address: project.address,
    unitSystem: project.unit_system,
    readingResolution: project.reading_resolution as StoredResolution,
    engineerOfRecordName: project.engineer_of_record_name,
    releaseBy: project.release_by,
  };
}
