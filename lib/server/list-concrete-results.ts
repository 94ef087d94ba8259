import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import { concreteGateMet, confirmedStrength, type ConfirmedStrength } from "@/lib/stressing/concrete-strength";

export interface ConcreteResultRow {
  id: string;
  specimen: "cylinder" | "cube";
  strengthMPa: number;
  ageDays: number;
  specimenCount: number;
  attachmentId: string | null;
  /** ISO instant. */
  enteredAt: string;
  enteredBy: string;
}

export interface ConcreteGateView {
  results: ConcreteResultRow[];
  requiredMPa: number | null;
  confirmed: ConfirmedStrength;
  met: boolean;
}

/** The pour's results as entered (newest first, with who entered each) and the gate they give. */
export async function listConcreteResults(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<ConcreteGateView> {
  const [pour, rows] = await Promise.all([
    db
      .selectFrom("pours")
      .innerJoin("projects", "projects.id", "pours.project_id")
      .select(["pours.id", "projects.required_concrete_mpa"])
      .where("pours.project_id", "=", input.projectId)
      .where("pours.id", "=", input.pourId)
      .executeTakeFirst(),
    db
      .selectFrom("concrete_results")
      .innerJoin("users", "users.id", "concrete_results.entered_by")
      .select([
        "concrete_results.id",
        "concrete_results.specimen",
        "concrete_results.strength_mpa",
        "concrete_results.age_days",
        "concrete_results.specimen_count",
        "concrete_results.attachment_id",
        "concrete_results.entered_at",
        "users.name",
      ])
      .where("concrete_results.project_id", "=", input.projectId)
      .where("concrete_results.pour_id", "=", input.pourId)
      .orderBy("concrete_results.entered_at", "desc")
      .execute(),
  ]);
  if (!pour) throw new AppError("NOT_FOUND", "No such pour on this project.");
  const results: ConcreteResultRow[] = rows.map((r) => ({
    id: r.id,
    specimen: r.specimen,
    strengthMPa: r.strength_mpa,
    ageDays: r.age_days,
    specimenCount: r.specimen_count,
    attachmentId: r.attachment_id,
    enteredAt: new Date(r.entered_at).toISOString(),
    enteredBy: r.name,
  }));
  const confirmed = confirmedStrength(
    results.map((r) => ({ strengthMPa: r.strengthMPa, ageDays: r.ageDays, specimenCount: r.specimenCount })),
  );
  const requiredMPa = pour.required_concrete_mpa;
  return { results, requiredMPa, confirmed, met: concreteGateMet(confirmed.strengthMPa, requiredMPa) };
}
