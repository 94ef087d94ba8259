import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import type { SessionUser } from "@/lib/auth/session";
import { dayInZone, projectTimeZone } from "@/lib/format/dates";
import { orderPoursForCrew } from "@/lib/format/pour-order";
import type { AvailablePour } from "@/lib/schemas/sync";
import { recordingProjectIds } from "./require-recorder";

/**
 * The pours a crew member may take out on the tablet, in the crew's order (`orderPoursForCrew`):
 * today's on site first (each project's own time zone), then the coming ones, the past ones, the undated.
 */
export async function listFieldPours(
  db: Kysely<Database>,
  user: Pick<SessionUser, "memberships">,
  now: Date = new Date(),
): Promise<{ pours: AvailablePour[] }> {
  const projectIds = recordingProjectIds(user);
  if (!projectIds.length) return { pours: [] };
  const rows = await db
    .selectFrom("pours")
    .innerJoin("projects", "projects.id", "pours.project_id")
    .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
    .leftJoin("tendons", (j) =>
      j.onRef("tendons.pour_id", "=", "pours.id").onRef("tendons.project_id", "=", "pours.project_id"),
    )
    .select((eb) => [
      "pours.id",
      "pours.project_id",
      "projects.code",
      "projects.name as project_name",
      "projects.time_zone",
      "pours.name",
      "pours.level",
      "pours.planned_stressing_date",
      "pour_states.status",
      eb.fn.count<number>("tendons.id").as("tendon_count"),
    ])
    .where("pours.project_id", "in", projectIds)
    .groupBy(["pours.id", "projects.id", "pour_states.status"])
    .orderBy("projects.name")
    .orderBy("pours.name")
    .execute();
  const todayIn = new Map<string, string>();
  const today = (zone: string) => todayIn.get(zone) ?? todayIn.set(zone, dayInZone(now, zone)).get(zone)!;
  const ordered = orderPoursForCrew(
    rows.map((r) => ({ ...r, plannedStressingDate: r.planned_stressing_date })),
    (r) => today(projectTimeZone(r)),
  );
  return {
    pours: ordered.map((r) => ({
      id: r.id,
      projectId: r.project_id,
      projectCode: r.code,
      projectName: r.project_name,
      name: r.name,
      level: r.level,
      plannedStressingDate: r.planned_stressing_date,
      status: r.status,
      tendonCount: Number(r.tendon_count),
    })),
  };
}

/** The project a pour belongs to, for the access check; unknown pours answer 404. */
export async function projectOfPour(db: Kysely<Database>, pourId: string): Promise<string> {
  const row = await db.selectFrom("pours").select("project_id").where("id", "=", pourId).executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such pour among yours.");
  return row.project_id;
}
