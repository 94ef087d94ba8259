import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { qualified } from "@/lib/schemas/columns";
import { DISPOSITION_COLUMNS, dispositionFromRow } from "@/lib/schemas/disposition";
import { FLAG_COLUMNS, flagFromRow, type Flag } from "@/lib/schemas/flag";

/** A flag as its trail shows it: the DTO with the tendon's tag and the name of whoever closed it. */
export interface FlagInTrail extends Flag {
  tendonTag: string;
  closedByName: string | null;
}

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
      .select([...qualified("flags", FLAG_COLUMNS), "tendons.tag", "users.name as closed_by_name"])
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
      .select(qualified("dispositions", DISPOSITION_COLUMNS))
      .where("dispositions.project_id", "=", input.projectId)
      .where(scopeColumn, "=", scopeId)
      .orderBy("dispositions.created_at")
      .execute(),
  ]);
  return {
    flags: flags.map((f): FlagInTrail => ({ ...flagFromRow(f), tendonTag: f.tag, closedByName: f.closed_by_name })),
    reviews,
    dispositions: dispositions.map(dispositionFromRow),
  };
}

export type FlagTrail = Awaited<ReturnType<typeof findFlagTrail>>;
