import "server-only";
import { sql } from "kysely";
import type { Db } from "@/db/connect";

/** A dispatcher silent for longer than this has stopped (it beats every few seconds). */
export const HEARTBEAT_STALE_S = 120;
/** An e-mail waiting longer than this means e-mail is not flowing, whatever the heartbeat says. */
export const OLDEST_PENDING_STALE_S = 15 * 60;

export interface FailedMail {
  notificationId: string;
  subject: string;
  lastError: string | null;
  projectId: string;
  tendonId: string | null;
  tendonTag: string | null;
  flagId: string | null;
}

export interface MailFlow {
  /** "flowing": the dispatcher beat lately and nothing waits too long. */
  state: "flowing" | "stalled";
  lastHeartbeatAt: string | null;
  heartbeatAgeS: number | null;
  lastError: string | null;
  pending: number;
  oldestPendingAgeS: number | null;
  oldestPendingAt: string | null;
  failed: FailedMail[];
}

/**
 * Whether the engineer's e-mail is going out: the dispatcher's last heartbeat, the age of the
 * oldest unsent e-mail and the e-mails given up on after every retry. `projectIds` scopes the
 * counts and the failed list to the projects a person may see; without it, all projects (health).
 */
export async function checkMailFlow(db: Db, projectIds?: string[]): Promise<MailFlow> {
  const beat = await db
    .selectFrom("worker_heartbeats")
    .select([
      sql<string>`to_char(beat_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"')`.as("at"),
      sql<number>`extract(epoch from now() - beat_at)::float8`.as("age"),
      "last_error",
    ])
    .where("worker", "=", "dispatcher")
    .executeTakeFirst();
  if (projectIds && projectIds.length === 0) projectIds = ["00000000-0000-0000-0000-000000000000"];
  let pendingQuery = db
    .selectFrom("notifications")
    .select([
      sql<number>`count(*)::int`.as("n"),
      sql<number | null>`extract(epoch from now() - min(created_at))::float8`.as("age"),
      sql<string | null>`to_char(min(created_at) at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"')`.as("at"),
    ])
    .where("status", "=", "pending");
  if (projectIds) pendingQuery = pendingQuery.where("project_id", "in", projectIds);
  const pending = await pendingQuery.executeTakeFirstOrThrow();
  let failedQuery = db
    .selectFrom("notifications")
    .leftJoin("flags", "flags.id", "notifications.flag_id")
    .leftJoin("tendons", "tendons.id", "flags.tendon_id")
    .select([
      "notifications.id as notificationId",
      "notifications.subject",
      "notifications.last_error as lastError",
      "notifications.project_id as projectId",
      "flags.tendon_id as tendonId",
      "tendons.tag as tendonTag",
      "notifications.flag_id as flagId",
    ])
    .where("notifications.status", "=", "failed")
    .orderBy("notifications.created_at", "desc")
    .limit(20);
  if (projectIds) failedQuery = failedQuery.where("notifications.project_id", "in", projectIds);
  const failed = await failedQuery.execute();

  const heartbeatAgeS = beat ? Math.max(0, Math.round(beat.age)) : null;
  const oldestPendingAgeS = pending.age === null ? null : Math.max(0, Math.round(pending.age));
  const beating = heartbeatAgeS !== null && heartbeatAgeS <= HEARTBEAT_STALE_S;
  const stuck = oldestPendingAgeS !== null && oldestPendingAgeS > OLDEST_PENDING_STALE_S;
  // No heartbeat yet and nothing waiting: a fresh install, nothing to warn about.
  const idleFresh = heartbeatAgeS === null && pending.n === 0;
  return {
    state: (beating || idleFresh) && !stuck ? "flowing" : "stalled",
    lastHeartbeatAt: beat?.at ?? null,
    heartbeatAgeS,
    lastError: beat?.last_error ?? null,
    pending: pending.n,
    oldestPendingAgeS,
    oldestPendingAt: pending.at,
    failed,
  };
}
