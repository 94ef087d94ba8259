import "server-only";
import { projectBasisFromRow } from "@/lib/stressing/basis";
import type { Kysely } from "kysely";
import type { Database, Decision, FlagKind, FlagStatus, ReviewKind } from "@/db/types";
import { ENGINE_VERSION } from "@/lib/elongation";
import { AppError } from "@/lib/errors";
import type { StoredResolution } from "@/lib/stressing/display";
import { findFlagTrail } from "./find-flag-trail";
import { listTendonResults, type TendonResult } from "./list-tendon-results";

/**
 * Everything the pour's stressing report says, in SI as stored: the project and its computation
 * basis, the pour, the equipment sets with their calibrations, the strand lots, every tendon with
 * its latest evaluation, the flags with their reviews and dispositions, and the release. The PDF
 * and the CSV render this one object, so the two never disagree.
 */

export interface ReportFlag {
  id: string;
  tendonTag: string;
  kind: FlagKind;
  reason: string;
  status: FlagStatus;
  raisedAt: Date;
  closedAt: Date | null;
  closedBy: string | null;
  closeReason: string | null;
  reviews: { kind: ReviewKind; body: string; author: string; at: Date }[];
  dispositions: { decision: Decision; reasons: string; engineerName: string; licenceStatement: string; at: Date }[];
}

export interface PourReport {
  generatedAt: Date;
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
    requiredConcreteMpa: number | null;
  };
  pour: {
    id: string;
    name: string;
    level: string | null;
    status: string;
    plannedStressingDate: string | null;
    concreteStrengthMpa: number | null;
  };
  equipment: {
    id: string;
    name: string;
    jackSerial: string;
    gaugeSerial: string;
    pumpSerial: string | null;
    calibrations: {
      calibratedOn: string;
      validUntil: string;
      slope: number;
      intercept: number;
      r2: number;
      laboratory: string | null;
    }[];
  }[];
  strandLots: { lotNumber: string; strandSize: string; areaMm2: number; modulusMPa: number; breakingLoadN: number }[];
  tendons: TendonResult[];
  flags: ReportFlag[];
  release: { byName: string; at: Date; statement: string } | null;
}

const asDay = (d: Date | string) => (typeof d === "string" ? d.slice(0, 10) : d.toISOString().slice(0, 10));

export async function getPourReport(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<PourReport> {
  const project = await db.selectFrom("projects").selectAll().where("id", "=", input.projectId).executeTakeFirst();
  const pour = await db
    .selectFrom("pours")
    .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
    .select(["pours.id", "pours.name", "pours.level", "pour_states.status", "pours.planned_stressing_date", "pours.concrete_strength_mpa"])
    .where("pours.project_id", "=", input.projectId)
    .where("pours.id", "=", input.pourId)
    .executeTakeFirst();
  if (!project || !pour) throw new AppError("NOT_FOUND", "No such pour on this project.");

  const [tendons, { flags, reviews, dispositions }, release] = await Promise.all([
    listTendonResults(db, input),
    findFlagTrail(db, { projectId: input.projectId, pourId: input.pourId }),
    db
      .selectFrom("releases")
      .select(["released_by_name", "statement", "created_at"])
      .where("project_id", "=", input.projectId)
      .where("pour_id", "=", input.pourId)
      .executeTakeFirst(),
  ]);

  // The sets used on this pour and the lots its tendons name.
  const setIds = [...new Set(tendons.flatMap((t) => t.endResults.map((r) => r.equipmentSetId)))];
  const lotNumbers = [...new Set(tendons.map((t) => t.lotNumber).filter((n): n is string => n !== null))];
  const [sets, calibrations, lots] = await Promise.all([
    setIds.length
      ? db
          .selectFrom("equipment_sets")
          .select(["id", "name", "jack_serial", "gauge_serial", "pump_serial"])
          .where("project_id", "=", input.projectId)
          .where("id", "in", setIds)
          .orderBy("name")
          .execute()
      : [],
    setIds.length
      ? db
          .selectFrom("calibrations")
          .select([
            "equipment_set_id",
            "calibrated_on",
            "valid_until",
            "slope_n_per_mpa",
            "intercept_n",
            "r2",
            "laboratory",
          ])
          .where("project_id", "=", input.projectId)
          .where("equipment_set_id", "in", setIds)
          .orderBy("calibrated_on")
          .execute()
      : [],
    lotNumbers.length
      ? db
          .selectFrom("strand_lots")
          .select(["lot_number", "strand_size", "area_mm2", "modulus_mpa", "breaking_load_n"])
          .where("project_id", "=", input.projectId)
          .where("lot_number", "in", lotNumbers)
          .orderBy("lot_number")
          .execute()
      : [],
  ]);

  return {
    generatedAt: new Date(),
    engineVersion: ENGINE_VERSION,
    project: {
      id: project.id,
      code: project.code,
      name: project.name,
      address: project.address,
      unitSystem: project.unit_system,
      readingResolution: project.reading_resolution as StoredResolution,
      engineerOfRecordName: project.engineer_of_record_name,
      releaseBy: project.release_by,
    },
    basis: {
      ...projectBasisFromRow(project),
      groupTolerancePct: project.group_tolerance_pct,
      requiredConcreteMpa: project.required_concrete_mpa,
    },
    pour: {
      id: pour.id,
      name: pour.name,
      level: pour.level,
      status: pour.status,
      plannedStressingDate: pour.planned_stressing_date ? asDay(pour.planned_stressing_date) : null,
      concreteStrengthMpa: pour.concrete_strength_mpa,
    },
    equipment: sets.map((s) => ({
      id: s.id,
      name: s.name,
      jackSerial: s.jack_serial,
      gaugeSerial: s.gauge_serial,
      pumpSerial: s.pump_serial,
      calibrations: calibrations
        .filter((c) => c.equipment_set_id === s.id)
        .map((c) => ({
          calibratedOn: asDay(c.calibrated_on),
          validUntil: asDay(c.valid_until),
          slope: c.slope_n_per_mpa,
          intercept: c.intercept_n,
          r2: c.r2,
          laboratory: c.laboratory,
        })),
    })),
    strandLots: lots.map((l) => ({
      lotNumber: l.lot_number,
      strandSize: l.strand_size,
      areaMm2: l.area_mm2,
      modulusMPa: l.modulus_mpa,
      breakingLoadN: l.breaking_load_n,
    })),
    tendons,
    flags: flags.map((f) => ({
      id: f.id,
      tendonTag: f.tag,
      kind: f.kind,
      reason: f.reason,
      status: f.status,
      raisedAt: new Date(f.created_at),
      closedAt: f.closed_at ? new Date(f.closed_at) : null,
      closedBy: f.closedByName,
      closeReason: f.close_reason,
      reviews: reviews
        .filter((r) => r.flag_id === f.id)
        .map((r) => ({ kind: r.kind, body: r.body, author: r.author, at: new Date(r.created_at) })),
      dispositions: dispositions
        .filter((d) => d.flag_id === f.id)
        .map((d) => ({
          decision: d.decision,
          reasons: d.reasons,
          engineerName: d.engineer_name,
          licenceStatement: d.licence_statement,
          at: new Date(d.created_at),
        })),
    })),
    release: release
      ? { byName: release.released_by_name, at: new Date(release.created_at), statement: release.statement }
      : null,
  };
}
