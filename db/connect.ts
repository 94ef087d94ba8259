import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database } from "./types";

// PostgreSQL returns BIGINT (count(*)) and NUMERIC as strings; Tautline's counts fit in a JS number.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10));
// DATE columns stay as ISO strings ("2026-12-01"): a calendar day, not an instant.
pg.types.setTypeParser(pg.types.builtins.DATE, (v) => v);

/** Opens a Kysely instance on a connection string. The app uses the one in `db/index.ts`. */
export function createDb(connectionString: string, max = 10): Kysely<Database> {
  return new Kysely<Database>({
    dialect: new PostgresDialect({
      pool: new pg.Pool({ connectionString, max, idleTimeoutMillis: 30_000 }),
    }),
  });
}

export type Db = Kysely<Database>;
