import "server-only";
import { sql, type Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { Verdict } from "@/lib/schemas/domain";
import { pick, qualified } from "@/lib/schemas/columns";
import { FLAG_COLUMNS, flagFromRow, type Flag } from "@/lib/schemas/flag";
import type { FlagFilter } from "@/lib/schemas/review";
import { recordIsSkewed } from "./find-clock-skews";

/** The part of each flag the queue shows. */
const QUEUED_FLAG_KEYS = [
  "id",
  "reference",
  "kind",
  "reason",
  "status",
  "createdAt",
] as const satisfies readonly (keyof Flag)[];

export interface FlaggedTendon {
  projectId: string;
  projectName: string;
  pourId: string;
  pourName: string;
  tendonId: string;
  tag: string;
  oldest: Date;
  /** Each flag with its project reference ("F-0012"). */
  flags: Pick<Flag, (typeof QUEUED_FLAG_KEYS)[number]>[];
  /** The tendon's latest evaluation (as it stands now), not the one that raised a flag. */
  verdict: Verdict | null;
  deviationPct: number | null;
  provisional: boolean;
  /** Records the tablet sent for the tendon whose device time is off the server's receipt (see find-clock-skews.ts). */
  clockSkewRecords: number;
}

/** Open flags on the given projects, grouped per tendon, oldest first, each tendon with its latest verdict. */
export async function findFlags(
  db: Kysely<Database>,
  input: { projectIds: string[]; filter: FlagFilter },
): Promise<FlaggedTendon[]> {
  if (!input.projectIds.length) return [];
  const { filter } = input;
  let query = db
    .selectFrom("flags")
    .innerJoin("projects", "projects.id", "flags.project_id")
    .innerJoin("pours", "pours.id", "flags.pour_id")
    .innerJoin("tendons", "tendons.id", "flags.tendon_id")
    .leftJoinLateral(
      (eb) =>
        eb
          .selectFrom("evaluations")
          .select(["evaluations.verdict", "evaluations.deviation_pct", "evaluations.provisional"])
          .whereRef("evaluations.tendon_id", "=", "flags.tendon_id")
          .whereRef("evaluations.project_id", "=", "flags.project_id")
          .orderBy("evaluations.created_at", "desc")
          .limit(1)
          .as("latest"),
      (join) => join.onTrue(),
    )
    .select([
      ...qualified("flags", FLAG_COLUMNS),
      "projects.name as projectName",
      "pours.name as pourName",
      "tendons.tag",
      "latest.verdict",
      "latest.deviation_pct",
      "latest.provisional",
      (eb) =>
        eb
          .selectFrom("records")
          .select(sql<number>`count(*)::int`.as("n"))
          .whereRef("records.tendon_id", "=", "flags.tendon_id")
          .whereRef("records.project_id", "=", "flags.project_id")
          .where("records.revision", "=", 1)
          .where(recordIsSkewed)
          .as("clockSkewRecords"),
    ])
    .where("flags.project_id", "in", input.projectIds)
    .orderBy("flags.created_at");
  query =
    filter.status === "any_open"
      ? query.where("flags.status", "!=", "closed")
      : query.where("flags.status", "=", filter.status);
  if (filter.projectId) query = query.where("flags.project_id", "=", filter.projectId);
  if (filter.pourId) query = query.where("flags.pour_id", "=", filter.pourId);
  if (filter.kind) query = query.where("flags.kind", "=", filter.kind);
  if (filter.olderThanHours !== undefined) {
    query = query.where("flags.created_at", "<=", new Date(Date.now() - filter.olderThanHours * 3600_000));
  }
  const rows = await query.execute();

  const byTendon = new Map<string, FlaggedTendon>();
  for (const r of rows) {
    let group = byTendon.get(r.tendon_id);
    if (!group) {
      group = {
        projectId: r.project_id,
        projectName: r.projectName,
        pourId: r.pour_id,
        pourName: r.pourName,
        tendonId: r.tendon_id,
        tag: r.tag,
        oldest: r.created_at,
        flags: [],
        verdict: r.verdict ?? null,
        deviationPct: r.deviation_pct ?? null,
        provisional: r.provisional ?? false,
        clockSkewRecords: Number(r.clockSkewRecords ?? 0),
      };
      byTendon.set(r.tendon_id, group);
    }
    group.flags.push(pick(flagFromRow(r), QUEUED_FLAG_KEYS));
  }
  return [...byTendon.values()];
}
