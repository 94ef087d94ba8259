import "server-only";
import { sql } from "kysely";
import type { Db } from "@/db/connect";

export interface Health {
  status: "ok" | "degraded";
  database: { up: boolean; latencyMs: number | null; schemaVersion: string | null };
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
    return { status: "ok", database: { up: true, latencyMs, schemaVersion: latest } };
  } catch {
    return { status: "degraded", database: { up: false, latencyMs: null, schemaVersion: null } };
  }
}
