import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { FlagKind, Verdict } from "@/lib/schemas/domain";
import {
  evaluationWrites,
  planEvaluation,
  raiseTendonVersion,
  selectTendonState,
  stateFromRow,
  writeTogether,
} from "./evaluate-tendon";

/**
 * Judges again every stressed tendon a change touches (the project's basis, a strand lot, a
 * calibration, a tendon's schedule). Each gets a new evaluation carrying the reason; the newer
 * evaluation supersedes the older (evaluations are append-only, the latest is the verdict), new
 * findings raise flags by the rules, and open flags whose rule no longer finds anything are closed
 * with the reason. Flags already with the engineer stay with the engineer.
 */
export async function reevaluateTendons(
  db: Kysely<Database>,
  input: { projectId: string; tendonIds?: string[]; reason: string },
): Promise<{ reevaluated: number; changed: number; closedFlags: number }> {
  const tendonIds = input.tendonIds ?? (await stressedTendonIds(db, input.projectId));
  let changed = 0;
  let closedFlags = 0;
  for (const tendonId of tendonIds) {
    const before = await latestVerdict(db, input.projectId, tendonId);
    await raiseTendonVersion(db, { projectId: input.projectId, tendonId });
    const row = await selectTendonState(db, { projectId: input.projectId, tendonId }).executeTakeFirstOrThrow();
    const plan = planEvaluation(stateFromRow(row), { projectId: input.projectId, tendonId, reason: input.reason });
    await writeTogether(db, evaluationWrites(db, plan));
    const found: FlagKind[] = JSON.parse(String(plan.evaluation.result)).findings.map(
      (f: { kind: FlagKind }) => f.kind,
    );
    const closed = await db
      .updateTable("flags")
      .set({
        status: "closed",
        closed_at: new Date(),
        close_reason: `Re-evaluated (${input.reason}): evaluation ${plan.evaluation.id} no longer finds this.`,
      })
      .where("project_id", "=", input.projectId)
      .where("tendon_id", "=", tendonId)
      .where("status", "=", "open")
      .where("kind", "not in", [...found, "reading_missing"])
      .executeTakeFirst();
    closedFlags += Number(closed.numUpdatedRows);
    if (before && (before.verdict !== plan.outcome.verdict || before.deviation_pct !== plan.outcome.deviationPct))
      changed += 1;
  }
  return { reevaluated: tendonIds.length, changed, closedFlags };
}

async function stressedTendonIds(db: Kysely<Database>, projectId: string): Promise<string[]> {
  const rows = await db
    .selectFrom("records")
    .select("tendon_id")
    .distinct()
    .where("project_id", "=", projectId)
    .execute();
  return rows.map((r) => r.tendon_id);
}

async function latestVerdict(
  db: Kysely<Database>,
  projectId: string,
  tendonId: string,
): Promise<{ verdict: Verdict; deviation_pct: number | null } | undefined> {
  return db
    .selectFrom("evaluations")
    .select(["verdict", "deviation_pct"])
    .where("project_id", "=", projectId)
    .where("tendon_id", "=", tendonId)
    .orderBy("created_at", "desc")
    .limit(1)
    .executeTakeFirst();
}
