import "server-only";
import { sql, type Kysely } from "kysely";
import type { Database } from "@/db/types";
import { clockSkew, FUTURE_GRACE_MS, type ClockSkew } from "@/lib/stressing/clock-skew";

/**
 * The rule of lib/stressing/clock-skew.ts in SQL, for a `records` row beside its `projects` row:
 * the device time is off the receipt by more than the project's threshold either way, or after it
 * by more than the grace.
 */
export const recordIsSkewed = sql<boolean>`(abs(extract(epoch from records.device_time - records.received_at)) > projects.clock_skew_minutes * 60
  or records.device_time > records.received_at + make_interval(secs => ${FUTURE_GRACE_MS / 1000}))`;

export interface SkewedRecord {
  recordId: string;
  projectId: string;
  projectName: string;
  /** The project's zone, in which both times are shown. */
  timeZone: string;
  pourId: string;
  pourName: string;
  tendonId: string;
  tag: string;
  end: string;
  deviceTime: Date;
  receivedAt: Date;
  skew: ClockSkew;
}

/**
 * Every record the tablet sent whose clock the inspector should check, on the given projects'
 * pours not yet released (a release closes the pour's review), flagged tendon or not, oldest
 * receipt first. Only the tablet's own records count: a paperwork correction keeps the original's
 * device time and is received when the office writes it, so its two times say nothing of a clock.
 * One statement, whatever the number of tendons.
 */
export async function findClockSkews(
  db: Kysely<Database>,
  input: { projectIds: string[]; pourId?: string },
): Promise<SkewedRecord[]> {
  if (!input.projectIds.length) return [];
  let query = db
    .selectFrom("records")
    .innerJoin("projects", "projects.id", "records.project_id")
    .innerJoin("pours", (join) =>
      join.onRef("pours.id", "=", "records.pour_id").onRef("pours.project_id", "=", "records.project_id"),
    )
    .innerJoin("tendons", (join) =>
      join.onRef("tendons.id", "=", "records.tendon_id").onRef("tendons.project_id", "=", "records.project_id"),
    )
    .innerJoin("pour_states", "pour_states.pour_id", "records.pour_id")
    .select([
      "records.id",
      "records.project_id",
      "projects.name as projectName",
      "projects.time_zone",
      "projects.clock_skew_minutes",
      "records.pour_id",
      "pours.name as pourName",
      "records.tendon_id",
      "tendons.tag",
      "records.tendon_end",
      "records.device_time",
      "records.received_at",
    ])
    .where("records.project_id", "in", input.projectIds)
    .where("records.revision", "=", 1)
    .where("pour_states.status", "!=", "released")
    .where(recordIsSkewed)
    .orderBy("records.received_at")
    .orderBy("records.id");
  if (input.pourId) query = query.where("records.pour_id", "=", input.pourId);
  const rows = await query.execute();
  return rows.flatMap((r) => {
    const skew = clockSkew(r.device_time, r.received_at, r.clock_skew_minutes);
    if (!skew) return [];
    return [
      {
        recordId: r.id,
        projectId: r.project_id,
        projectName: r.projectName,
        timeZone: r.time_zone,
        pourId: r.pour_id,
        pourName: r.pourName,
        tendonId: r.tendon_id,
        tag: r.tag,
        end: r.tendon_end,
        deviceTime: new Date(r.device_time),
        receivedAt: new Date(r.received_at),
        skew,
      },
    ];
  });
}
