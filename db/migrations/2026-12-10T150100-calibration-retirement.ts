import { sql, type Kysely } from "kysely";

// Frozen. A calibration can be retired (never picked again) or corrected (retired and replaced by
// a new calibration row that names it), always with a reason and by whom. The old row's figures
// are never changed, so stored evaluations keep the calibration they used.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("calibrations")
    .addColumn("retired_at", "timestamptz")
    .addColumn("retired_reason", "text")
    .addColumn("retired_by", "uuid", (c) => c.references("users.id"))
    .addColumn("replaced_by", "uuid", (c) => c.references("calibrations.id"))
    .execute();
  await sql`
    alter table calibrations add constraint calibrations_retirement_complete check (
      (retired_at is null and retired_reason is null and retired_by is null and replaced_by is null)
      or (retired_at is not null and length(trim(retired_reason)) >= 10 and retired_by is not null)
    )
  `.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table calibrations drop constraint if exists calibrations_retirement_complete`.execute(db);
  await db.schema
    .alterTable("calibrations")
    .dropColumn("replaced_by")
    .dropColumn("retired_by")
    .dropColumn("retired_reason")
    .dropColumn("retired_at")
    .execute();
}
