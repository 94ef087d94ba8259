// Brings the database of DATABASE_URL up to the latest migration.
import { createDb } from "@/db/connect";
import { migrateToLatest } from "@/db/migrate";
import { env } from "@/lib/env";

// As the owner role: the app's own role may not change the schema.
const db = createDb(env.MIGRATION_DATABASE_URL ?? env.DATABASE_URL, 1);
try {
  const { results = [] } = await migrateToLatest(db);
  const applied = results.filter((r) => r.status === "Success").map((r) => r.migrationName);
  console.log(applied.length ? `migrated: ${applied.join(", ")}` : "database schema is up to date");
} finally {
  await db.destroy();
}
