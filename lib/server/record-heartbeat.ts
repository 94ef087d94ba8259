import "server-only";
import { sql } from "kysely";
import type { Db } from "@/db/connect";

/** Stamps a worker's heartbeat: it finished a pass just now. */
export async function recordHeartbeat(db: Db, worker: string): Promise<void> {
  await db
    .insertInto("worker_heartbeats")
    .values({ worker, beat_at: sql<Date>`now()` })
    .onConflict((oc) => oc.column("worker").doUpdateSet({ beat_at: sql<Date>`now()` }))
    .execute();
}

/** Keeps the last error a worker saw, without moving its heartbeat. */
export async function recordWorkerError(db: Db, worker: string, error: string): Promise<void> {
  await db
    .updateTable("worker_heartbeats")
    .set({ last_error: error.slice(0, 500), last_error_at: sql<Date>`now()` })
    .where("worker", "=", worker)
    .execute();
}
