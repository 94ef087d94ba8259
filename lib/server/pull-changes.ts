import "server-only";
import { PREDICTION_BASIS_COLUMNS, projectBasisFromRow } from "@/lib/stressing/basis";
import { sql, type Kysely, type Transaction } from "kysely";
import { jsonArrayFrom } from "kysely/helpers/postgres";
import type { Database } from "@/db/types";
import type { SessionUser } from "@/lib/auth/session";
import type { PullResponse } from "@/lib/schemas/sync";
import { CALIBRATION_COLUMNS, calibrationFromRow } from "@/lib/schemas/calibration";
import { EQUIPMENT_SET_COLUMNS, equipmentSetFromRow } from "@/lib/schemas/equipment";
import { STRAND_LOT_COLUMNS, strandLotFromRow } from "@/lib/schemas/strand-lot";
import { TENDON_COLUMNS, tendonFromRow } from "@/lib/schemas/tendon";
import { qualified } from "@/lib/schemas/columns";
import { POUR_COLUMNS, pourFromRow } from "@/lib/schemas/pour";
import { DETENSION_COLUMNS, detensionFromRow } from "@/lib/schemas/detension";
import { LIFTOFF_CHECK_COLUMNS, liftoffCheckFromRow } from "@/lib/schemas/liftoff";
import { RECORD_COLUMNS, recordFromRow } from "@/lib/schemas/record";
import { FLAG_COLUMNS, flagFromRow } from "@/lib/schemas/flag";
import { DISPOSITION_COLUMNS, dispositionFromRow } from "@/lib/schemas/disposition";
import { emptyPull, fieldFlagFrom, fieldRecordFrom } from "@/lib/schemas/sync-response";
import { recordingProjectIds } from "./require-recorder";

/**
 * Reference data and record states of some pours changed since a cursor. The cursor is the
 * xmin of the read's snapshot (xid8): every transaction below it had finished when we read, so
 * everything it wrote is in this answer or an earlier one; anything written by a transaction at
 * or above it is sent (again) next time. Commit order never makes a row slip past the cursor,
 * and sending a row twice is harmless because the tablet stores by id.
 */

type Trx = Transaction<Database>;

const since = (column: string, cursor: string) => sql<boolean>`${sql.ref(column)} >= ${cursor}::xid8`;

/** The rows of a table, kept by project and pour, that changed since the cursor. */
const changedIn = (table: string, scope: { projectIds: string[]; pourIds: string[]; cursor: string }) =>
  sql<boolean>`${sql.ref(`${table}.project_id`)} in (${sql.join(scope.projectIds)}) and ${sql.ref(
    `${table}.pour_id`,
  )} in (${sql.join(scope.pourIds)}) and ${since(`${table}.change_xid`, scope.cursor)}`;

