import { randomBytes } from "node:crypto";
import { Kysely, PostgresDialect, sql } from "kysely";
import pg from "pg";
import { createDb, type Db } from "@/db/connect";
import { migrateToLatest } from "@/db/migrate";
import { assertLocalDatabase } from "./local-database";

/**
 * Each integration test file gets a database of its own on the throwaway test server that
 * `npm test` starts, so tests never share state. A guard refuses anything but loopback.
 */

const adminUrl = process.env.TEST_DATABASE_ADMIN_URL;

function requireAdminUrl(): string {
  if (!adminUrl) {
    throw new Error(
      "TEST_DATABASE_ADMIN_URL is not set. Run the integration tests through `npm test`, which starts a throwaway PostgreSQL.",
    );
  }
  assertLocalDatabase(adminUrl, "TEST_DATABASE_ADMIN_URL");
  return adminUrl;
}

export interface TestDatabase {
  /** Connected as the owner role (the one migrations run as). */
  db: Db;
  url: string;
  /** The same database as the app's least-privileged role (tautline_app), as the app connects. */
  appUrl: string;
  name: string;
  drop: () => Promise<void>;
}

/** Creates an empty database; `migrate: true` also brings it to the latest schema. */
export async function createTestDatabase(options: { migrate?: boolean } = {}): Promise<TestDatabase> {
  const admin = requireAdminUrl();
  const name = `t_${randomBytes(6).toString("hex")}`;
  const adminDb = new Kysely<unknown>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: admin, max: 1 }) }),
  });
  await sql`create database ${sql.id(name)}`.execute(adminDb);
  await adminDb.destroy();

  const url = new URL(admin);
  url.pathname = `/${name}`;
  const db = createDb(url.toString(), 5);
  if (options.migrate) await migrateToLatest(db);

  const appUrl = new URL(url);
  appUrl.username = "tautline_app";
  appUrl.password = "tautline_app";
  return {
    db,
    url: url.toString(),
    appUrl: appUrl.toString(),
    name,
    drop: async () => {
      await db.destroy();
      const cleanup = new Kysely<unknown>({
        dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: admin, max: 1 }) }),
      });
      await sql`drop database if exists ${sql.id(name)} with (force)`.execute(cleanup);
      await cleanup.destroy();
    },
  };
}
