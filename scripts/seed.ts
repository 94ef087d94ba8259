// Seeds the invented demo job. Safe to run again: existing demo rows are kept, not doubled.
import { createDb } from "@/db/connect";
import { seedDemo } from "@/scripts/seed/demo";
import { env } from "@/lib/env";

// As the owner role: the app's own role may not change the schema.
const db = createDb(env.MIGRATION_DATABASE_URL ?? env.DATABASE_URL, 1);
try {
  const summary = await seedDemo(db, { records: true });
  console.log(
    `demo job ready: ${summary.projects} projects, ${summary.users} people, ` +
      `${summary.pours} pours, ${summary.tendons} tendons`,
  );
} finally {
  await db.destroy();
}