export async function pullChanges(
  db: Kysely<Database>,
  input: { user: Pick<SessionUser, "memberships">; cursor: string; pourIds: string[] },
): Promise<PullResponse> {
  const allowed = recordingProjectIds(input.user);
  return db
    .transaction()
    .setIsolationLevel("repeatable read")
    .execute(async (trx: Trx) => {
      // First statement: fixes the snapshot the rest of the transaction reads.
      const { rows } = await sql<{
        xmin: string;
        now: Date;
      }>`select pg_snapshot_xmin(pg_current_snapshot())::text as xmin, now() as now`.execute(trx);
      const { xmin, now } = rows[0]!;
      const cursor = input.cursor;
      const empty = () => emptyPull(xmin, new Date(now).toISOString(), input.pourIds);
      if (!allowed.length) return empty();

      const found = await trx
        .selectFrom("pours")
        .select(["id", "project_id"])
        .where("id", "in", input.pourIds)
        .where("project_id", "in", allowed)
        .execute();
      const pourIds = found.map((p) => p.id);
      const unavailable = input.pourIds.filter((id) => !pourIds.includes(id));
      if (!pourIds.length) return { ...empty(), unavailable };
      const projectIds = [...new Set(found.map((p) => p.project_id))];
      const scope = { projectIds, pourIds, cursor };

      // Lift-off checks with the server's result (lib/server/record-liftoff-check.ts).
      const liftoffChecksRead = trx
        .selectFrom("liftoff_checks")
        .innerJoin("users", "users.id", "liftoff_checks.checked_by")
        .select([...qualified("liftoff_checks", LIFTOFF_CHECK_COLUMNS), "users.name as checked_by_name"])
        .where(changedIn("liftoff_checks", scope))
        .execute();
      // Detensions as the crew reported them (lib/server/record-detension.ts).
      const detensionsRead = trx
        .selectFrom("detensions")
        .innerJoin("users", "users.id", "detensions.recorded_by")
        .select([...qualified("detensions", DETENSION_COLUMNS), "users.name as recorded_by_name"])
        .where(changedIn("detensions", scope))
        .execute();
      // Awaited after the others; a failure then still reaches the caller, never as an unhandled rejection.
      liftoffChecksRead.catch(() => undefined);
      detensionsRead.catch(() => undefined);
      const [projects, pours, tendons, lots, sets, calibrations, records, evaluations, flags, tailCuts, removed] =
        await Promise.all([
          trx
            .selectFrom("projects")
            .select([
              "id",
              "code",
              "name",
              "unit_system",
              "reading_resolution",
              ...PREDICTION_BASIS_COLUMNS,
              "blind_entry",
              "time_zone",
              "jacking_force_factor",
              "under_force_pct",
              "seating_excess_mm",
              "required_concrete_mpa",
              "governing_value",
            ])
            .where("id", "in", projectIds)
            .where(since("change_xid", cursor))
            .execute(),
          trx
            .selectFrom("pours")
            .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
            .select([
              ...qualified("pours", POUR_COLUMNS),
              "pour_states.status",
              "pour_states.released_by_name",
              "pour_states.released_at",
              "pour_states.release_statement",
              "pour_states.last_reopened_by_name",
              "pour_states.last_reopened_at",
              "pour_states.last_reopen_reason",
            ])
            .where("pours.id", "in", pourIds)
            // The status follows the records too: a pour whose records changed is sent again.
            .where((eb) =>
              eb.or([
                since("pours.change_xid", cursor),
                eb.exists(
                  eb
                    .selectFrom("records")
                    .select("records.id")
                    .whereRef("records.pour_id", "=", "pours.id")
                    .where(since("records.change_xid", cursor)),
                ),
              ]),
            )
            .execute(),
          trx.selectFrom("tendons").select(TENDON_COLUMNS).where(changedIn("tendons", scope)).orderBy("tag").execute(),
          trx
            .selectFrom("strand_lots")
            .select(STRAND_LOT_COLUMNS)
            .where("project_id", "in", projectIds)
            .where(since("change_xid", cursor))
            .execute(),
          trx
            .selectFrom("equipment_sets")
            .select(EQUIPMENT_SET_COLUMNS)
            .where("project_id", "in", projectIds)
            .where(since("change_xid", cursor))
            .orderBy("name")
            .execute(),
          trx
            .selectFrom("calibrations")
            .select(CALIBRATION_COLUMNS)
            .where("project_id", "in", projectIds)
            .where(since("change_xid", cursor))
            .execute(),
          trx
            .selectFrom("records")
            .innerJoin("users", "users.id", "records.author_user_id")
            .select([...qualified("records", RECORD_COLUMNS), "users.name as author_name"])
            .where(changedIn("records", scope))
            .execute(),
          trx
            .selectFrom("evaluations")
            .innerJoin("tendons", (j) =>
              j
                .onRef("tendons.id", "=", "evaluations.tendon_id")
                .onRef("tendons.project_id", "=", "evaluations.project_id"),
            )
            .select([
              "evaluations.id",
              "evaluations.tendon_id",
              "evaluations.verdict",
              "evaluations.provisional",
              "evaluations.deviation_pct",
              "evaluations.created_at",
              "evaluations.record_ids",
            ])
            .where("evaluations.project_id", "in", projectIds)
            .where("tendons.pour_id", "in", pourIds)
            .where(since("evaluations.change_xid", cursor))
            .execute(),
          trx
            .selectFrom("flags")
            .select((eb) => [
              ...qualified("flags", FLAG_COLUMNS),
              // The engineer's decisions on the flag; each one updates the flag, so it is sent again.
              jsonArrayFrom(
                eb
                  .selectFrom("dispositions")
                  .select(qualified("dispositions", DISPOSITION_COLUMNS))
                  .whereRef("dispositions.flag_id", "=", "flags.id")
                  .orderBy("dispositions.created_at"),
              ).as("dispositions"),
            ])
            .where(changedIn("flags", scope))
            .execute(),
          trx
            .selectFrom("tail_cuts")
            .innerJoin("users", "users.id", "tail_cuts.cut_by")
            .select([
              "tail_cuts.id",
              "tail_cuts.project_id",
              "tail_cuts.pour_id",
              "tail_cuts.tendon_id",
              "tail_cuts.cut_at",
              "tail_cuts.held_reasons",
              "users.name as cut_by_name",
            ])
            .where(changedIn("tail_cuts", scope))
            .execute(),
          cursor === "0"
            ? Promise.resolve([])
            : trx
                .selectFrom("sync_tombstones")
                .select(["table_name", "row_id"])
                .where("project_id", "in", projectIds)
                .where((eb) => eb.or([eb("pour_id", "in", pourIds), eb("pour_id", "is", null)]))
                .where(since("change_xid", cursor))
                .execute(),
        ]);
      const liftoffChecks = await liftoffChecksRead;
      const detensions = await detensionsRead;

      return {
        cursor: xmin,
        serverTime: new Date(now).toISOString(),
        projects: projects.map((p) => ({
          id: p.id,
          code: p.code,
          name: p.name,
          unitSystem: p.unit_system,
          readingResolution: p.reading_resolution,
          ...projectBasisFromRow(p),
          blindEntry: p.blind_entry,
          timeZone: p.time_zone,
          jackingForceFactor: p.jacking_force_factor,
          underForcePct: p.under_force_pct,
          seatingExcessMm: p.seating_excess_mm,
          requiredConcreteMPa: p.required_concrete_mpa,
        })),
        pours: pours.map((p) => ({
          ...pourFromRow(p),
          release:
            p.released_by_name && p.released_at
              ? {
                  by: p.released_by_name,
                  at: new Date(p.released_at).toISOString(),
                  statement: p.release_statement ?? "",
                }
              : null,
          reopened:
            p.last_reopened_by_name && p.last_reopened_at
              ? {
                  by: p.last_reopened_by_name,
                  at: new Date(p.last_reopened_at).toISOString(),
                  reason: p.last_reopen_reason ?? "",
                }
              : null,
        })),
        tendons: tendons.map(tendonFromRow),
        strandLots: lots.map(strandLotFromRow),
        equipmentSets: sets.map(equipmentSetFromRow),
        calibrations: calibrations.map(calibrationFromRow),
        records: records.map((r) => fieldRecordFrom(recordFromRow(r))),
        evaluations: evaluations.map((e) => ({
          id: e.id,
          tendonId: e.tendon_id,
          verdict: e.verdict,
          provisional: e.provisional,
          deviationPct: e.deviation_pct,
          createdAt: new Date(e.created_at).toISOString(),
          recordIds: e.record_ids,
        })),
        flags: flags.map((f) => fieldFlagFrom(flagFromRow(f), f.dispositions.map(dispositionFromRow))),
        tailCuts: tailCuts.map((c) => ({
          id: c.id,
          projectId: c.project_id,
          pourId: c.pour_id,
          tendonId: c.tendon_id,
          cutAt: new Date(c.cut_at).toISOString(),
          cutByName: c.cut_by_name,
          heldReasons: c.held_reasons,
        })),
        liftoffChecks: liftoffChecks.map(liftoffCheckFromRow),
        detensions: detensions.map(detensionFromRow),
        removed: removed.map((r) => ({ table: r.table_name, id: r.row_id })),
        unavailable,
      };
    });
}
