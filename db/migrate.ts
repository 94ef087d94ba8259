import { Migrator, type Kysely, type MigrationResultSet } from "kysely";
import { migrations } from "./migrations";

/** Runs every pending migration; throws with the failing migration's name when one fails. */
export async function migrateToLatest(db: Kysely<any>): Promise<MigrationResultSet> {
  const migrator = new Migrator({
    db,
    provider: { getMigrations: async () => migrations },
    migrationTableName: "schema_migrations",
    migrationLockTableName: "schema_migrations_lock",
  });
  const result = await migrator.migrateToLatest();
  if (result.error) {
    const failed = result.results?.find((r) => r.status === "Error")?.migrationName ?? "unknown";
    throw new Error(`Migration ${failed} failed: ${String(result.error)}`, { cause: result.error });
  }
  return result;
}
