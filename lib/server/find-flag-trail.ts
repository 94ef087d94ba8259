import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { reference } from "@/lib/format/references";

/**
 * The flags of a tendon or of a pour with their whole trail: the inspector's findings and the
 * engineer's dispositions, oldest first, with the names behind them. Shared by the tendon's
 * review page and the pour's stressing report.
 */
export async function findFlagTrail(
  db: Kysely<Database>,
  input: { projectId: string } & ({ tendonId: string } | { pourId: string }),
) {
  const byTendon = "tendonId" in input;
  const scopeId = byTendon ? input.tendonId : input.pourId;
  const scopeColumn = byTendon ? ("flags.tendon_id" as const) : ("flags.pour_id" as const);

  const [flags, reviews, dispositions] = await Promise.all([
    db
      .selectFrom("flags")
      .innerJoin("tendons", "tendons.id", "flags.tendon_id")
      .leftJoin("users", "users.id", "flags.closed_by")
      .select([
        "flags.id",
        "tendons.tag",
        "flags.kind",
        "flags.reason",
        "flags.status",
        "flags.record_id",
        "flags.created_at",
        "flags.closed_at",
        "flags.close_reason",
        "users.name as closedByName",
        // Its number in the project, given at insert.
        "flags.number",
      ])
      .where("flags.project_id", "=", input.projectId)
      .where(scopeColumn, "=", scopeId)
      .orderBy("tendons.tag")
      .orderBy("flags.created_at")
      .execute(),
    db
      .selectFrom("reviews")
      .innerJoin("flags", "flags.id", "reviews.flag_id")
      .innerJoin("users", "users.id", "reviews.author_user_id")
      .select([
        "reviews.id",
        "reviews.flag_id",
        "reviews.kind",
        "reviews.body",
        "reviews.remeasured_mm",
        "reviews.attachment_id",
        "reviews.created_at",
        "users.name as author",
      ])
      .where("reviews.project_id", "=", input.projectId)
      .where(scopeColumn, "=", scopeId)
      .orderBy("reviews.created_at")
      .execute(),
    db
      .selectFrom("dispositions")
      .innerJoin("flags", "flags.id", "dispositions.flag_id")
      .select([
        "dispositions.id",
        "dispositions.flag_id",
        "dispositions.decision",
        "dispositions.reasons",
        "dispositions.engineer_name",
        "dispositions.licence_statement",
        "dispositions.created_at",
        "dispositions.number",
      ])
      .where("dispositions.project_id", "=", input.projectId)
      .where(scopeColumn, "=", scopeId)
      .orderBy("dispositions.created_at")
      .execute(),
  ]);
  return {
    flags: flags.map(({ number, ...f }) => ({ ...f, reference: reference("F", Number(number)) })),
    reviews,
    dispositions: dispositions.map(({ number, ...d }) => ({ ...d, reference: reference("D", Number(number)) })),
  };
}

export type FlagTrail = Awaited<ReturnType<typeof findFlagTrail>>;
