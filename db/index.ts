import "server-only";
import { env } from "@/lib/env";
import { createDb, type Db } from "./connect";

// One instance per server process; kept on globalThis so dev-mode reloads do not open new pools.
const globalForDb = globalThis as unknown as { tautlineDb?: Db };

export const db: Db =
  globalForDb.tautlineDb ?? createDb(env.DATABASE_URL, env.DATABASE_POOL_MAX, { prepare: env.DATABASE_PREPARE });

if (env.NODE_ENV !== "production") globalForDb.tautlineDb = db;
