import "server-only";
import { sql } from "kysely";
import type { Db } from "@/db/connect";
import { checkMailFlow } from "./check-mail-flow";

export interface Health {
  status: "ok" | "degraded";
  database: { up: boolean; latencyMs: number | null; schemaVersion: string | null };
  /** The e-mail dispatcher, when the database answers: null when it cannot be read. */
  email?: {
    state: "flowing" | "stalled";
    lastHeartbeatAt: string | null;
    heartbeatAgeS: number | null;
    pending: number;
    oldestPendingAgeS: number | null;
    failed: number;
  } | null;
}

/** Asks the database a trivial question and reports the newest applied migration. */
export async function checkHealth(db: Db): Promise<Health> {
  const started = performance.now();
  try {
    await sql`select 1`.execute(db);
    const latencyMs = Math.round((performance.now() - started) * 10) / 10;
    const latest = await sql<{ name: string }>`select name from schema_migrations order by name desc limit 1`
      .execute(db)
      .then((r) => r.rows[0]?.name ?? null)
      .catch(() => null);
    const email = await checkMailFlow(db)
      .then((m) => ({
        state: m.state,
        lastHeartbeatAt: m.lastHeartbeatAt,
        heartbeatAgeS: m.heartbeatAgeS,
        pending: m.pending,
        oldestPendingAgeS: m.oldestPendingAgeS,
        failed: m.failed.length,
      }))
      .catch(() => null);
    // The HTTP status follows the database only: start scripts wait on it before the dispatcher runs.
    return { status: "ok", database: { up: true, latencyMs, schemaVersion: latest }, email };
  } catch {
    return { status: "degraded", database: { up: false, latencyMs: null, schemaVersion: null } };
  }
}
