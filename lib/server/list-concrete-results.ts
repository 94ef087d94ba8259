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

/** A crew's reason to stress before the strength was confirmed, as kept on its record. */
export interface ConcreteGoAhead {
  tag: string;
  end: "A" | "B";
  reason: string;
  by: string;
  /** ISO instant the end was stressed. */
  at: string;
}

export interface ConcreteGateView {
  results: ConcreteResultRow[];
  requiredMPa: number | null;
  confirmed: ConfirmedStrength;
  met: boolean;
  /** The pour's standing release (who and when, ISO instant), null while it is not released. */
  release: { by: string; at: string } | null;
  /** The reasons the crew gave to stress ahead of the confirmation, current records only, in time order. */
  goAheads: ConcreteGoAhead[];
}

/**
 * A project's concrete results with who entered each and the lab sheet attached, and the columns
 * every report shows; a report adds its filter (a pour, a day), its own columns and its order.
 */
export function selectConcreteResults(db: Kysely<Database>, projectId: string) {
  return db
    .selectFrom("concrete_results as c")
    .innerJoin("users", "users.id", "c.entered_by")
    .leftJoin("attachments", (j) =>
      j.onRef("attachments.id", "=", "c.attachment_id").onRef("attachments.project_id", "=", "c.project_id"),
    )
    .select([
      "c.specimen",
      "c.strength_mpa",
      "c.age_days",
      "c.specimen_count",
      "c.entered_at",
      "attachments.original_name",
      "attachments.id as attachment_id",
    ])
    .where("c.project_id", "=", projectId);
}

/** The pour's results as entered (newest first, with who entered each) and the gate they give. */
export async function listConcreteResults(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<ConcreteGateView> {
  const [pour, rows, goAheads] = await Promise.all([
    db
      .selectFrom("pours")
      .innerJoin("projects", "projects.id", "pours.project_id")
      .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
      .select([
        "pours.id",
        "projects.required_concrete_mpa",
        "pour_states.status",
        "pour_states.released_by_name",
        "pour_states.released_at",
      ])
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
    // Each record's latest revision only: a corrected record carries its reason forward.
    db
      .selectFrom("records")
      .innerJoin("tendons", "tendons.id", "records.tendon_id")
      .innerJoin("users", "users.id", "records.author_user_id")
      .select(["tendons.tag", "records.tendon_end", "records.concrete_go_ahead", "records.device_time", "users.name"])
      .where("records.project_id", "=", input.projectId)
      .where("records.pour_id", "=", input.pourId)
      .where("records.concrete_go_ahead", "is not", null)
      .where(({ not, exists, selectFrom }) =>
        not(
          exists(
            selectFrom("records as later")
              .select("later.id")
              .whereRef("later.chain_id", "=", "records.chain_id")
              .where("later.project_id", "=", input.projectId)
              .whereRef("later.revision", ">", "records.revision"),
          ),
        ),
      )
      .orderBy("records.device_time")
      .orderBy("tendons.tag")
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
  return {
    results,
    requiredMPa,
    confirmed,
    met: concreteGateMet(confirmed.strengthMPa, requiredMPa),
    release:
      pour.status === "released" && pour.released_by_name && pour.released_at
        ? { by: pour.released_by_name, at: new Date(pour.released_at).toISOString() }
        : null,
    goAheads: goAheads.map((r) => ({
      tag: r.tag,
      end: r.tendon_end,
      reason: r.concrete_go_ahead ?? "",
      by: r.name,
      at: new Date(r.device_time).toISOString(),
    })),
  };
}
