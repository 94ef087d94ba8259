import "server-only";
import type { Kysely } from "kysely";
import type { MomentOld } from "@/db/moment-old";
import type { Database } from "@/db/types";
import type { Verdict } from "@/lib/schemas/domain";
import {
  apparentModuli,
  equipmentDrift,
  resolutionShare,
  type ApparentModulus,
  type ResolutionShare,
  type SetDrift,
} from "@/lib/insights";
import { AppError } from "@/lib/errors";
import { readingResolution, type StoredResolution } from "@/lib/format/quantities";
import { deviationSamples, type JudgedTendon } from "@/lib/stressing/gauge-check";
import { resolutionStepMm } from "@/lib/units";
import { listTendonResults, type TendonResult } from "./list-tendon-results";

/**
 * What the pour's insight page shows: each evaluated tendon's deviation against the band, the
 * pour's progress, the mean deviation per equipment set on the pour and across the project with
 * drift marks, the apparent modulus where gauge steps were read, and the share of verdicts the
 * reading division alone could change. SI values; the page formats them.
 */

export interface InsightPoint {
  tag: string;
  deviationPct: number;
  verdict: Exclude<Verdict, "incomplete">;
  provisional: boolean;
  measuredMm: number;
  predictedMm: number;
}

export interface PourInsight {
  project: {
    code: string;
    name: string;
    unitSystem: "us" | "si";
    readingResolution: StoredResolution;
    tolerancePct: number;
  };
  pour: { id: string; name: string; status: string };
  progress: { tendons: number; stressed: number; provisional: number; flagged: number; released: number };
  points: InsightPoint[];
  driftOnPour: SetDrift[];
  driftOnProject: SetDrift[];
  /** Tendons whose ends were stressed by different sets, left out of the per-set means. */
  mixedSets: number;
  moduli: ApparentModulus[];
  resolution: ResolutionShare;
}

/** A tendon's latest evaluation with the set of each end it used, for the drift rule. */
export function judgedTendon(t: TendonResult): JudgedTendon {
  const e = t.evaluation;
  return {
    verdict: e?.verdict ?? "incomplete",
    provisional: e?.provisional ?? true,
    deviationPct: e?.deviationPct ?? null,
    sets: t.endResults.map((r) => ({ id: r.equipmentSetId, name: r.equipmentSetName })),
  };
}

/**
 * A moment-old read (the replica when there is one): the page is a look back over the records, and
 * a record that reached the primary a moment ago shows on the next load. The signatures, concrete
 * results and anything the page lets someone act on are read from the primary by the page itself.
 */
export async function getPourInsight(
  reads: MomentOld,
  input: { projectId: string; pourId: string },
): Promise<PourInsight> {
  return reads.read((db) => readPourInsight(db, input));
}

async function readPourInsight(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<PourInsight> {
  const [project, pour] = await Promise.all([
    db
      .selectFrom("projects")
      .select(["code", "name", "unit_system", "reading_resolution", "tolerance_pct", "short_tendon_floor_mm"])
      .where("id", "=", input.projectId)
      .executeTakeFirst(),
    db
      .selectFrom("pours")
      .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
      .select(["pours.id", "pours.name", "pour_states.status", "pour_states.release_id as releaseId"])
      .where("pours.project_id", "=", input.projectId)
      .where("pours.id", "=", input.pourId)
      .executeTakeFirst(),
  ]);
  if (!project || !pour) throw new AppError("NOT_FOUND", "No such pour on this project.");

  const [all, openFlags] = await Promise.all([
    listTendonResults(db, { projectId: input.projectId }),
    db
      .selectFrom("flags")
      .select("tendon_id")
      .distinct()
      .where("project_id", "=", input.projectId)
      .where("pour_id", "=", input.pourId)
      .where("status", "!=", "closed")
      .execute(),
  ]);
  const onPour = all.filter((t) => t.pourId === input.pourId);
  const evaluated = onPour.filter(
    (t) => t.evaluation && t.evaluation.verdict !== "incomplete" && t.evaluation.deviationPct !== null,
  );
  const complete = evaluated.filter((t) => !t.evaluation!.provisional);

  const points: InsightPoint[] = evaluated.map((t) => ({
    tag: t.tag,
    deviationPct: t.evaluation!.deviationPct!,
    verdict: t.evaluation!.verdict as InsightPoint["verdict"],
    provisional: t.evaluation!.provisional,
    measuredMm: t.evaluation!.measuredMm ?? 0,
    predictedMm: t.evaluation!.predictedMm ?? 0,
  }));

  const pourSamples = deviationSamples(onPour.map(judgedTendon));
  const projectSamples = deviationSamples(all.map(judgedTendon));

  const moduli = apparentModuli(
    onPour
      .flatMap((t) =>
        t.endResults.map((r) => ({
          tag: t.tag,
          end: r.end,
          steps: r.gaugeSteps,
          calibration: r.calibration,
          // Each end's steps stretch only that end's friction path.
          lengthMm: t.pathMm[r.end] ?? t.lengthMm,
          strandAreaMm2: t.strand?.areaMm2 ?? 0,
          strandCount: t.strandCount,
          millModulusMPa: t.strand?.modulusMPa ?? null,
        })),
      )
      .filter((r) => r.strandAreaMm2 > 0),
  );

  const divisionMm = resolutionStepMm(readingResolution(project.reading_resolution as StoredResolution));
  const resolution = resolutionShare(
    complete
      .filter((t) => (t.evaluation!.predictedMm ?? 0) > 0 && t.evaluation!.measuredMm !== null)
      .map((t) => {
        const ratios = t.endResults.map((r) => (r.measuredMm > 0 ? r.totalMm / r.measuredMm : 1));
        return {
          tag: t.tag,
          measuredMm: t.evaluation!.measuredMm!,
          predictedMm: t.evaluation!.predictedMm!,
          tolerancePct: project.tolerance_pct,
          floorMm: project.short_tendon_floor_mm ?? undefined,
          divisionMm,
          endsRead: Math.max(1, t.endResults.length),
          scale: ratios.length ? ratios.reduce((a, b) => a + b, 0) / ratios.length : 1,
        };
      }),
  );

  return {
    project: {
      code: project.code,
      name: project.name,
      unitSystem: project.unit_system,
      readingResolution: project.reading_resolution as StoredResolution,
      tolerancePct: project.tolerance_pct,
    },
    pour: { id: pour.id, name: pour.name, status: pour.status },
    progress: {
      tendons: onPour.length,
      stressed: complete.length,
      provisional: evaluated.length - complete.length,
      flagged: openFlags.length,
      released: pour.releaseId ? onPour.length : 0,
    },
    points,
    driftOnPour: equipmentDrift(pourSamples.samples),
    driftOnProject: equipmentDrift(projectSamples.samples),
    mixedSets: pourSamples.mixed,
    moduli,
    resolution,
  };
}
