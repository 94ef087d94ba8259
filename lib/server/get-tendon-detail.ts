import "server-only";
import type { Db } from "@/db/connect";
import type { StressingEnds, TendonKind, TendonSegment } from "@/db/types";
import { forceProfile, isInputError, type Check, type ForceProfile } from "@/lib/elongation";
import { AppError } from "@/lib/errors";
import type { CalibrationState } from "@/lib/schemas/calibration";
import { predictTendon, targetPressureMPa, type ProjectBasis, type TendonPrediction } from "@/lib/stressing/basis";
import { getProjectSettings, type ProjectSettingsView } from "./get-project-settings";
import { listEquipmentSets } from "./list-equipment-sets";

/** A shop-drawing elongation further than this from ours is marked for the detailer to check. */
export const SHOP_DRAWING_MARK_PCT = 2;

export interface TargetForSet {
  setId: string;
  name: string;
  state: CalibrationState;
  validUntil: string | null;
  targetPressureMPa: number | null;
  /** Why no target, or what is wrong with it (outside the calibrated range, over the jack's rating). */
  notes: string[];
}

export interface TendonDetail {
  project: ProjectSettingsView;
  tendon: {
    id: string;
    tag: string;
    kind: TendonKind;
    strandSize: string;
    strandCount: number;
    segments: TendonSegment[];
    ends: StressingEnds;
    jackGripMm: number | null;
    shopElongationMm: number | null;
    pour: { id: string; name: string };
    lot: { id: string; lotNumber: string } | null;
  };
  computed:
    | {
        ok: true;
        prediction: TendonPrediction;
        /** The same tendon on nominal strand values, to show what the mill certificate changes. */
        nominalPredictedMm: number | null;
        profile: ForceProfile;
        shopDifferencePct: number | null;
        shopMarked: boolean;
        checks: Check[];
      }
    | { ok: false; message: string };
  targets: TargetForSet[];
}

export function projectBasis(p: ProjectSettingsView): ProjectBasis {
  return {
    tolerancePct: p.tolerancePct,
    shortTendonFloorMm: p.shortTendonFloorMm,
    comparisonBasis: p.comparisonBasis,
    countJackGrip: p.countJackGrip,
    frictionMu: p.frictionMu,
    wobblePerM: p.wobblePerM,
    anchorSetMm: p.anchorSetMm,
  };
}

/** Everything the tendon screen shows, computed by the shared basis (never re-derived here). */
export async function getTendonDetail(db: Db, input: { projectId: string; tendonId: string; today?: string }): Promise<TendonDetail> {
  const row = await db
    .selectFrom("tendons")
    .innerJoin("pours", (j) => j.onRef("pours.id", "=", "tendons.pour_id").on("pours.project_id", "=", input.projectId))
    .leftJoin("strand_lots", (j) => j.onRef("strand_lots.id", "=", "tendons.strand_lot_id").on("strand_lots.project_id", "=", input.projectId))
    .select([
      "tendons.id",
      "tendons.tag",
      "tendons.kind",
      "tendons.strand_size",
      "tendons.strand_count",
      "tendons.segments",
      "tendons.ends",
      "tendons.jack_grip_mm",
      "tendons.shop_elongation_mm",
      "pours.id as pour_id",
      "pours.name as pour_name",
      "strand_lots.id as lot_id",
      "strand_lots.lot_number",
      "strand_lots.area_mm2",
      "strand_lots.modulus_mpa",
      "strand_lots.breaking_load_n",
    ])
    .where("tendons.project_id", "=", input.projectId)
    .where("tendons.id", "=", input.tendonId)
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such tendon on this project.");
  const [project, sets] = await Promise.all([getProjectSettings(db, input.projectId), listEquipmentSets(db, input.projectId, input.today)]);

  const tendon = { strandSize: row.strand_size, strandCount: row.strand_count, segments: row.segments, ends: row.ends, jackGripMm: row.jack_grip_mm };
  const lot = row.lot_id && row.area_mm2 !== null && row.modulus_mpa !== null && row.breaking_load_n !== null ? { areaMm2: row.area_mm2, modulusMPa: row.modulus_mpa, breakingLoadN: row.breaking_load_n } : null;
  const basis = projectBasis(project);

  let computed: TendonDetail["computed"];
  try {
    const prediction = predictTendon({ project: basis, tendon, lot });
    const nominalPredictedMm = lot ? predictTendon({ project: basis, tendon, lot: null }).predictedMm : null;
    const profile = forceProfile({
      segments: tendon.segments,
      strandAreaMm2: prediction.strand.areaMm2,
      strandCount: tendon.strandCount,
      modulusMPa: prediction.strand.modulusMPa,
      jackingForceN: prediction.jackingForceN,
      wobblePerM: basis.wobblePerM,
      mu: basis.frictionMu,
      anchorSetMm: basis.anchorSetMm > 0 ? basis.anchorSetMm : undefined,
      jackGripMm: prediction.gripMm > 0 ? prediction.gripMm : undefined,
      ends: tendon.ends,
    });
    const shopDifferencePct = row.shop_elongation_mm ? ((row.shop_elongation_mm - prediction.predictedMm) / prediction.predictedMm) * 100 : null;
    computed = {
      ok: true,
      prediction,
      nominalPredictedMm,
      profile,
      shopDifferencePct,
      shopMarked: shopDifferencePct !== null && Math.abs(shopDifferencePct) > SHOP_DRAWING_MARK_PCT,
      checks: prediction.checks,
    };
  } catch (error) {
    if (!isInputError(error) && !(error instanceof Error && /strand size/.test(error.message))) throw error;
    computed = { ok: false, message: `This tendon cannot be computed: ${error.message}. Correct the schedule.` };
  }

  const jackingForceN = computed.ok ? computed.prediction.jackingForceN : null;
  const targets: TargetForSet[] = sets.map((s) => {
    const notes: string[] = [];
    let target: number | null = null;
    if (!s.current) notes.push("No calibration on file: no target pressure.");
    else if (jackingForceN !== null) {
      target = targetPressureMPa(
        { slope: s.current.slope, intercept: s.current.intercept, minPressureMPa: s.current.minPressureMPa, maxPressureMPa: s.current.maxPressureMPa },
        jackingForceN,
      );
      if (target > s.current.maxPressureMPa || target < s.current.minPressureMPa) notes.push("The target lies outside the range this set was calibrated over.");
    }
    if (s.state === "expired") notes.push("Calibration expired: a record on this set raises a flag.");
    if (s.state === "expiring") notes.push(`Calibration runs out on ${s.current?.validUntil}.`);
    if (s.maxForceN !== null && jackingForceN !== null && jackingForceN > s.maxForceN) notes.push("The jacking force is above this jack's rated force.");
    return { setId: s.id, name: s.name, state: s.state, validUntil: s.current?.validUntil ?? null, targetPressureMPa: target, notes };
  });

  return {
    project,
    tendon: {
      id: row.id,
      tag: row.tag,
      kind: row.kind,
      strandSize: row.strand_size,
      strandCount: row.strand_count,
      segments: row.segments,
      ends: row.ends,
      jackGripMm: row.jack_grip_mm,
      shopElongationMm: row.shop_elongation_mm,
      pour: { id: row.pour_id, name: row.pour_name },
      lot: row.lot_id && row.lot_number ? { id: row.lot_id, lotNumber: row.lot_number } : null,
    },
    computed,
    targets,
  };
}
