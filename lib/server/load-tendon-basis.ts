import "server-only";
import { sql, type Kysely, type QueryCreator } from "kysely";
import type { Database } from "@/db/types";
import type { StrandLot } from "@/lib/schemas/strand-lot";
import { pick, qualified } from "@/lib/schemas/columns";
import { TENDON_COLUMNS, tendonFromRow, type Tendon } from "@/lib/schemas/tendon";
import { AppError } from "@/lib/errors";
import { projectBasisFromRow, type LotBasis, type ProjectBasis, type TendonBasis } from "@/lib/stressing/basis";
import type { DisplayUnits, StoredResolution } from "@/lib/format/quantities";

export interface LoadedTendon {
  project: ProjectBasis &
    DisplayUnits & {
      id: string;
      name: string;
      requiredConcreteMPa: number | null;
      engineerOfRecordName: string | null;
      engineerOfRecordEmail: string | null;
      notifyEmails: string[];
      /** Members of the project who take flag e-mails as a digest per shift. */
      digestEmails?: string[];
    };
  pour: {
    id: string;
    name: string;
    concreteStrengthMPa: number | null;
    /** The pour's state (planned, stressing, stressed, released): read by `loadTendonBasis` only. */
    status?: string;
  };
  /** The part of the one tendon DTO (`Tendon`) the computation and the screens read. */
  tendon: TendonBasis & Pick<Tendon, "id" | "tag" | "kind" | "shopElongationMm"> & Partial<Pick<Tendon, "member">>;
  lot: (LotBasis & Pick<StrandLot, "id" | "lotNumber">) | null;
}

/**
 * The select that reads one tendon's basis, with the project in every WHERE; others add their
 * own columns to it (the evaluation reads the tendon's records and flags in the same query). It
 * leaves out the pour's state (`pour_states`), which the evaluation does not use and which looks
 * at every tendon and record of the pour: the sync push runs this read once per record.
 */
export function selectTendonBasis(qc: QueryCreator<Database>, input: { projectId: string; tendonId: string }) {
  return qc
    .selectFrom("tendons")
    .innerJoin("projects", "projects.id", "tendons.project_id")
    .innerJoin("pours", (j) =>
      j.onRef("pours.id", "=", "tendons.pour_id").onRef("pours.project_id", "=", "tendons.project_id"),
    )
    .leftJoin("strand_lots", (j) =>
      j
        .onRef("strand_lots.id", "=", "tendons.strand_lot_id")
        .onRef("strand_lots.project_id", "=", "tendons.project_id"),
    )
    .select([
      "projects.id as projectId",
      "projects.name as projectName",
      "projects.unit_system",
      "projects.reading_resolution",
      "projects.tolerance_pct",
      "projects.short_tendon_floor_mm",
      "projects.comparison_basis",
      "projects.count_jack_grip",
      "projects.friction_mu",
      "projects.wobble_per_m",
      "projects.anchor_set_mm",
      "projects.time_zone",
      "projects.jacking_force_factor",
      "projects.under_force_pct",
      "projects.seating_excess_mm",
      "projects.governing_value",
      "projects.group_tolerance_pct",
      "projects.wire_loss_limit_pct",
      "projects.required_concrete_mpa",
      "projects.engineer_of_record_name",
      "projects.engineer_of_record_email",
      "projects.notify_emails",
      "pours.id as pourId",
      "pours.name as pourName",
      "pours.concrete_strength_mpa",
      ...qualified("tendons", TENDON_COLUMNS),
      "strand_lots.id as lotId",
      "strand_lots.lot_number",
      "strand_lots.area_mm2",
      "strand_lots.modulus_mpa",
      "strand_lots.breaking_load_n",
      (eb) =>
        eb
          .selectFrom("project_members")
          .innerJoin("users", "users.id", "project_members.user_id")
          .select(sql<string[]>`coalesce(array_agg(users.email order by users.email), '{}')`.as("emails"))
          .whereRef("project_members.project_id", "=", "projects.id")
          .where("project_members.flag_mail", "=", "digest")
          .where("users.is_active", "=", true)
          .as("digestEmails"),
    ])
    .where("tendons.project_id", "=", input.projectId)
    .where("tendons.id", "=", input.tendonId);
}

type BasisRow = Awaited<ReturnType<ReturnType<typeof selectTendonBasis>["executeTakeFirstOrThrow"]>>;

/** Everything the computation needs about one tendon, read with the project in every WHERE. */
export async function loadTendonBasis(
  db: Kysely<Database>,
  input: { projectId: string; tendonId: string },
): Promise<LoadedTendon> {
  const row = await selectTendonBasis(db, input)
    .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
    .select("pour_states.status as pourStatus")
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such tendon on this project.");
  return toLoadedTendon(row);
}

/** The part of the tendon DTO the computation reads, in this order: it is stored with each evaluation's inputs. */
const BASIS_TENDON_KEYS = [
  "id",
  "tag",
  "kind",
  "strandSize",
  "strandCount",
  "segments",
  "ends",
  "jackGripMm",
  "shopElongationMm",
  "member",
  "jackingForceN",
] as const satisfies readonly (keyof Tendon)[];

/** The basis columns of a row read with `selectTendonBasis`, shaped for the computation. */
export function toLoadedTendon(row: BasisRow & { pourStatus?: string }): LoadedTendon {
  return {
    project: {
      id: row.projectId,
      name: row.projectName,
      unitSystem: row.unit_system,
      readingResolution: row.reading_resolution as StoredResolution,
      ...projectBasisFromRow(row),
      requiredConcreteMPa: row.required_concrete_mpa,
      engineerOfRecordName: row.engineer_of_record_name,
      engineerOfRecordEmail: row.engineer_of_record_email,
      notifyEmails: row.notify_emails,
      digestEmails: row.digestEmails ?? [],
    },
    pour: {
      id: row.pourId,
      name: row.pourName,
      concreteStrengthMPa: row.concrete_strength_mpa,
      ...(row.pourStatus !== undefined && { status: row.pourStatus }),
    },
    tendon: pick(tendonFromRow(row), BASIS_TENDON_KEYS),
    lot:
      row.lotId && row.lot_number && row.area_mm2 && row.modulus_mpa && row.breaking_load_n
        ? {
            id: row.lotId,
            lotNumber: row.lot_number,
            areaMm2: row.area_mm2,
            modulusMPa: row.modulus_mpa,
            breakingLoadN: row.breaking_load_n,
          }
        : null,
  };
}
