import "server-only";
import type { Db } from "@/db/connect";
import type { StrandLot } from "@/lib/schemas/strand-lot";
import type { Tendon } from "@/lib/schemas/tendon";
import { forceProfile, isInputError, type Check, type ForceProfile } from "@/lib/elongation";
import type { CalibrationState } from "@/lib/schemas/calibration";
import { predictTendon, targetPressureMPa, type TendonPrediction } from "@/lib/stressing/basis";
import { getProjectSettings, type ProjectSettingsView } from "./get-project-settings";
import { loadTendonBasis } from "./load-tendon-basis";
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
  /** The schedule's part of the one tendon DTO (`Tendon`), with its pour and lot. */
  tendon: Pick<
    Tendon,
    | "id"
    | "tag"
    | "kind"
    | "strandSize"
    | "strandCount"
    | "segments"
    | "ends"
    | "jackGripMm"
    | "shopElongationMm"
    | "member"
    | "jackingForceN"
  > & {
    pour: { id: string; name: string; released: boolean };
    lot: Pick<StrandLot, "id" | "lotNumber"> | null;
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

/** Everything the tendon screen shows, computed by the shared basis (never re-derived here). */
export async function getTendonDetail(
  db: Db,
  input: { projectId: string; tendonId: string; today?: string },
): Promise<TendonDetail> {
  const [loaded, project, sets] = await Promise.all([
    loadTendonBasis(db, input),
    getProjectSettings(db, input.projectId),
    listEquipmentSets(db, input.projectId, input.today),
  ]);
  const { project: basis, tendon, lot } = loaded;

  let computed: TendonDetail["computed"];
  try {
    const prediction = predictTendon({ project: basis, tendon, lot });
    const nominalPredictedMm = lot ? predictTendon({ project: basis, tendon, lot: null }).predictedMm : null;
    const profile = forceProfile(prediction.engineInput);
    const shopDifferencePct = tendon.shopElongationMm
      ? ((tendon.shopElongationMm - prediction.predictedMm) / prediction.predictedMm) * 100
      : null;
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
        {
          slope: s.current.slope,
          intercept: s.current.intercept,
          minPressureMPa: s.current.minPressureMPa,
          maxPressureMPa: s.current.maxPressureMPa,
        },
        jackingForceN,
      );
      if (target > s.current.maxPressureMPa || target < s.current.minPressureMPa)
        notes.push("The target lies outside the range this set was calibrated over.");
    }
    if (s.state === "expired") notes.push("Calibration expired: a record on this set raises a flag.");
    if (s.state === "expiring") notes.push(`Calibration runs out on ${s.current?.validUntil}.`);
    if (s.maxForceN !== null && jackingForceN !== null && jackingForceN > s.maxForceN)
      notes.push("The jacking force is above this jack's rated force.");
    return {
      setId: s.id,
      name: s.name,
      state: s.state,
      validUntil: s.current?.validUntil ?? null,
      targetPressureMPa: target,
      notes,
    };
  });

  return {
    project,
    tendon: {
      id: tendon.id,
      tag: tendon.tag,
      kind: tendon.kind,
      strandSize: tendon.strandSize,
      strandCount: tendon.strandCount,
      segments: tendon.segments,
      ends: tendon.ends,
      jackGripMm: tendon.jackGripMm,
      shopElongationMm: tendon.shopElongationMm,
      member: tendon.member ?? null,
      jackingForceN: tendon.jackingForceN ?? null,
      pour: { id: loaded.pour.id, name: loaded.pour.name, released: loaded.pour.status === "released" },
      lot: lot ? { id: lot.id, lotNumber: lot.lotNumber } : null,
    },
    computed,
    targets,
  };
}
