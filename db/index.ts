import "server-only";
import { env } from "@/lib/env";
import { createDb, type Db } from "./connect";
import { MomentOld } from "./moment-old";

// One instance per server process; kept on globalThis so dev-mode reloads do not open new pools.
const globalForDb = globalThis as unknown as { tautlineDb?: Db; tautlineMomentOld?: MomentOld };

export const db: Db =
  globalForDb.tautlineDb ?? createDb(env.DATABASE_URL, env.DATABASE_POOL_MAX, { prepare: env.DATABASE_PREPARE });

/**
 * The reads that may be a moment old (the pour insight page, the read-only status board): on the
 * replica of DATABASE_REPLICA_URL when set, else on the primary; see db/moment-old.ts. A replica
 * that does not answer a connection within 2 s is counted out of reach and the read goes to the primary.
 */
export const momentOld: MomentOld =
  globalForDb.tautlineMomentOld ??
  new MomentOld(
    db,
    env.DATABASE_REPLICA_URL
      ? createDb(env.DATABASE_REPLICA_URL, env.DATABASE_POOL_MAX, {
          prepare: env.DATABASE_PREPARE,
          connectTimeoutMs: 2_000,
        })
      : null,
  );

if (env.NODE_ENV !== "production") {
  globalForDb.tautlineDb = db;
  globalForDb.tautlineMomentOld = momentOld;
}
