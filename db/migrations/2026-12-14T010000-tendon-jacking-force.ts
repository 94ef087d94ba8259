import { sql, type Kysely } from "kysely";

// The schedule may give a tendon's own specified jacking force (newtons, as every stored force);
// null: the project's factor of fpu·A is used. A force is positive; the 0.80·fpu·A ceiling is
// checked by the tendon schema, which knows the strand.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("tendons")
    .addColumn("jacking_force_n", "double precision", (c) => c.check(sql`jacking_force_n > 0`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("tendons").dropColumn("jacking_force_n").execute();
}
